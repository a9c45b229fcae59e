import type { AnalysisResult } from '../core/analysisResult.ts';
import type { HourAssessment } from '../watch/seriesAssessment.ts';
import { describeHaines } from './hainesWording.ts';
import { layerTable } from './layerTable.ts';
import { formatLocalDateHour } from './localTime.ts';
import type { Message, MessageImage } from './message.ts';
import type { RenderOptions } from './renderOptions.ts';
import { buildMessage } from './safetyFooter.ts';
import { drawSkewTPng, prepareSkewTPng } from './skewTDiagram.ts';
import { sourceLine } from './sourceLine.ts';
import {
  formatHeightAgl,
  formatLapseRate,
  formatPft,
  formatRelativeHumidity,
  formatTemperature,
  formatVentilation,
  formatWind,
  type UnitSystem,
} from './units.ts';

/** What the detail view needs besides the hour itself. */
export interface DetailContext extends RenderOptions {
  timeZone: string;
  invented: boolean;
  /** Place name; the analysis' own name when absent. */
  placeName?: string;
  model?: string;
  runTime?: string;
  sourceName?: string;
}

/** Makes the detail view's diagram off the event loop; call before `buildDetailMessage`. */
export function prepareDetailImage(hour: HourAssessment, units: UnitSystem, context: DetailContext): Promise<void> {
  if (context.images === false || !hour.analysis) return Promise.resolve();
  return prepareSkewTPng(hour.analysis, { units, timeZone: context.timeZone, invented: context.invented });
}

function skewTImage(analysis: AnalysisResult, units: UnitSystem, context: DetailContext): MessageImage[] {
  if (context.images === false) return [];
  const drawn = drawSkewTPng(analysis, { units, timeZone: context.timeZone, invented: context.invented });
  if (!drawn.ok) return [];
  return [
    {
      fileName: 'skew-t.png',
      altText: `Skew-T log-p diagram for ${context.placeName ?? analysis.name} at ${formatLocalDateHour(analysis.validTime, context.timeZone)}${context.invented ? ' (invented demo data)' : ''}: temperature, dew point, surface parcel, dry layer and mixing height.`,
      png: drawn.png,
    },
  ];
}

/**
 * One hour in detail: the layer table, mixing height, the dry near-dry-adiabatic layers, the LCL
 * and the Haines Index (labelled), with the skew-T diagram.
 */
export function buildDetailMessage(hour: HourAssessment, units: UnitSystem, context: DetailContext): Message {
  const analysis = hour.analysis;
  const when = formatLocalDateHour(hour.validTime, context.timeZone);
  if (!analysis) {
    return buildMessage(
      {
        kind: 'notice',
        title: `No layer detail for ${when}`,
        sections: [{ lines: ['The full profile for this hour is no longer held. Run the lookup again and press the detail button on the new answer.'] }],
        inventedData: context.invented,
      },
      context.footerLocalLine,
    );
  }
  const place = context.placeName ?? analysis.name;
  const mixing = analysis.mixingHeight;
  const coupledLayer = mixing.coupledLayerIndex !== null ? analysis.dryNearAdiabaticLayers[mixing.coupledLayerIndex] : undefined;
  const mixingLine =
    `Mixing height ${formatHeightAgl(mixing.aglM, units)} (surface parcel at ${formatTemperature(mixing.surfaceTemperatureC, units)})` +
    (coupledLayer ? `; it reaches the dry layer, so mixing runs to ${formatHeightAgl(mixing.effectiveAglM, units)}.` : '.');
  const dryLines =
    analysis.dryNearAdiabaticLayers.length === 0
      ? ['No dry near-dry-adiabatic layer in this profile.']
      : analysis.dryNearAdiabaticLayers.map(
          (layer) =>
            `Dry near-dry-adiabatic layer ${formatHeightAgl(layer.baseAglM, units)} to ${formatHeightAgl(layer.topAglM, units)}: ${formatLapseRate(layer.meanLapseRateCPerKm)}, RH at most ${formatRelativeHumidity(layer.maxRelativeHumidityPct)}` +
            (layer.triggerTemperatureC !== null ? `; the mixed layer reaches it once the surface warms to ${formatTemperature(layer.triggerTemperatureC, units)}.` : '.'),
        );
  const haines = analysis.haines;
  const chosen = haines[haines.variant];
  const hainesLine = chosen
    ? [describeHaines(chosen.total, haines.variant), haines.variantNote, haines.stableLayerNote].filter((part): part is string => !!part).join(' ')
    : `Haines Index: not available for this profile (a dryness-and-lapse-rate index, not a stability measure).`;

  const lines = [
    mixingLine,
    ...dryLines,
    `LCL ${formatHeightAgl(analysis.lcl.heightAglM, units)}; plume cloud ${analysis.plumeCloudPossible ? 'possible (mixing reaches the LCL)' : 'not expected (mixing stays below the LCL)'}.`,
    `Transport wind ${formatWind(analysis.transportWind, units)}; ventilation ${formatVentilation(analysis.ventilationM2s, units)}; PFT ${formatPft(analysis.pft.gw)}.`,
    hainesLine,
  ];
  const provenance =
    context.model && context.runTime ? [sourceLine(context.model, context.runTime, context.sourceName ?? 'unknown source', context.invented)] : [];

  return buildMessage(
    {
      kind: 'detail',
      title: `${place}: layers at ${when}`,
      severity: coupledLayer ? 'warning' : 'info',
      inventedData: context.invented,
      sections: [{ lines }, ...(provenance.length > 0 ? [{ lines: provenance }] : [])],
      table: layerTable(analysis.layers, units),
      images: skewTImage(analysis, units, context),
    },
    context.footerLocalLine,
  );
}
