import { RULE_MEASURES } from './ruleCatalogue.ts';
import type { RuleId } from './rule.ts';

/**
 * Range checks for a rule's threshold and hysteresis, shared by the config loader and channel
 * overrides. Returns the reasons, keyed by field, empty when both are fine.
 */
export function ruleValueProblems(id: RuleId, values: { threshold?: number; hysteresis?: number }): Array<{ field: 'threshold' | 'hysteresis'; reason: string }> {
  const measure = RULE_MEASURES[id];
  const problems: Array<{ field: 'threshold' | 'hysteresis'; reason: string }> = [];
  const check = (field: 'threshold' | 'hysteresis', value: number | undefined, [low, high]: readonly [number, number]): void => {
    if (value === undefined) return;
    if (typeof value !== 'number' || !Number.isFinite(value) || value < low || value > high) {
      problems.push({ field, reason: `must be a number from ${low} to ${high} ${measure.unit}, got ${String(value)}` });
    }
  };
  check('threshold', values.threshold, measure.thresholdRange);
  check('hysteresis', values.hysteresis, measure.hysteresisRange);
  return problems;
}
