import type { AnalysisResult, LevelReport } from '../core/analysisResult.ts';
import { INVENTED_DATA_NOTE } from './inventedDataNote.ts';
import { formatLocalDateHour } from './localTime.ts';
import { prepareSvgToPng, rasterizeSvgToPng, type PngResult } from './rasterizePng.ts';
import { SAFETY_FOOTER_SHORT } from './safetyFooter.ts';
import {
  DEFAULT_SKEWT_FRAME,
  dewpointForMixingRatioC,
  dryAdiabatTemperatureC,
  moistAdiabatPath,
  pointOf,
  samplePressures,
  yOfPressure,
  type SkewTFrame,
} from './skewTGeometry.ts';
import { clipPolyline, type Rect } from './clipToRect.ts';
import { CHART_FONT_FAMILY, escapeXml, polylinePoints, px } from './svgMarkup.ts';
import { fahrenheitToCelsius, formatHeightAgl, heightUnitLabel, metresToFeet, type UnitSystem } from './units.ts';
import { KNOTS_PER_METRE_PER_SECOND, windBarbSvg } from './windBarbs.ts';

export interface SkewTOptions {
  units: UnitSystem;
  /** IANA zone of the place, for the title's local time; UTC when absent. */
  timeZone?: string;
  /** Says "invented" on the picture itself, so a shared screenshot cannot pass for a forecast. */
  invented: boolean;
}

/** Lapsewatch's own chart colours. */
const INK = {
  paper: '#FFFDF8',
  frame: '#5C5A55',
  text: '#2E2C29',
  faint: '#77736C',
  isotherm: '#DAD5CD',
  isothermZero: '#9AA5B1',
  isobar: '#D2CDC5',
  dryAdiabat: '#D8B48A',
  moistAdiabat: '#8FBFB0',
  mixingRatio: '#B9A9D8',
  temperature: '#C8553D',
  dewpoint: '#3A6EA5',
  parcel: '#5B4B8A',
  dryLayerFill: '#F2B134',
  dryLayerEdge: '#C9860A',
  mixed: '#1F6F5C',
  ground: '#E6E1D8',
  wind: '#3B3A36',
} as const;

export const SKEWT_WIDTH_PX = 760;
export const SKEWT_HEIGHT_PX = 790;

/** A white outline behind a label so it stays readable over the traces. */
const HALO = 'stroke="#FFFFFF" stroke-width="3" stroke-linejoin="round" paint-order="stroke"';

const ISOBARS_HPA = [1000, 900, 850, 800, 700, 600, 500, 400, 300, 250, 200];

function usable(levels: LevelReport[]): LevelReport[] {
  return levels.filter(
    (level) => Number.isFinite(level.pressureHpa) && Number.isFinite(level.temperatureC) && level.pressureHpa > 0,
  );
}

/** Pressure at a height above ground, interpolated linearly in ln p between the profile's levels. */
function pressureAtHeightAgl(levels: LevelReport[], heightAglM: number): number | null {
  for (let index = 1; index < levels.length; index += 1) {
    const below = levels[index - 1];
    const above = levels[index];
    if (above.heightAglM >= heightAglM && below.heightAglM <= heightAglM && above.heightAglM > below.heightAglM) {
      const fraction = (heightAglM - below.heightAglM) / (above.heightAglM - below.heightAglM);
      return Math.exp(Math.log(below.pressureHpa) + fraction * (Math.log(above.pressureHpa) - Math.log(below.pressureHpa)));
    }
  }
  return null;
}

function plotRect(frame: SkewTFrame): Rect {
  return { left: frame.leftPx, top: frame.topPx, right: frame.leftPx + frame.widthPx, bottom: frame.topPx + frame.heightPx };
}

/** A polyline clipped to the plot, as one or more <polyline> elements with the given attributes. */
function clippedPolyline(points: Array<[number, number]>, frame: SkewTFrame, attributes: string): string {
  return clipPolyline(points, plotRect(frame))
    .map((run) => `<polyline points="${polylinePoints(run)}" fill="none" ${attributes}/>`)
    .join('');
}

