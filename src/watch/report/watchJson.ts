import { INVENTED_DATA_NOTE } from '../../render/inventedDataNote.ts';
import { SAFETY_FOOTER } from '../../render/safetyFooter.ts';
import type { WatchReport } from './watchMessage.ts';

/**
 * The watch as one JSON object: the series (hours without their full analyses), gaps, day
 * summaries, crossings and the rules used; the invented-data note when it applies and the safety
 * footer, last.
 */
export function watchJson(report: WatchReport): Record<string, unknown> {
  const { series } = report;
  return {
    command: 'watch',
    ...(series.invented ? { inventedDataNote: INVENTED_DATA_NOTE } : {}),
    location: series.location,
    timeZone: series.timeZone,
    source: { name: series.sourceName, model: series.model, runTime: series.runTime, invented: series.invented, notes: report.sourceNotes },
    hours: series.hours.map(({ analysis: _analysis, ...hour }) => hour),
    gaps: series.gaps ?? [],
    days: series.days,
    crossings: report.crossings,
    rules: report.rules,
    safetyFooter: SAFETY_FOOTER,
  };
}
