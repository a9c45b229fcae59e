import type { ForecastLocation, ForecastSeries } from '../forecast/forecastSource.ts';
import { forecastWindowFrom } from '../forecast/forecastWindowFrom.ts';
import { keepRecent } from '../keepRecent.ts';
import { assessSeries } from '../watch/assessSeries.ts';
import type { SeriesAssessment } from '../watch/seriesAssessment.ts';
import type { ResolvedPlace } from './resolvePlace.ts';
import type { HandlerContext } from './routerContext.ts';

export type AssessmentResult = { ok: true; series: SeriesAssessment } | { ok: false; error: string };


/**
 * A cached forecast comes back as the same series object to every channel that asks until the next
 * run, and assessing it is a pure function of it: assess it once. Every assessment keeps each
 * hour's full analysis (it is made anyway; keeping it costs memory, not time), so the detail view
 * of a place just looked up (its button) needs no second assessment. Those full assessments
 * (several times the series' own size) are held only for the few latest series; lookups get the
 * same assessment without the analyses, held exactly as long as their series, in a WeakMap.
 */
const lookupAssessments = new WeakMap<ForecastSeries, SeriesAssessment>();
const detailAssessments = new Map<ForecastSeries, SeriesAssessment>();
const MAX_DETAIL_ASSESSMENTS = 8;

/** The assessment as a lookup holds it: the same hours without their full analyses. */
function withoutAnalyses(assessment: SeriesAssessment): SeriesAssessment {
  return { ...assessment, hours: assessment.hours.map(({ analysis: _analysis, ...hour }) => hour) };
}

function detailAssessment(series: ForecastSeries): SeriesAssessment {
  const assessed = detailAssessments.get(series) ?? assessSeries(series, { keepAnalysis: true });
  keepRecent(detailAssessments, series, assessed, MAX_DETAIL_ASSESSMENTS);
  return assessed;
}

function assessOnce(series: ForecastSeries, keepAnalysis: boolean): SeriesAssessment {
  if (keepAnalysis) return detailAssessment(series);
  const known = lookupAssessments.get(series);
  if (known) return known;
  const assessed = withoutAnalyses(detailAssessment(series));
  lookupAssessments.set(series, assessed);
  return assessed;
}

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
  const result = await context.source.fetchSeries(location, forecastWindowFrom(options.startMs ?? context.nowMs(), context.forecastHours));
  if (!result.ok) return { ok: false, error: `No forecast for ${place.displayName}: ${result.error.message} Nothing is assumed; try again shortly.` };
  return { ok: true, series: assessOnce(result.series, options.keepAnalysis) };
}
