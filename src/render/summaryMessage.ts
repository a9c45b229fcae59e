import type { DaySummary, HourAssessment, SeriesAssessment } from '../watch/seriesAssessment.ts';
import { formatLocalDate, formatLocalHour } from './localTime.ts';
import { hainesValueText } from './hainesWording.ts';
import { chartImage, couplingLine, detailAction, plumeCloudField } from './lookupMessage.ts';
import type { Message, MessageField } from './message.ts';
import { placeLabel } from './placeLabel.ts';
import type { RenderOptions } from './renderOptions.ts';
import { buildMessage } from './safetyFooter.ts';
import { sourceLine } from './sourceLine.ts';
import { formatHdw, formatHeightAgl, formatPft, formatRelativeHumidity, formatWindSpeed, type UnitSystem } from './units.ts';

export interface SummaryOptions extends RenderOptions {
  /** Local date to summarise, YYYY-MM-DD; the series' first day when absent. */
  localDate?: string;
}

/** The day's figures from its DaySummary; plume cloud and Haines from the day's hours. */
function dayFields(day: DaySummary, hours: HourAssessment[], timeZone: string, units: UnitSystem): MessageField[] {
  const at = (localTime: string): string => formatLocalHour(localTime, timeZone);
  const haines = hours.reduce((best, hour) => (hour.hainesTotal > best.hainesTotal ? hour : best));
  return [
    { label: 'Peak mixing height', value: `${formatHeightAgl(day.peakMixingHeightAglM, units)}, ${at(day.peakMixingHour)}` },
    { label: 'Strongest transport wind', value: `${formatWindSpeed(day.maxTransportWindMs, units)}, ${at(day.windiestHour)}` },
    { label: 'Driest mixed layer', value: `${formatRelativeHumidity(day.minMixedLayerRelativeHumidityPct)} RH, ${at(day.driestHour)}` },
    { label: 'Hot-Dry-Windy Index (max)', value: `${formatHdw(day.maxHdw)}, ${at(day.maxHdwHour)}` },
    plumeCloudField(hours, timeZone, units),
    {
      label: 'PyroCb Firepower Threshold (lowest)',
      value: day.minPftGw !== null && day.minPftHour !== null ? `${formatPft(day.minPftGw)}, ${at(day.minPftHour)}` : formatPft(null),
    },
    { label: 'Haines Index (max)', value: `${hainesValueText(haines.hainesTotal, haines.hainesVariant)}, ${at(haines.validTime)}` },
  ];
}

/**
 * The morning summary: one local day's figures in a few lines, the coupling hour first, and the
 * 48-hour chart for context.
 */
export function buildMorningSummary(series: SeriesAssessment, units: UnitSystem, options: SummaryOptions = {}): Message {
  const place = placeLabel(series.location);
  const day = options.localDate ? series.days.find((candidate) => candidate.localDate === options.localDate) : series.days[0];
  const hours = day ? series.hours.filter((hour) => hour.localTime.slice(0, 10) === day.localDate) : [];
  if (!day || hours.length === 0) {
    const wanted = options.localDate ?? 'today';
    return buildMessage(
      {
        kind: 'notice',
        title: `${place}: no forecast for ${wanted}`,
        sections: [{ lines: [`The forecast from ${series.sourceName} has no hours for ${wanted}; the summary will come with the next model run.`] }],
        inventedData: series.invented,
      },
      options.footerLocalLine,
    );
  }
  const coupled = hours.find((hour) => hour.coupled);
  const peak = hours.find((hour) => hour.localTime === day.peakMixingHour) ?? hours[0];
  const focus = coupled ?? peak;
  return buildMessage(
    {
      kind: 'summary',
      title: `Morning summary: ${place}, ${formatLocalDate(day.localDate)}`,
      severity: coupled ? 'warning' : 'info',
      inventedData: series.invented,
      sections: [
        { lines: [couplingLine(hours, series.timeZone, units, 'today')], fields: dayFields(day, hours, series.timeZone, units) },
        { lines: [sourceLine(series.model, series.runTime, series.sourceName, series.invented)] },
      ],
      images: chartImage(series, units, options),
      actions: [detailAction(series, focus)],
    },
    options.footerLocalLine,
  );
}
