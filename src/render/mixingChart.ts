import type { SeriesAssessment } from '../watch/seriesAssessment.ts';
import { INVENTED_DATA_NOTE } from './inventedDataNote.ts';
import { formatLocalHour, localParts } from './localTime.ts';
import { prepareSvgToPng, rasterizeSvgToPng, type PngResult } from './rasterizePng.ts';
import { SAFETY_FOOTER_SHORT } from './safetyFooter.ts';
import { CHART_FONT_FAMILY, escapeXml, polylinePoints, px } from './svgMarkup.ts';
import { heightInSystemUnit, heightUnitLabel, type UnitSystem } from './units.ts';

export interface MixingChartOptions {
  units: UnitSystem;
}

export const MIXING_CHART_WIDTH_PX = 720;
export const MIXING_CHART_HEIGHT_PX = 320;

/** Plot area inside the picture. */
export const MIXING_CHART_PLOT = { leftPx: 66, topPx: 52, widthPx: 630, heightPx: 190 } as const;

const INK = {
  text: '#2E2C29',
  faint: '#77736C',
  grid: '#E4DFD7',
  paper: '#FFFDF8',
  mixing: '#1F6F5C',
  dryLayerFill: '#F2B134',
  dryLayerEdge: '#C9860A',
  coupling: '#B8432F',
  midnight: '#9C978F',
} as const;

/** x of the hour at `index` among `count` hours: hours sit at the centres of equal slots. */
export function mixingChartX(index: number, count: number): number {
  const slot = MIXING_CHART_PLOT.widthPx / Math.max(count, 1);
  return MIXING_CHART_PLOT.leftPx + (index + 0.5) * slot;
}

/** A round step giving about five height gridlines. */
function niceStep(maxValue: number): number {
  const raw = maxValue / 5;
  const magnitude = 10 ** Math.floor(Math.log10(Math.max(raw, 1)));
  const normalised = raw / magnitude;
  const factor = normalised <= 1 ? 1 : normalised <= 2 ? 2 : normalised <= 2.5 ? 2.5 : normalised <= 5 ? 5 : 10;
  return factor * magnitude;
}

function text(x: number, y: number, content: string, attributes = ''): string {
  return `<text x="${px(x)}" y="${px(y)}" ${attributes}>${escapeXml(content)}</text>`;
}

const grouped = new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 });

/**
 * The two-second picture: mixing height hour by hour against the dry near-dry-adiabatic layer,
 * with the hour the mixed layer first reaches it marked.
 */
