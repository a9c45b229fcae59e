import { GROUND_BASED_LAYER_MAX_BASE_AGL_M } from '../core/mixing/coupling.ts';
import type { HourAssessment, SeriesAssessment } from '../watch/seriesAssessment.ts';
import { encodeDetailValue } from './actionValues.ts';
import { hainesValueText } from './hainesWording.ts';
import { formatLocalHour } from './localTime.ts';
import type { Message, MessageAction, MessageField, MessageImage } from './message.ts';
import { drawMixingChartPng, prepareMixingChartPng } from './mixingChart.ts';
import { placeLabel } from './placeLabel.ts';
import type { RenderOptions } from './renderOptions.ts';
import { buildMessage } from './safetyFooter.ts';
import { sourceLine } from './sourceLine.ts';
import {
  formatHdw,
  formatHeightAgl,
  formatPft,
  formatRelativeHumidity,
  formatVentilation,
  formatWind,
  type UnitSystem,
} from './units.ts';

function extreme(hours: HourAssessment[], score: (hour: HourAssessment) => number): HourAssessment {
  return hours.reduce((best, hour) => (score(hour) > score(best) ? hour : best));
}

/** The coupling sentence: when the mixed layer first reaches a dry layer, or that it does not. */
export function couplingLine(hours: HourAssessment[], timeZone: string, units: UnitSystem, span: string): string {
  const first = hours.find((hour) => hour.coupled);
  if (first) {
    // The layer aloft it reaches: never the ground-based dry layer, which is the mixed layer itself.
    const layer =
      first.coupledLayer ??
      first.dryNearAdiabaticLayers.find((candidate) => candidate.baseAglM > GROUND_BASED_LAYER_MAX_BASE_AGL_M && first.mixingHeightAglM >= candidate.baseAglM);
    const layerText = layer ? ` (layer ${formatHeightAgl(layer.baseAglM, units)} to ${formatHeightAgl(layer.topAglM, units)})` : '';
    return `Mixed layer reaches a dry near-dry-adiabatic layer at ${formatLocalHour(first.validTime, timeZone)}${layerText}; mixing then runs to ${formatHeightAgl(first.effectiveMixingHeightAglM, units)}.`;
  }
  const anyLayer = hours.some((hour) => hour.dryNearAdiabaticLayers.some((layer) => layer.baseAglM > GROUND_BASED_LAYER_MAX_BASE_AGL_M));
  return anyLayer
    ? `Mixed layer stays below the dry near-dry-adiabatic layer aloft ${span}.`
    : `No dry near-dry-adiabatic layer aloft ${span}.`;
}

/** Plume cloud potential: the first hour the mixed layer reaches the LCL, or how close it gets. */
export function plumeCloudField(hours: HourAssessment[], timeZone: string, units: UnitSystem): MessageField {
  const first = hours.find((hour) => hour.plumeCloudPossible);
  if (first) {
    return {
      label: 'Plume cloud',
      value: `possible from ${formatLocalHour(first.validTime, timeZone)}: mixing ${formatHeightAgl(first.effectiveMixingHeightAglM, units)} reaches the LCL ${formatHeightAgl(first.lclHeightAglM, units)}`,
    };
  }
  const closest = extreme(hours, (hour) => hour.effectiveMixingHeightAglM - hour.lclHeightAglM);
  return {
    label: 'Plume cloud',
    value: `not expected: mixing stays below the LCL (closest ${formatHeightAgl(closest.effectiveMixingHeightAglM, units)} vs ${formatHeightAgl(closest.lclHeightAglM, units)}, ${formatLocalHour(closest.validTime, timeZone)})`,
  };
}

