import type { Rule } from '../rules/rule.ts';
import type { SeriesAssessment } from '../seriesAssessment.ts';
import { localDateOf } from '../time/localClock.ts';
import type { Crossing } from './crossing.ts';
import { crossingAt, episodeEnd, peakEffectiveAglM } from './crossingAt.ts';
import { crossingKey, locationKey } from './locationKey.ts';
import { ruleStatesOverHours } from './ruleState.ts';

/**
 * The forecast got worse: for each rule and local day, the first valid hour that the newer run has
 * on and the previous run had off (each run read with its own hysteresis). Hours only one run
 * covers are not compared. One crossing per rule and day, so its key is as stable as an onset's.
 */
export function runToRunWorsenings(previous: SeriesAssessment, current: SeriesAssessment, rules: readonly Rule[]): Crossing[] {
  const place = locationKey(current.location.latitude, current.location.longitude);
  const crossings: Crossing[] = [];
  for (const rule of rules) {
    if (!rule.enabled) continue;
    const previousStates = ruleStatesOverHours(previous.hours, rule);
    const previousOnByTime = new Map<string, boolean>();
    previous.hours.forEach((hour, index) => previousOnByTime.set(String(Date.parse(hour.validTime)), previousStates[index].on));
    const currentStates = ruleStatesOverHours(current.hours, rule);
    const seenDays = new Set<string>();
    for (let i = 0; i < current.hours.length; i++) {
      if (!currentStates[i].on) continue;
      const hour = current.hours[i];
      if (previousOnByTime.get(String(Date.parse(hour.validTime))) !== false) continue;
      const localDate = localDateOf(hour.localTime);
      if (seenDays.has(localDate)) continue;
      seenDays.add(localDate);
      crossings.push(
        crossingAt(current, rule, i, currentStates[i].value, {
          key: crossingKey({ locationKey: place, ruleId: rule.id, localDate, direction: 'worsened' }),
          locationKey: place,
          direction: 'worsened',
          localDate,
          episodePeakEffectiveMixingHeightAglM: peakEffectiveAglM(current, i, episodeEnd(currentStates, i)),
          previousModelRun: previous.runTime,
          atSeriesStart: false,
          hoursMissingBefore: 0,
        }),
      );
    }
  }
  return crossings;
}
