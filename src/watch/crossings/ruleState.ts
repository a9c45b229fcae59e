import { RULE_MEASURES } from '../rules/ruleCatalogue.ts';
import type { Rule } from '../rules/rule.ts';
import type { HourAssessment } from '../seriesAssessment.ts';

/**
 * One step of a rule with hysteresis. Off → on when the value reaches the threshold (inclusive);
 * on → off only when the value goes beyond threshold ∓ hysteresis, so a value wobbling at the
 * threshold keeps its state. A value that cannot be had (null: no dry layer, no pyroCb possible)
 * turns the rule off.
 */
export function nextRuleState(wasOn: boolean, value: number | null, rule: Pick<Rule, 'threshold' | 'hysteresis'>, comparison: 'at-or-above' | 'at-or-below'): boolean {
  if (value === null || !Number.isFinite(value)) return false;
  if (comparison === 'at-or-above') return wasOn ? value >= rule.threshold - rule.hysteresis : value >= rule.threshold;
  return wasOn ? value <= rule.threshold + rule.hysteresis : value <= rule.threshold;
}

export interface RuleHourState {
  on: boolean;
  value: number | null;
}

/** The rule's state at each hour, in order, starting from off before the first hour. */
export function ruleStatesOverHours(hours: readonly HourAssessment[], rule: Rule): RuleHourState[] {
  const measure = RULE_MEASURES[rule.id];
  const states: RuleHourState[] = new Array(hours.length);
  let on = false;
  for (let i = 0; i < hours.length; i++) {
    const value = measure.valueOf(hours[i]);
    on = nextRuleState(on, value, rule, measure.comparison);
    states[i] = { on, value };
  }
  return states;
}