function text(x: number, y: number, content: string, attributes = ''): string {
  return `<text x="${px(x)}" y="${px(y)}" ${attributes}>${escapeXml(content)}</text>`;
}

/** Guide lines (clipped to the plot) and their labels (outside the clip). */
function guideLines(frame: SkewTFrame, units: UnitSystem): { lines: string[]; labels: string[] } {
  const out: string[] = [];
  const labels: string[] = [];
  const pressures = samplePressures(frame);
  const bottom = frame.bottomPressureHpa;
  const top = frame.topPressureHpa;
  const right = frame.leftPx + frame.widthPx;
  const floor = frame.topPx + frame.heightPx;

  for (const p of ISOBARS_HPA) {
    const y = yOfPressure(frame, p);
    out.push(`<line class="isobar" x1="${px(frame.leftPx)}" y1="${px(y)}" x2="${px(right)}" y2="${px(y)}" stroke="${INK.isobar}" stroke-width="1"/>`);
  }

  // Isotherms every 10 degrees of the channel's own unit, so the labels are round numbers.
  const isotherms: Array<{ c: number; label: string }> = [];
  if (units === 'us') {
    for (let f = -150; f <= 130; f += 10) isotherms.push({ c: fahrenheitToCelsius(f), label: `${f}` });
  } else {
    for (let c = -110; c <= 50; c += 10) isotherms.push({ c, label: `${c}` });
  }
  for (const { c, label } of isotherms) {
    const [x1] = pointOf(frame, c, bottom);
    const zero = Math.abs(c) < 1e-9;
    out.push(
      clippedPolyline([pointOf(frame, c, bottom), pointOf(frame, c, top)], frame, `class="isotherm" stroke="${zero ? INK.isothermZero : INK.isotherm}" stroke-width="${zero ? 1.4 : 1}"`),
    );
    if (x1 >= frame.leftPx - 1 && x1 <= right + 1) {
      labels.push(text(x1, floor + 16, label, `font-size="11" fill="${INK.faint}" text-anchor="middle"`));
    }
  }

  for (let thetaK = 250; thetaK <= 470; thetaK += 10) {
    const points = pressures.map((p) => pointOf(frame, dryAdiabatTemperatureC(thetaK, p), p));
    out.push(clippedPolyline(points, frame, `class="dry-adiabat" stroke="${INK.dryAdiabat}" stroke-width="1"`));
  }

  for (let startC = -16; startC <= 36; startC += 4) {
    const up = moistAdiabatPath(startC, 1000, top);
    const down = moistAdiabatPath(startC, 1000, bottom).reverse();
    const points = [...down, ...up.slice(1)].map((point) => pointOf(frame, point.temperatureC, point.pressureHpa));
    out.push(clippedPolyline(points, frame, `class="moist-adiabat" stroke="${INK.moistAdiabat}" stroke-width="1" stroke-dasharray="6 4"`));
  }

  for (const gramsPerKg of [1, 2, 4, 8, 16]) {
    const points = pressures.filter((p) => p >= 700).map((p) => pointOf(frame, dewpointForMixingRatioC(gramsPerKg, p), p));
    out.push(clippedPolyline(points, frame, `class="mixing-ratio" stroke="${INK.mixingRatio}" stroke-width="1" stroke-dasharray="2 3"`));
    const [lx, ly] = points[points.length - 1];
    if (lx < frame.leftPx + 10 || lx > frame.leftPx + frame.widthPx - 10) continue;
    out.push(text(lx, ly - 3, `${gramsPerKg} g/kg`, `font-size="9" fill="${INK.mixingRatio}" text-anchor="middle"`));
  }
  return { lines: out, labels };
}

