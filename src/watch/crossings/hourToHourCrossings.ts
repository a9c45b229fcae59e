import type { Rule } from '../rules/rule.ts';
import type { SeriesAssessment } from '../seriesAssessment.ts';
import { localDateOf } from '../time/localClock.ts';
import type { Crossing } from './crossing.ts';
import { crossingAt, episodeEnd, peakEffectiveAglM } from './crossingAt.ts';
import { crossingKey, locationKey } from './locationKey.ts';
import { ruleStatesOverHours } from './ruleState.ts';

const HOUR_MS = 3_600_000;

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
      byKey.set(
        key,
        crossingAt(series, rule, i, states[i].value, {
          key,
          locationKey: place,
          direction,
          localDate,
          episodePeakEffectiveMixingHeightAglM:
            direction === 'onset' ? peakEffectiveAglM(series, i, episodeEnd(states, i)) : peakEffectiveAglM(series, episodeStart, i),
          previousModelRun: null,
          atSeriesStart: direction === 'onset' && i === 0,
          hoursMissingBefore,
        }),
      );
    }
  }
  return [...byKey.values()];
}
