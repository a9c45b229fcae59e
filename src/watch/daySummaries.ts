import type { DaySummary, HourAssessment, HourGap } from './seriesAssessment.ts';
import { localDateOf } from './time/localClock.ts';

/** The hour with the largest score; the earliest wins a tie, so a summary names when it starts. */
function hourWithMax(hours: readonly HourAssessment[], score: (hour: HourAssessment) => number): HourAssessment {
  let best = hours[0];
  for (let i = 1; i < hours.length; i++) if (score(hours[i]) > score(best)) best = hours[i];
  return best;
}

function summarizeDay(localDate: string, hours: readonly HourAssessment[], gaps: readonly HourGap[]): DaySummary | null {
  const gapHours = gaps.map((gap) => gap.localTime);
  if (hours.length === 0) {
    return null;
  }
  const peak = hourWithMax(hours, (hour) => hour.mixingHeightAglM);
  const peakEffective = hourWithMax(hours, (hour) => hour.effectiveMixingHeightAglM);
  const driest = hourWithMax(hours, (hour) => -hour.mixedLayerMinRelativeHumidityPct);
  const windiest = hourWithMax(hours, (hour) => hour.transportWind.speedMs);
  const hottestDriestWindiest = hourWithMax(hours, (hour) => hour.hdw);
  const withPft = hours.filter((hour) => hour.pftGw !== null);
  // A PFT of null means no pyroCb is possible in the profile: it never counts as the lowest.
  const lowestPft = withPft.length > 0 ? hourWithMax(withPft, (hour) => -(hour.pftGw as number)) : null;
  const firstCoupled = hours.find((hour) => hour.coupled) ?? null;
  return {
    localDate,
    peakMixingHeightAglM: peak.mixingHeightAglM,
    peakMixingHour: peak.localTime,
    peakEffectiveMixingHeightAglM: peakEffective.effectiveMixingHeightAglM,
    peakEffectiveMixingHour: peakEffective.localTime,
    couplingHour: firstCoupled ? firstCoupled.localTime : null,
    driestHour: driest.localTime,
    minMixedLayerRelativeHumidityPct: driest.mixedLayerMinRelativeHumidityPct,
    windiestHour: windiest.localTime,
    maxTransportWindMs: windiest.transportWind.speedMs,
    maxHdw: hottestDriestWindiest.hdw,
    maxHdwHour: hottestDriestWindiest.localTime,
    minPftGw: lowestPft ? lowestPft.pftGw : null,
    minPftHour: lowestPft ? lowestPft.localTime : null,
    assessedHourCount: hours.length,
    gapHours,
  };
}

/**
 * One summary per local day (the location's own time zone, read from each hour's local time), in
 * date order. A day with no assessed hour at all has no summary; its gaps stay in the series' gap list.
 */
export function summarizeDays(hours: readonly HourAssessment[], gaps: readonly HourGap[] = []): DaySummary[] {
  const hoursByDate = new Map<string, HourAssessment[]>();
  const gapsByDate = new Map<string, HourGap[]>();
  for (const hour of hours) {
    const date = localDateOf(hour.localTime);
    const list = hoursByDate.get(date);
    if (list) list.push(hour);
    else hoursByDate.set(date, [hour]);
  }
  for (const gap of gaps) {
    const date = localDateOf(gap.localTime);
    const list = gapsByDate.get(date);
    if (list) list.push(gap);
    else gapsByDate.set(date, [gap]);
  }
  const dates = [...new Set([...hoursByDate.keys(), ...gapsByDate.keys()])].sort();
  const summaries: DaySummary[] = [];
  for (const date of dates) {
    const summary = summarizeDay(date, hoursByDate.get(date) ?? [], gapsByDate.get(date) ?? []);
    if (summary) summaries.push(summary);
  }
  return summaries;
}