function heightAxis(frame: SkewTFrame, levels: LevelReport[], units: UnitSystem): string[] {
  const out: string[] = [];
  const right = frame.leftPx + frame.widthPx;
  const stepM = units === 'us' ? 3000 / metresToFeet(1) : 1000;
  const topAglM = levels[levels.length - 1]?.heightAglM ?? 0;
  for (let tick = 0; tick * stepM <= topAglM; tick += 1) {
    const pressure = tick === 0 ? levels[0]?.pressureHpa : pressureAtHeightAgl(levels, tick * stepM);
    if (pressure === null || pressure === undefined || pressure < frame.topPressureHpa || pressure > frame.bottomPressureHpa) continue;
    const y = yOfPressure(frame, pressure);
    const label = units === 'us' ? `${tick * 3}k` : `${tick}`;
    out.push(`<line x1="${px(right)}" y1="${px(y)}" x2="${px(right + 6)}" y2="${px(y)}" stroke="${INK.frame}" stroke-width="1"/>`);
    out.push(text(right + 9, y + 4, label, `font-size="11" fill="${INK.text}"`));
  }
  out.push(
    text(right + 8, frame.topPx - 8, units === 'us' ? 'ft AGL' : 'km AGL', `font-size="11" fill="${INK.faint}"`),
  );
  return out;
}

/** Closest two barbs may sit, px: closer, their feathers tangle. */
const BARB_SPACING_PX = 24;
/** The wind column's width at the plot's right edge, px; a barb's staff and feathers fit inside. */
const WIND_COLUMN_PX = 80;

/**
 * The wind column: a barb at every level, thinned so that barbs stay BARB_SPACING_PX apart, from
 * the ground up, on a pale strip at the right edge so the traces behind do not hide them.
 */
function windColumn(frame: SkewTFrame, levels: LevelReport[]): string {
  const right = frame.leftPx + frame.widthPx;
  const x = right - WIND_COLUMN_PX / 2;
  const barbs: string[] = [];
  let lastY = Number.POSITIVE_INFINITY;
  for (const level of levels) {
    if (level.pressureHpa > frame.bottomPressureHpa || level.pressureHpa < frame.topPressureHpa) continue;
    if (!Number.isFinite(level.windSpeedMs) || !Number.isFinite(level.windDirDeg)) continue;
    const y = yOfPressure(frame, level.pressureHpa);
    // Feathers reach up to a barb's spacing above its level: none may cross the frame's top.
    if (lastY - y < BARB_SPACING_PX || y - frame.topPx < BARB_SPACING_PX / 2) continue;
    barbs.push(windBarbSvg(x, y, level.windDirDeg, level.windSpeedMs * KNOTS_PER_METRE_PER_SECOND, INK.wind));
    lastY = y;
  }
  if (barbs.length === 0) return '';
  const strip = `<rect x="${right - WIND_COLUMN_PX}" y="${frame.topPx}" width="${WIND_COLUMN_PX}" height="${frame.heightPx}" fill="#FFFFFF" fill-opacity="0.55"/>`;
  const label = text(x, frame.topPx - 8, 'Wind, kt', `font-size="11" fill="${INK.faint}" text-anchor="middle"`);
  return `<g id="wind-column">${strip}${label}${barbs.join('')}</g>`;
}

