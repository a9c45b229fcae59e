import { formatLocalDate } from '../../render/localTime.ts';
import type { DaySummary } from '../seriesAssessment.ts';

const whole = new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 });

function metres(heightM: number): string {
  return `${whole.format(Math.round(heightM / 10) * 10)} m`;
}

/** Local ISO "2026-08-14T15:00:00-06:00" to its wall clock "15:00" (the zone is the series'). */
function clock(localIso: string): string {
  return localIso.slice(11, 16);
}

/** One day in plain words, local times. */
export function daySummaryLines(day: DaySummary): string[] {
  const lines = [
    `${formatLocalDate(day.localDate)}:`,
    `  peak mixing height ${metres(day.peakMixingHeightAglM)} AGL at ${clock(day.peakMixingHour)}` +
      (day.peakEffectiveMixingHeightAglM !== undefined && day.peakEffectiveMixingHour !== undefined && day.peakEffectiveMixingHeightAglM > day.peakMixingHeightAglM
        ? `; effective ${metres(day.peakEffectiveMixingHeightAglM)} at ${clock(day.peakEffectiveMixingHour)}`
        : ''),
    day.couplingHour
      ? `  mixed layer reaches a dry near-dry-adiabatic layer at ${clock(day.couplingHour)}`
      : '  mixed layer does not reach a dry near-dry-adiabatic layer in the hours assessed',
    `  driest ${clock(day.driestHour)} (mixed-layer minimum RH ${Math.round(day.minMixedLayerRelativeHumidityPct)}%); windiest ${clock(day.windiestHour)} (transport wind ${day.maxTransportWindMs.toFixed(1)} m/s)`,
    `  highest HDW ${whole.format(Math.round(day.maxHdw))} at ${clock(day.maxHdwHour)}; ` +
      (day.minPftGw !== null && day.minPftHour !== null
        ? `lowest PFT ${day.minPftGw.toFixed(1)} GW at ${clock(day.minPftHour)}`
        : 'no pyroCb possible in any hour (no PFT)'),
  ];
  const gaps = day.gapHours ?? [];
  if (gaps.length > 0) lines.push(`  ${gaps.length} hour${gaps.length === 1 ? '' : 's'} not assessed (${gaps.map(clock).join(', ')}): this day's figures leave them out`);
  return lines;
}

