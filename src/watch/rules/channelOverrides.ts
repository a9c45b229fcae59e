import { z } from 'zod';
import { ruleValueProblems } from './checkRuleValues.ts';
import { RULE_IDS, isRuleId, type Rule } from './rule.ts';

/** What a channel may change about a rule. */
export interface RuleOverride {
  threshold?: number;
  hysteresis?: number;
  enabled?: boolean;
}

/** A channel's overrides, keyed by rule id. */
export type ChannelOverrides = Readonly<Record<string, RuleOverride>>;

/** For callers reading overrides from outside (the store, a chat command): the shape, before the rule checks below. */
export const channelOverridesSchema = z.record(
  z.string(),
  z.strictObject({ threshold: z.number().finite().optional(), hysteresis: z.number().finite().optional(), enabled: z.boolean().optional() }),
);

export type MergedRulesResult = { ok: true; rules: Rule[] } | { ok: false; errors: string[] };

/**
 * Merges a channel's overrides over the defaults. Pure: the defaults are not changed. An override
 * for an unknown rule id or a value out of the rule's range is an error naming the rule, the key and
 * the allowed range; with any error nothing is merged.
 */
export function applyChannelOverrides(defaults: readonly Rule[], overrides: ChannelOverrides): MergedRulesResult {
  const errors: string[] = [];
  for (const [id, override] of Object.entries(overrides)) {
    if (!isRuleId(id) || !defaults.some((rule) => rule.id === id)) {
      errors.push(`override for rule "${id}": no such rule; known rules are ${RULE_IDS.join(', ')}`);
      continue;
    }
    for (const problem of ruleValueProblems(id, override)) {
      errors.push(`override for rule "${id}", ${problem.field}: ${problem.reason}`);
    }
    if (override.enabled !== undefined && typeof override.enabled !== 'boolean') {
      errors.push(`override for rule "${id}", enabled: must be true or false, got ${String(override.enabled)}`);
    }
  }
  if (errors.length > 0) return { ok: false, errors };
  const rules = defaults.map((rule) => {
    const override = overrides[rule.id];
    if (!override) return { ...rule };
    return {
      ...rule,
      threshold: override.threshold ?? rule.threshold,
      hysteresis: override.hysteresis ?? rule.hysteresis,
      enabled: override.enabled ?? rule.enabled,
    };
  });
  return { ok: true, rules };
}