function legend(frame: SkewTFrame): string {
  const x = frame.leftPx + 10;
  const y = frame.topPx + 10;
  const rows: Array<[string, string, string]> = [
    ['Air temperature', INK.temperature, ''],
    ['Dew point', INK.dewpoint, ''],
    ['Surface parcel rising', INK.parcel, '7 4'],
    ['Mixing height', INK.mixed, ''],
    ['Dry adiabat', INK.dryAdiabat, ''],
    ['Moist adiabat', INK.moistAdiabat, '6 4'],
    ['Mixing ratio, g/kg', INK.mixingRatio, '2 3'],
  ];
  const parts = [`<rect x="${x}" y="${y}" width="232" height="${rows.length * 17 + 47}" rx="4" fill="#FFFFFF" fill-opacity="0.92" stroke="${INK.isobar}"/>`];
  rows.forEach(([label, colour, dash], index) => {
    const rowY = y + 15 + index * 17;
    parts.push(
      `<line x1="${x + 8}" y1="${rowY}" x2="${x + 34}" y2="${rowY}" stroke="${colour}" stroke-width="${index < 4 ? 2.5 : 1.2}"${dash ? ` stroke-dasharray="${dash}"` : ''}/>`,
    );
    parts.push(text(x + 42, rowY + 4, label, `font-size="11" fill="${INK.text}"`));
  });
  const swatchY = y + 15 + rows.length * 17;
  parts.push(
    `<rect x="${x + 8}" y="${swatchY - 6}" width="26" height="11" fill="${INK.dryLayerFill}" fill-opacity="0.35" stroke="${INK.dryLayerEdge}" stroke-width="0.8"/>`,
  );
  parts.push(text(x + 42, swatchY + 4, 'Dry near-dry-adiabatic layer', `font-size="11" fill="${INK.text}"`));
  parts.push(text(x + 8, swatchY + 21, 'Wind barbs: flag 50 kt, feather 10, half 5', `font-size="11" fill="${INK.text}"`));
  return `<g id="legend">${parts.join('')}</g>`;
}

/**
 * A skew-T log-p diagram of one analysed profile as an SVG string: temperature and dew point,
 * the surface parcel's path, the dry near-dry-adiabatic layers shaded and the mixed layer marked.
 */