export function drawMixingChartSvg(series: SeriesAssessment, options: MixingChartOptions): string {
  const { leftPx, topPx, widthPx, heightPx } = MIXING_CHART_PLOT;
  const hours = series.hours;
  const count = hours.length;
  const slot = widthPx / Math.max(count, 1);
  const toUnit = (heightM: number): number => heightInSystemUnit(heightM, options.units);
  const tallest = Math.max(
    1000,
    ...hours.flatMap((hour) => [
      hour.mixingHeightAglM,
      hour.effectiveMixingHeightAglM,
      ...hour.dryNearAdiabaticLayers.map((layer) => layer.topAglM),
    ]).filter(Number.isFinite),
  );
  const step = niceStep(toUnit(tallest) * 1.08);
  const axisTop = Math.ceil((toUnit(tallest) * 1.08) / step) * step;
  const yOf = (heightM: number): number => topPx + heightPx * (1 - Math.min(Math.max(toUnit(heightM), 0), axisTop) / axisTop);
  const parts: string[] = [];

  parts.push(`<rect width="${MIXING_CHART_WIDTH_PX}" height="${MIXING_CHART_HEIGHT_PX}" fill="#FFFFFF"/>`);
  parts.push(`<rect x="${leftPx}" y="${topPx}" width="${widthPx}" height="${heightPx}" fill="${INK.paper}"/>`);

  for (let value = 0; value <= axisTop + 1e-9; value += step) {
    const y = topPx + heightPx * (1 - value / axisTop);
    parts.push(`<line x1="${leftPx}" y1="${px(y)}" x2="${leftPx + widthPx}" y2="${px(y)}" stroke="${INK.grid}" stroke-width="1"/>`);
    parts.push(text(leftPx - 6, y + 4, grouped.format(value), `font-size="11" fill="${INK.text}" text-anchor="end"`));
  }
  parts.push(text(12, topPx + heightPx / 2, `Height AGL (${heightUnitLabel(options.units)})`, `font-size="11" fill="${INK.faint}" text-anchor="middle" transform="rotate(-90 12 ${px(topPx + heightPx / 2)})"`));

  // The dry layer, hour by hour: one slot-wide block per layer per hour.
  hours.forEach((hour, index) => {
    for (const layer of hour.dryNearAdiabaticLayers) {
      const yTop = yOf(layer.topAglM);
      const yBase = yOf(layer.baseAglM);
      if (!(yBase > yTop)) continue;
      parts.push(`<rect class="dry-layer-slot" x="${px(mixingChartX(index, count) - slot / 2)}" y="${px(yTop)}" width="${px(slot)}" height="${px(yBase - yTop)}" fill="${INK.dryLayerFill}" fill-opacity="0.3"/>`);
    }
  });
  // Base and top edges, as lines through the hours that have a layer (first layer each hour).
  for (const edge of ['baseAglM', 'topAglM'] as const) {
    const runs: Array<Array<[number, number]>> = [];
    let run: Array<[number, number]> = [];
    hours.forEach((hour, index) => {
      const layer = hour.dryNearAdiabaticLayers[0];
      if (layer) run.push([mixingChartX(index, count), yOf(layer[edge])]);
      else if (run.length > 0) {
        runs.push(run);
        run = [];
      }
    });
    if (run.length > 0) runs.push(run);
    for (const points of runs) {
      parts.push(`<polyline class="dry-layer-${edge === 'baseAglM' ? 'base' : 'top'}" points="${polylinePoints(points)}" fill="none" stroke="${INK.dryLayerEdge}" stroke-width="1.2" stroke-dasharray="5 3"/>`);
    }
  }

  // Local midnights and six-hour ticks.
  let lastDay = '';
  hours.forEach((hour, index) => {
    const local = localParts(hour.validTime, series.timeZone);
    if (!local) return;
    const x = mixingChartX(index, count);
    if (local.hour % 6 === 0) {
      parts.push(text(x, topPx + heightPx + 15, String(local.hour).padStart(2, '0'), `font-size="11" fill="${INK.text}" text-anchor="middle"`));
      parts.push(`<line x1="${px(x)}" y1="${topPx + heightPx}" x2="${px(x)}" y2="${topPx + heightPx + 4}" stroke="${INK.text}"/>`);
    }
    if (local.dayLabel !== lastDay) {
      if (lastDay !== '' && local.hour === 0) {
        parts.push(`<line class="midnight" x1="${px(x - slot / 2)}" y1="${topPx}" x2="${px(x - slot / 2)}" y2="${topPx + heightPx}" stroke="${INK.midnight}" stroke-width="1" stroke-dasharray="2 3"/>`);
      }
      parts.push(text(x, topPx + heightPx + 31, local.dayLabel, `font-size="11" font-weight="bold" fill="${INK.text}"`));
      lastDay = local.dayLabel;
    }
  });

  const mixingPoints = hours.map((hour, index): [number, number] => [mixingChartX(index, count), yOf(hour.mixingHeightAglM)]);
  parts.push(`<polyline id="mixing-height-line" points="${polylinePoints(mixingPoints)}" fill="none" stroke="${INK.mixing}" stroke-width="2.6" stroke-linejoin="round"/>`);
  hours.forEach((hour, index) => {
    if (hour.effectiveMixingHeightAglM > hour.mixingHeightAglM) {
      const x = mixingChartX(index, count);
      parts.push(`<line class="effective-mixing" x1="${px(x)}" y1="${px(yOf(hour.mixingHeightAglM))}" x2="${px(x)}" y2="${px(yOf(hour.effectiveMixingHeightAglM))}" stroke="${INK.mixing}" stroke-width="2" stroke-dasharray="3 2"/>`);
    }
  });

  const couplingIndex = hours.findIndex((hour) => hour.coupled);
  if (couplingIndex >= 0) {
    const x = mixingChartX(couplingIndex, count);
    const label = `Reaches dry layer ${formatLocalHour(hours[couplingIndex].validTime, series.timeZone)}`;
    const anchor = x > leftPx + widthPx * 0.7 ? 'end' : 'start';
    parts.push(`<line id="coupling-marker" x1="${px(x)}" y1="${topPx}" x2="${px(x)}" y2="${topPx + heightPx}" stroke="${INK.coupling}" stroke-width="2"/>`);
    parts.push(`<circle cx="${px(x)}" cy="${px(yOf(hours[couplingIndex].mixingHeightAglM))}" r="4.5" fill="${INK.coupling}"/>`);
    parts.push(text(anchor === 'start' ? x + 6 : x - 6, topPx + 14, label, `font-size="12" font-weight="bold" fill="${INK.coupling}" text-anchor="${anchor}" stroke="#FFFFFF" stroke-width="4" stroke-linejoin="round" paint-order="stroke"`));
  } else {
    parts.push(text(leftPx + widthPx - 8, topPx + 14, `Mixing stays below any dry layer for all ${count} h`, `id="no-coupling-note" font-size="12" font-weight="bold" fill="${INK.mixing}" text-anchor="end" stroke="#FFFFFF" stroke-width="4" stroke-linejoin="round" paint-order="stroke"`));
  }

  parts.push(`<rect x="${leftPx}" y="${topPx}" width="${widthPx}" height="${heightPx}" fill="none" stroke="${INK.faint}" stroke-width="1"/>`);

  const place = series.location.name ?? `${series.location.latitude.toFixed(3)}, ${series.location.longitude.toFixed(3)}`;
  parts.push(text(leftPx, 20, `${place}: mixing height, next ${count} h (local time)`, `font-size="14" font-weight="bold" fill="${INK.text}"`));
  // Legend, one row under the title.
  const legendY = 38;
  parts.push(`<line x1="${leftPx}" y1="${legendY}" x2="${leftPx + 22}" y2="${legendY}" stroke="${INK.mixing}" stroke-width="2.6"/>`);
  parts.push(text(leftPx + 27, legendY + 4, 'Mixing height', `font-size="11" fill="${INK.text}"`));
  parts.push(`<line x1="${leftPx + 122}" y1="${legendY - 6}" x2="${leftPx + 122}" y2="${legendY + 6}" stroke="${INK.mixing}" stroke-width="2" stroke-dasharray="3 2"/>`);
  parts.push(text(leftPx + 128, legendY + 4, 'Mixed up into dry layer', `font-size="11" fill="${INK.text}"`));
  parts.push(`<rect x="${leftPx + 280}" y="${legendY - 6}" width="20" height="12" fill="${INK.dryLayerFill}" fill-opacity="0.3" stroke="${INK.dryLayerEdge}" stroke-dasharray="5 3"/>`);
  parts.push(text(leftPx + 305, legendY + 4, 'Dry near-dry-adiabatic layer', `font-size="11" fill="${INK.text}"`));
  parts.push(`<line x1="${leftPx + 490}" y1="${legendY - 6}" x2="${leftPx + 490}" y2="${legendY + 6}" stroke="${INK.coupling}" stroke-width="2"/>`);
  parts.push(text(leftPx + 496, legendY + 4, 'First hour it reaches it', `font-size="11" fill="${INK.text}"`));

  const caveat = series.invented ? `${INVENTED_DATA_NOTE} ${SAFETY_FOOTER_SHORT}` : SAFETY_FOOTER_SHORT;
  parts.push(text(MIXING_CHART_WIDTH_PX / 2, MIXING_CHART_HEIGHT_PX - 10, caveat, `font-size="11" fill="${series.invented ? INK.coupling : INK.text}" text-anchor="middle"`));

  return [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${MIXING_CHART_WIDTH_PX}" height="${MIXING_CHART_HEIGHT_PX}" viewBox="0 0 ${MIXING_CHART_WIDTH_PX} ${MIXING_CHART_HEIGHT_PX}" font-family="${CHART_FONT_FAMILY}">`,
    ...parts,
    '</svg>',
  ].join('\n');
}

/**
 * Charts already drawn, by series object and options. A cached forecast is assessed once and its
 * assessment is then one object for every channel that asks (series are never changed after
 * assessment), so the SVG, whose hour labels cost most of its drawing, is drawn once per run.
 */
const drawnCharts = new WeakMap<SeriesAssessment, Map<string, string>>();

function chartSvgOnce(series: SeriesAssessment, options: MixingChartOptions): string {
  // Every option, by name: one added later is part of the key without anyone remembering to add it.
  const key = JSON.stringify(options, Object.keys(options).sort());
  let byOptions = drawnCharts.get(series);
  if (!byOptions) drawnCharts.set(series, (byOptions = new Map()));
  let svg = byOptions.get(key);
  if (svg === undefined) byOptions.set(key, (svg = drawMixingChartSvg(series, options)));
  return svg;
}

export function drawMixingChartPng(series: SeriesAssessment, options: MixingChartOptions): PngResult {
  return rasterizeSvgToPng(chartSvgOnce(series, options));
}

/** Rasterises the chart off the event loop so that `drawMixingChartPng` finds it ready. */
export function prepareMixingChartPng(series: SeriesAssessment, options: MixingChartOptions): Promise<void> {
  return prepareSvgToPng(chartSvgOnce(series, options));
}
