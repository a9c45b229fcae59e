import type { Rule } from '../rules/rule.ts';
import type { SeriesAssessment } from '../seriesAssessment.ts';
import type { Crossing } from './crossing.ts';
import { hourToHourCrossings } from './hourToHourCrossings.ts';
import { runToRunWorsenings } from './runToRunWorsenings.ts';
import { SEVERITY_RANK } from '../rules/severityRank.ts';

/**
 * All crossings of a series, in time order (the more severe first within an hour): rules changing
 * state hour to hour, and, given the previous run, hours that got worse. A worsening that starts at
 * the same hour as the new run's own onset for that rule and day is the same news and is left out;
 * the onset (new, or an update of an announced one) carries it.
 */
export function findCrossings(current: SeriesAssessment, rules: readonly Rule[], previous?: SeriesAssessment): Crossing[] {
  const crossings = hourToHourCrossings(current, rules);
  if (previous) {
    const onsetAt = new Set(crossings.filter((c) => c.direction === 'onset').map((c) => `${c.ruleId}|${c.localDate}|${Date.parse(c.validTime)}`));
    for (const worsening of runToRunWorsenings(previous, current, rules)) {
      if (!onsetAt.has(`${worsening.ruleId}|${worsening.localDate}|${Date.parse(worsening.validTime)}`)) crossings.push(worsening);
    }
  }
  return crossings.sort(
    (a, b) => Date.parse(a.validTime) - Date.parse(b.validTime) || SEVERITY_RANK[a.severity] - SEVERITY_RANK[b.severity] || a.key.localeCompare(b.key),
  );
}
