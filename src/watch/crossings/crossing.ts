import type { RuleId, RuleSeverity } from '../rules/rule.ts';

/**
 * 'onset': the rule turns on between consecutive forecast hours (or is already on at the first).
 * 'end': it turns off. 'worsened': a newer model run has it on for a valid hour where the previous
 * run had it off.
 */
export type CrossingDirection = 'onset' | 'end' | 'worsened';

export interface Crossing {
  /** Stable: location key, rule id, valid local day, direction. The same event gets the same key in every run. */
  key: string;
  locationKey: string;
  direction: CrossingDirection;
  ruleId: RuleId;
  ruleName: string;
  severity: RuleSeverity;
  unit: string;
  /** The forecast hour the state changes at, ISO 8601 UTC. */
  validTime: string;
  /** The same hour on the location's wall clock, ISO 8601 with offset. */
  localTime: string;
  /** Local date, YYYY-MM-DD, part of the key. */
  localDate: string;
  /** The rule's value at that hour in `unit`; null when it could not be had (e.g. the dry layer is gone). */
  value: number | null;
  /** The threshold used (after channel overrides), in `unit`. */
  threshold: number;
  hysteresis: number;
  comparison: 'at-or-above' | 'at-or-below';
  /** Effective mixing height at that hour, m AGL. */
  effectiveMixingHeightAglM: number;
  /** Highest effective mixing height while the rule stays on from this hour (onset, worsened) or before it (end), m AGL. */
  episodePeakEffectiveMixingHeightAglM: number;
  /** Model run (initialisation time) the crossing comes from. */
  modelRun: string;
  /** For 'worsened': the run it is compared with; otherwise null. */
  previousModelRun: string | null;
  /** True for an onset at the first forecast hour: the rule is already on when the forecast begins. */
  atSeriesStart: boolean;
  /** Forecast hours missing (failed quality control or not supplied) just before this one. */
  hoursMissingBefore: number;
  /** Further crossings with the same key in this series (the rule flipped again the same local day). */
  repeatsSameDay: number;
  /** Plain words for the channel; says the threshold used. */
  message: string;
}
