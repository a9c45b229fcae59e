import { RULE_MEASURES } from '../rules/ruleCatalogue.ts';
import type { Rule } from '../rules/rule.ts';
import type { SeriesAssessment } from '../seriesAssessment.ts';
import { localDateOf } from '../time/localClock.ts';
import type { Crossing } from './crossing.ts';
import { crossingMessage } from './crossingMessage.ts';
import { crossingKey, locationKey } from './locationKey.ts';
import { ruleStatesOverHours, type RuleHourState } from './ruleState.ts';

const HOUR_MS = 3_600_000;

/** Highest effective mixing height over hours [from, to). */
function peakEffectiveAglM(series: SeriesAssessment, from: number, to: number): number {
  let peak = -Infinity;
  for (let i = from; i < to; i++) peak = Math.max(peak, series.hours[i].effectiveMixingHeightAglM);
  return peak;
}

/** End (exclusive) of the run of "on" hours that starts at `index`. */
function episodeEnd(states: readonly RuleHourState[], index: number): number {
  let end = index;
  while (end < states.length && states[end].on) end++;
  return end;
}

/**
 * Rules changing state between consecutive assessed hours, each rule with its hysteresis. A rule
 * already on at the first hour is an onset there (flagged), so nothing already under way goes
 * unsaid. Gaps do not reset a rule: the state carries across, and the crossing after a gap says how
 * many hours were missing. Crossings that share a key (the rule flipped again the same local day)
 * are kept once, the first, with a count of the repeats. Disabled rules are skipped.
 */
export function hourToHourCrossings(series: SeriesAssessment, rules: readonly Rule[]): Crossing[] {
  const place = locationKey(series.location.latitude, series.location.longitude);
  const byKey = new Map<string, Crossing>();
  for (const rule of rules) {
    if (!rule.enabled) continue;
    const measure = RULE_MEASURES[rule.id];
    const states = ruleStatesOverHours(series.hours, rule);
    let episodeStart = 0;
    for (let i = 0; i < states.length; i++) {
      const wasOn = i > 0 ? states[i - 1].on : false;
      if (states[i].on === wasOn) continue;
      const hour = series.hours[i];
      const direction = states[i].on ? 'onset' : 'end';
      if (direction === 'onset') episodeStart = i;
      const localDate = localDateOf(hour.localTime);
      const key = crossingKey({ locationKey: place, ruleId: rule.id, localDate, direction });
      const existing = byKey.get(key);
      if (existing) {
        existing.repeatsSameDay += 1;
        continue;
      }
      const previousMs = i > 0 ? Date.parse(series.hours[i - 1].validTime) : Number.NaN;
      const hoursMissingBefore = i > 0 ? Math.max(0, Math.round((Date.parse(hour.validTime) - previousMs) / HOUR_MS) - 1) : 0;
      const base: Omit<Crossing, 'message'> = {
        key,
        locationKey: place,
        direction,
        ruleId: rule.id,
        ruleName: rule.name,
        severity: rule.severity,
        unit: rule.unit,
        validTime: hour.validTime,
        localTime: hour.localTime,
        localDate,
        value: states[i].value,
        threshold: rule.threshold,
        hysteresis: rule.hysteresis,
        comparison: measure.comparison,
        effectiveMixingHeightAglM: hour.effectiveMixingHeightAglM,
        episodePeakEffectiveMixingHeightAglM:
          direction === 'onset' ? peakEffectiveAglM(series, i, episodeEnd(states, i)) : peakEffectiveAglM(series, episodeStart, i),
        modelRun: series.runTime,
        previousModelRun: null,
        atSeriesStart: direction === 'onset' && i === 0,
        hoursMissingBefore,
        repeatsSameDay: 0,
      };
      byKey.set(key, { ...base, message: crossingMessage(base, series.timeZone) });
    }
  }
  return [...byKey.values()];
}
