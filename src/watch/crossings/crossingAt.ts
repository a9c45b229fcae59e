import { RULE_MEASURES } from '../rules/ruleCatalogue.ts';
import type { Rule } from '../rules/rule.ts';
import type { SeriesAssessment } from '../seriesAssessment.ts';
import type { Crossing } from './crossing.ts';
import { crossingMessage } from './crossingMessage.ts';
import type { RuleHourState } from './ruleState.ts';

/** Highest effective mixing height over hours [from, to). */
export function peakEffectiveAglM(series: SeriesAssessment, from: number, to: number): number {
  let peak = -Infinity;
  for (let i = from; i < to; i++) peak = Math.max(peak, series.hours[i].effectiveMixingHeightAglM);
  return peak;
}

/** End (exclusive) of the run of "on" hours that starts at `index`. */
export function episodeEnd(states: readonly RuleHourState[], index: number): number {
  let end = index;
  while (end < states.length && states[end].on) end++;
  return end;
}

/** What differs between kinds of crossing; the rest comes from the rule, the hour and the series. */
export type CrossingSpecifics = Pick<
  Crossing,
  'key' | 'locationKey' | 'direction' | 'localDate' | 'episodePeakEffectiveMixingHeightAglM' | 'previousModelRun' | 'atSeriesStart' | 'hoursMissingBefore'
>;

/** The crossing of `rule` at hour `index` of `series`, with its value there and its message. */
export function crossingAt(series: SeriesAssessment, rule: Rule, index: number, value: number | null, specifics: CrossingSpecifics): Crossing {
  const hour = series.hours[index];
  const base: Omit<Crossing, 'message'> = {
    ...specifics,
    ruleId: rule.id,
    ruleName: rule.name,
    severity: rule.severity,
    unit: rule.unit,
    validTime: hour.validTime,
    localTime: hour.localTime,
    value,
    threshold: rule.threshold,
    hysteresis: rule.hysteresis,
    comparison: RULE_MEASURES[rule.id].comparison,
    effectiveMixingHeightAglM: hour.effectiveMixingHeightAglM,
    modelRun: series.runTime,
    repeatsSameDay: 0,
  };
  return { ...base, message: crossingMessage(base, series.timeZone) };
}
