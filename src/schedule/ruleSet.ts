/**
 * A channel's effective rules: the configured defaults with its overrides applied, and a
 * signature so channels with the same rules share one crossing computation per place.
 *
 * A crossing's stable key names its rule. Two channels with different thresholds for the same
 * rule see different events, so an overridden rule is recorded under `<ruleId>@<threshold>/<hysteresis>`;
 * channels on the defaults share the plain `<ruleId>` and one announcement record.
 */
import type { RuleOverride } from '../store/storeTypes.ts';
import { applyChannelOverrides, type ChannelOverrides } from '../watch/rules/channelOverrides.ts';
import type { Rule } from '../watch/rules/rule.ts';

export interface ChannelRuleSet {
  rules: Rule[];
  signature: string;
  /** The rule key a crossing of each rule is recorded under, by rule id. */
  crossingRuleKey: ReadonlyMap<string, string>;
  /** Overrides the rules refused (out of range since they were saved); the defaults apply instead. */
  problems: string[];
}

export function channelRuleSet(defaults: readonly Rule[], overrides: readonly RuleOverride[]): ChannelRuleSet {
  const asRecord: Record<string, { threshold: number; hysteresis?: number }> = {};
  for (const o of overrides) asRecord[o.ruleId] = { threshold: o.thresholdValue, ...(o.hysteresisValue !== null ? { hysteresis: o.hysteresisValue } : {}) };
  const merged = applyChannelOverrides(defaults, asRecord as ChannelOverrides);
  const rules = merged.ok ? merged.rules : defaults.map((r) => ({ ...r }));
  const keys = new Map<string, string>();
  const parts: string[] = [];
  for (const rule of rules) {
    const base = defaults.find((d) => d.id === rule.id)!;
    const changed = rule.threshold !== base.threshold || rule.hysteresis !== base.hysteresis;
    const key = changed ? `${rule.id}@${rule.threshold}/${rule.hysteresis}` : rule.id;
    keys.set(rule.id, key);
    if (changed) parts.push(key);
  }
  return { rules, signature: parts.sort().join(';'), crossingRuleKey: keys, problems: merged.ok ? [] : merged.errors };
}