export function drawSkewTSvg(analysis: AnalysisResult, options: SkewTOptions, frame: SkewTFrame = DEFAULT_SKEWT_FRAME): string {
  const levels = usable(analysis.levels);
  const right = frame.leftPx + frame.widthPx;
  const floor = frame.topPx + frame.heightPx;
  const parts: string[] = [];

  parts.push(`<rect width="${SKEWT_WIDTH_PX}" height="${SKEWT_HEIGHT_PX}" fill="#FFFFFF"/>`);
  parts.push(`<rect x="${frame.leftPx}" y="${frame.topPx}" width="${frame.widthPx}" height="${frame.heightPx}" fill="${INK.paper}"/>`);
  const guides = guideLines(frame, options.units);
  parts.push(...guides.lines, ...guides.labels);

  const surfacePressure = levels[0]?.pressureHpa;
  if (surfacePressure !== undefined && surfacePressure < frame.bottomPressureHpa) {
    const y = yOfPressure(frame, surfacePressure);
    parts.push(`<rect id="ground" x="${frame.leftPx}" y="${px(y)}" width="${frame.widthPx}" height="${px(floor - y)}" fill="${INK.ground}"/>`);
    parts.push(text(right - 6, floor - 6, 'below ground', `font-size="10" fill="${INK.faint}" text-anchor="end"`));
  }

  analysis.dryNearAdiabaticLayers.forEach((layer, index) => {
    const yBase = yOfPressure(frame, Math.min(layer.basePressureHpa, frame.bottomPressureHpa));
    const yTop = yOfPressure(frame, Math.max(layer.topPressureHpa, frame.topPressureHpa));
    if (!(yBase > yTop)) return;
    parts.push(
      `<rect class="dry-layer" id="dry-layer-${index}" x="${frame.leftPx}" y="${px(yTop)}" width="${frame.widthPx}" height="${px(yBase - yTop)}" fill="${INK.dryLayerFill}" fill-opacity="0.22" stroke="${INK.dryLayerEdge}" stroke-width="0.8" stroke-dasharray="4 3"/>`,
    );
    parts.push(
      text(frame.leftPx + 12, yTop + 15, `Dry layer ${formatHeightAgl(layer.baseAglM, options.units)} to ${formatHeightAgl(layer.topAglM, options.units)}`, `font-size="11" font-weight="bold" fill="${INK.dryLayerEdge}" ${HALO}`),
    );
  });

  // The mixed layer: a bar up the left edge from the ground to the mixing height, and the line.
  const mixing = analysis.mixingHeight;
  if (surfacePressure !== undefined && Number.isFinite(mixing.pressureHpa) && mixing.pressureHpa >= frame.topPressureHpa) {
    const yMix = yOfPressure(frame, mixing.pressureHpa);
    const yGround = yOfPressure(frame, surfacePressure);
    parts.push(`<rect id="mixed-layer-bar" x="${frame.leftPx}" y="${px(yMix)}" width="6" height="${px(Math.max(0, yGround - yMix))}" fill="${INK.mixed}" fill-opacity="0.75"/>`);
    parts.push(`<line id="mixing-height-line" x1="${px(frame.leftPx)}" y1="${px(yMix)}" x2="${px(right)}" y2="${px(yMix)}" stroke="${INK.mixed}" stroke-width="2.2"/>`);
    parts.push(text(frame.leftPx + 12, yMix + 14, `Mixing height ${formatHeightAgl(mixing.aglM, options.units)}`, `font-size="12" font-weight="bold" fill="${INK.mixed}" ${HALO}`));
    const coupled = mixing.coupledLayerIndex !== null ? analysis.dryNearAdiabaticLayers[mixing.coupledLayerIndex] : undefined;
    if (coupled && coupled.topPressureHpa >= frame.topPressureHpa) {
      const yEffective = yOfPressure(frame, coupled.topPressureHpa);
      parts.push(`<line id="effective-mixing-line" x1="${px(frame.leftPx)}" y1="${px(yEffective)}" x2="${px(right)}" y2="${px(yEffective)}" stroke="${INK.mixed}" stroke-width="1.6" stroke-dasharray="8 4"/>`);
      parts.push(text(frame.leftPx + 12, yEffective - 6, `Mixing reaches the dry layer: effective ${formatHeightAgl(mixing.effectiveAglM, options.units)}`, `font-size="11" font-weight="bold" fill="${INK.mixed}" ${HALO}`));
    }
  }

  const traces: string[] = [];
  const surface = levels[0];
  if (surface) {
    // Surface parcel: dry adiabat to its LCL, then the pseudo-adiabat.
    const thetaK = (surface.temperatureC + 273.15) * (1000 / surface.pressureHpa) ** 0.2857;
    const lclPressure = Math.min(Math.max(analysis.lcl.pressureHpa, frame.topPressureHpa), surface.pressureHpa);
    if (Number.isFinite(lclPressure)) {
      const dry = samplePressures({ ...frame, bottomPressureHpa: surface.pressureHpa, topPressureHpa: lclPressure }, 10);
      const lclTemperatureC = dryAdiabatTemperatureC(thetaK, lclPressure);
      const moist = moistAdiabatPath(lclTemperatureC, lclPressure, frame.topPressureHpa);
      const points = [
        ...dry.map((p) => pointOf(frame, dryAdiabatTemperatureC(thetaK, p), p)),
        ...moist.slice(1).map((point) => pointOf(frame, point.temperatureC, point.pressureHpa)),
      ];
      traces.push(`<g id="parcel-path">${clippedPolyline(points, frame, `stroke="${INK.parcel}" stroke-width="1.8" stroke-dasharray="7 4"`)}</g>`);
      const [lx, ly] = pointOf(frame, lclTemperatureC, lclPressure);
      traces.push(`<circle id="lcl-marker" cx="${px(lx)}" cy="${px(ly)}" r="3.5" fill="${INK.parcel}"/>`);
      traces.push(text(lx + 7, ly + 4, 'LCL', `font-size="11" fill="${INK.parcel}"`));
    }
  }
  const dewpoints = levels.filter((level) => Number.isFinite(level.dewpointC));
  const traceStyle = 'stroke-width="2.6" stroke-linejoin="round"';
  traces.push(`<g id="dewpoint-trace">${clippedPolyline(dewpoints.map((l) => pointOf(frame, l.dewpointC, l.pressureHpa)), frame, `stroke="${INK.dewpoint}" ${traceStyle}`)}</g>`);
  traces.push(`<g id="temperature-trace">${clippedPolyline(levels.map((l) => pointOf(frame, l.temperatureC, l.pressureHpa)), frame, `stroke="${INK.temperature}" ${traceStyle}`)}</g>`);
  parts.push(...traces);
  parts.push(windColumn(frame, levels));

  parts.push(`<rect x="${frame.leftPx}" y="${frame.topPx}" width="${frame.widthPx}" height="${frame.heightPx}" fill="none" stroke="${INK.frame}" stroke-width="1.2"/>`);
  for (const p of ISOBARS_HPA) {
    parts.push(text(frame.leftPx - 6, yOfPressure(frame, p) + 4, `${p}`, `font-size="11" fill="${INK.text}" text-anchor="end"`));
  }
  parts.push(text(frame.leftPx - 6, frame.topPx - 8, 'hPa', `font-size="11" fill="${INK.faint}" text-anchor="end"`));
  parts.push(...heightAxis(frame, levels, options.units));
  parts.push(legend(frame));
  parts.push(text(frame.leftPx + frame.widthPx / 2, floor + 32, `Temperature (${options.units === 'us' ? '°F' : '°C'}), isotherms slanted 45°`, `font-size="11" fill="${INK.faint}" text-anchor="middle"`));

  const when = formatLocalDateHour(analysis.validTime, options.timeZone ?? 'UTC');
  parts.push(text(frame.leftPx, 26, `${analysis.name}: ${when}`, `font-size="16" font-weight="bold" fill="${INK.text}"`));
  parts.push(text(frame.leftPx, 46, `Skew-T log-p · ${heightUnitLabel(options.units) === 'ft' ? 'heights in ft' : 'heights in km'} above ground · ${options.invented ? 'INVENTED DEMO DATA' : 'model forecast'}`, `font-size="12" fill="${options.invented ? INK.temperature : INK.faint}"`));
  const caveat = options.invented ? `${INVENTED_DATA_NOTE} ${SAFETY_FOOTER_SHORT}` : SAFETY_FOOTER_SHORT;
  parts.push(text(SKEWT_WIDTH_PX / 2, SKEWT_HEIGHT_PX - 12, caveat, `font-size="11" fill="${INK.text}" text-anchor="middle"`));

  return [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${SKEWT_WIDTH_PX}" height="${SKEWT_HEIGHT_PX}" viewBox="0 0 ${SKEWT_WIDTH_PX} ${SKEWT_HEIGHT_PX}" font-family="${CHART_FONT_FAMILY}">`,
    ...parts,
    '</svg>',
  ].join('\n');
}

/**
 * Diagrams already drawn, by analysis object and options. A cached forecast's detail assessment is
 * one object for every channel that asks (analyses are never changed once made), so the same
 * hour's diagram is drawn once.
 */
const drawnDiagrams = new WeakMap<AnalysisResult, Map<string, string>>();

function skewTSvgOnce(analysis: AnalysisResult, options: SkewTOptions): string {
  // Every option, by name: one added later is part of the key without anyone remembering to add it.
  const key = JSON.stringify(options, Object.keys(options).sort());
  let byOptions = drawnDiagrams.get(analysis);
  if (!byOptions) drawnDiagrams.set(analysis, (byOptions = new Map()));
  let svg = byOptions.get(key);
  if (svg === undefined) byOptions.set(key, (svg = drawSkewTSvg(analysis, options)));
  return svg;
}

export function drawSkewTPng(analysis: AnalysisResult, options: SkewTOptions): PngResult {
  return rasterizeSvgToPng(skewTSvgOnce(analysis, options));
}

/** Rasterises the diagram off the event loop so that `drawSkewTPng` finds it ready. */
export function prepareSkewTPng(analysis: AnalysisResult, options: SkewTOptions): Promise<void> {
  return prepareSvgToPng(skewTSvgOnce(analysis, options));
}

