import { formatLocalHour } from '../../render/localTime.ts';
import type { MessageTable } from '../../render/message.ts';
import { compassPoint } from '../../render/units.ts';
import { lowestDryLayerAloft } from '../dryLayerAloft.ts';
import type { HourAssessment, HourGap, SeriesAssessment } from '../seriesAssessment.ts';

const whole = new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 });

/** Heights to 10 m, grouped: "2,040". */
function metres(heightM: number): string {
  return Number.isFinite(heightM) ? whole.format(Math.round(heightM / 10) * 10) : '';
}

function oneDecimal(value: number | null): string {
  return value === null || !Number.isFinite(value) ? '' : (Math.round(value * 10) / 10).toFixed(1);
}

/** Ventilation to three significant figures: "48,700". */
function ventilation(ventilationM2s: number): string {
  if (!Number.isFinite(ventilationM2s)) return '';
  const step = ventilationM2s >= 1000 ? 10 ** (Math.floor(Math.log10(ventilationM2s)) - 2) : 10;
  return whole.format(Math.round(ventilationM2s / step) * step);
}

export const SERIES_TABLE_COLUMNS = [
  'Local time',
  'Mixing m',
  'Effective m',
  'Dry layer m',
  'Coupled',
  'Transport m/s',
  'Vent m²/s',
  'HDW',
  'C-Haines',
  'PFT GW',
  'Min RH %',
];

function hourRow(hour: HourAssessment, timeZone: string): string[] {
  // The layer aloft is the one to watch; a ground-based one (the heated surface layer) only when it is all there is.
  const shown = lowestDryLayerAloft(hour.dryNearAdiabaticLayers) ?? hour.dryNearAdiabaticLayers[0];
  const moreLayers = hour.dryNearAdiabaticLayers.length - 1;
  const dryLayer = shown ? `${metres(shown.baseAglM)}-${metres(shown.topAglM)}${moreLayers > 0 ? ` +${moreLayers}` : ''}` : '';
  return [
    formatLocalHour(hour.validTime, timeZone),
    // A mixing height at the profile top is a lower bound.
    `${hour.mixingReachesProfileTop ? '≥' : ''}${metres(hour.mixingHeightAglM)}`,
    metres(hour.effectiveMixingHeightAglM),
    dryLayer,
    hour.coupled ? 'YES' : '',
    `${compassPoint(hour.transportWind.dirDeg)} ${oneDecimal(hour.transportWind.speedMs)}`,
    ventilation(hour.ventilationM2s),
    whole.format(Math.round(hour.hdw)),
    oneDecimal(hour.cHaines),
    // No PFT: no pyroCb possible within the profile.
    hour.pftGw === null ? 'none' : oneDecimal(hour.pftGw),
    whole.format(Math.round(hour.mixedLayerMinRelativeHumidityPct)),
  ];
}

function gapRow(gap: HourGap, timeZone: string): string[] {
  const row = SERIES_TABLE_COLUMNS.map(() => '');
  row[0] = formatLocalHour(gap.validTime, timeZone);
  row[4] = 'NO DATA';
  return row;
}

/** The hour-by-hour table, gaps in their place marked NO DATA so a hole never reads as a quiet hour. */
export function seriesTable(series: SeriesAssessment): MessageTable {
  const rows: Array<{ timeMs: number; cells: string[] }> = [
    ...series.hours.map((hour) => ({ timeMs: Date.parse(hour.validTime), cells: hourRow(hour, series.timeZone) })),
    ...(series.gaps ?? []).map((gap) => ({ timeMs: Date.parse(gap.validTime), cells: gapRow(gap, series.timeZone) })),
  ];
  rows.sort((a, b) => a.timeMs - b.timeMs);
  return { columns: SERIES_TABLE_COLUMNS, rows: rows.map((row) => row.cells) };
}
