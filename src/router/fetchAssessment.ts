import type { ForecastLocation } from '../forecast/forecastSource.ts';
import { assessSeries } from '../watch/assessSeries.ts';
import type { SeriesAssessment } from '../watch/seriesAssessment.ts';
import type { ResolvedPlace } from './resolvePlace.ts';
import type { HandlerContext } from './routerContext.ts';

export type AssessmentResult = { ok: true; series: SeriesAssessment } | { ok: false; error: string };

const HOUR_MS = 3_600_000;

/**
 * The next hours of forecast for a place, assessed. A failure of the source is an error a person can
 * read, never an empty series that could pass for an all-clear.
 */
export async function fetchAssessment(
  context: Pick<HandlerContext, 'source' | 'forecastHours' | 'nowMs'>,
  place: ResolvedPlace,
  options: { keepAnalysis: boolean; startMs?: number },
): Promise<AssessmentResult> {
  const location: ForecastLocation = {
    latitude: place.latitudeDeg,
    longitude: place.longitudeDeg,
    name: place.displayName,
    ...(place.elevationM === null ? {} : { elevationM: place.elevationM }),
  };
  const startMs = Math.floor((options.startMs ?? context.nowMs()) / HOUR_MS) * HOUR_MS;
  const result = await context.source.fetchSeries(location, { startTime: new Date(startMs).toISOString(), hours: context.forecastHours });
  if (!result.ok) return { ok: false, error: `No forecast for ${place.displayName}: ${result.error.message} Nothing is assumed; try again shortly.` };
  return { ok: true, series: assessSeries(result.series, { keepAnalysis: options.keepAnalysis }) };
}