/** The figures that matter for a span of hours, one field each. */
export function keyFigureFields(hours: HourAssessment[], timeZone: string, units: UnitSystem): MessageField[] {
  const at = (hour: HourAssessment): string => formatLocalHour(hour.validTime, timeZone);
  const peak = extreme(hours, (hour) => hour.effectiveMixingHeightAglM);
  const driest = extreme(hours, (hour) => -hour.mixedLayerMinRelativeHumidityPct);
  const hottestDriestWindiest = extreme(hours, (hour) => hour.hdw);
  const haines = extreme(hours, (hour) => hour.hainesTotal);
  const withPft = hours.filter((hour) => hour.pftGw !== null && Number.isFinite(hour.pftGw));
  const lowestPft = withPft.length > 0 ? extreme(withPft, (hour) => -(hour.pftGw ?? Infinity)) : null;
  const intoDryLayer = peak.effectiveMixingHeightAglM > peak.mixingHeightAglM ? ' (into the dry layer)' : '';
  return [
    { label: 'Peak mixing height', value: `${formatHeightAgl(peak.effectiveMixingHeightAglM, units)}${intoDryLayer}, ${at(peak)}` },
    {
      label: 'Transport wind, ventilation (at peak)',
      value: `${formatWind(peak.transportWind, units)} · ${formatVentilation(peak.ventilationM2s, units)}`,
    },
    { label: 'Driest mixed layer', value: `${formatRelativeHumidity(driest.mixedLayerMinRelativeHumidityPct)} RH, ${at(driest)}` },
    { label: 'Hot-Dry-Windy Index (max)', value: `${formatHdw(hottestDriestWindiest.hdw)}, ${at(hottestDriestWindiest)}` },
    plumeCloudField(hours, timeZone, units),
    {
      label: 'PyroCb Firepower Threshold (lowest)',
      value: lowestPft ? `${formatPft(lowestPft.pftGw)}, ${at(lowestPft)} (the lower, the less fire power a pyroCb needs)` : formatPft(null),
    },
    { label: 'Haines Index (max)', value: `${hainesValueText(haines.hainesTotal, haines.hainesVariant)}, ${at(haines)}` },
  ];
}

/** Makes the lookup's (and summary's) chart off the event loop; call before building the message. */
export function prepareChartImage(series: SeriesAssessment, units: UnitSystem, options: RenderOptions = {}): Promise<void> {
  if (options.images === false || series.hours.length === 0) return Promise.resolve();
  return prepareMixingChartPng(series, { units });
}

export function chartImage(series: SeriesAssessment, units: UnitSystem, options: RenderOptions): MessageImage[] {
  if (options.images === false || series.hours.length === 0) return [];
  const chart = drawMixingChartPng(series, { units });
  if (!chart.ok) return [];
  return [
    {
      fileName: 'mixing-48h.png',
      altText: `Mixing height for the next ${series.hours.length} hours at ${placeLabel(series.location)} against the dry near-dry-adiabatic layer${series.invented ? ' (invented demo data)' : ''}.`,
      png: chart.png,
    },
  ];
}

/** The button that opens the detail view of one hour of a series. */
export function detailAction(series: SeriesAssessment, hour: HourAssessment): MessageAction {
  return {
    actionId: 'show-detail',
    label: `Layers at ${formatLocalHour(hour.validTime, series.timeZone)}`,
    value: encodeDetailValue(series.location.latitude, series.location.longitude, hour.validTime),
  };
}

/**
 * The answer to a lookup: the next 48 hours in a few lines that fit a phone screen, with the
 * 48-hour chart and a button for the detail view of the hour that matters most.
 */
export function buildLookupMessage(series: SeriesAssessment, units: UnitSystem, options: RenderOptions = {}): Message {
  const place = placeLabel(series.location);
  const hours = series.hours;
  if (hours.length === 0) {
    return buildMessage(
      {
        kind: 'notice',
        title: `${place}: no forecast hours`,
        sections: [{ lines: [`The source ${series.sourceName} returned no forecast hours for this place. Try again after the next model run.`] }],
        inventedData: series.invented,
      },
      options.footerLocalLine,
    );
  }
  const last = hours[hours.length - 1];
  const span = `through ${formatLocalHour(last.validTime, series.timeZone)}`;
  const coupling = hours.find((hour) => hour.coupled);
  const focus = coupling ?? extreme(hours, (hour) => hour.effectiveMixingHeightAglM);

  return buildMessage(
    {
      kind: 'lookup',
      title: `${place}: next ${hours.length} h`,
      severity: coupling ? 'warning' : 'info',
      inventedData: series.invented,
      sections: [
        { lines: [couplingLine(hours, series.timeZone, units, span)], fields: keyFigureFields(hours, series.timeZone, units) },
        { lines: [sourceLine(series.model, series.runTime, series.sourceName, series.invented)] },
      ],
      images: chartImage(series, units, options),
      actions: [detailAction(series, focus)],
    },
    options.footerLocalLine,
  );
}
