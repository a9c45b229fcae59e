import { analyzeProfile } from '../core/analyzeProfile.ts';
import { prepareProfile } from '../core/prepareProfile.ts';
import type { ForecastSeries } from '../forecast/forecastSource.ts';
import { summarizeDays } from './daySummaries.ts';
import { markCouplingAloft } from './dryLayerAloft.ts';
import { hourFromAnalysis } from './hourFromAnalysis.ts';
import type { HourAssessment, HourGap, SeriesAssessment } from './seriesAssessment.ts';
import { localClock } from './time/localClock.ts';
import { timeZoneAt } from '../geo/timeZoneAt.ts';

const HOUR_MS = 3_600_000;
/** Caps the gap list when a source leaves out a long stretch (a gap list longer than a forecast helps no one). */
const MAX_REPORTED_GAPS = 400;

export interface AssessSeriesOptions {
  /** Keep each hour's full AnalysisResult (for the detail view); off by default to keep a series small. */
  keepAnalysis?: boolean;
  /** Lift parcels with the virtual temperature correction (default true, as analyzeProfile). */
  virtualTemperature?: boolean;
}

/**
 * Runs the core over every forecast hour: quality control, then the full analysis, reduced to what
 * the watch needs. An hour that fails quality control becomes a gap with its reasons; it is never
 * dropped, so a hole in the forecast cannot read as an all-clear. Hours come out in time order.
 */
export function assessSeries(series: ForecastSeries, options: AssessSeriesOptions = {}): SeriesAssessment {
  const keepAnalysis = options.keepAnalysis ?? false;
  const virtualTemperature = options.virtualTemperature ?? true;
  const timeZone = timeZoneAt(series.location.latitude, series.location.longitude);
  const toLocal = localClock(timeZone);

  const ordered = series.profiles.map((input) => ({ input, validMs: Date.parse(input.validTime) })).sort((a, b) => a.validMs - b.validMs);
  const hours: HourAssessment[] = [];
  const gaps: HourGap[] = [];
  let previousMs = Number.NaN;
  for (const { input, validMs } of ordered) {
    // Series are hourly: an hour the source left out is a gap too, not a quiet hour.
    for (let missingMs = previousMs + HOUR_MS; validMs - missingMs >= HOUR_MS && gaps.length < MAX_REPORTED_GAPS; missingMs += HOUR_MS) {
      const validTime = new Date(missingMs).toISOString().replace('.000Z', 'Z');
      gaps.push({ validTime, localTime: toLocal(validTime), reasons: ['the source supplied no profile for this hour'] });
    }
    previousMs = validMs;
    const localTime = toLocal(input.validTime);
    const prepared = prepareProfile(input);
    if (!prepared.ok) {
      gaps.push({ validTime: input.validTime, localTime, reasons: prepared.errors });
      continue;
    }
    const analysis = analyzeProfile(prepared.profile, { virtualTemperature });
    hours.push(hourFromAnalysis(analysis, localTime, keepAnalysis));
  }

  const firstElevationM = ordered.find(({ input }) => Number.isFinite(input.surface?.elevationM))?.input.surface.elevationM;
  markCouplingAloft(hours);
  gaps.sort((a, b) => Date.parse(a.validTime) - Date.parse(b.validTime));
  return {
    location: {
      latitude: series.location.latitude,
      longitude: series.location.longitude,
      elevationM: series.location.elevationM ?? firstElevationM ?? Number.NaN,
      ...(series.location.name !== undefined ? { name: series.location.name } : {}),
    },
    timeZone,
    sourceName: series.sourceName,
    model: series.model,
    runTime: series.runTime,
    invented: series.invented,
    hours,
    gaps,
    days: summarizeDays(hours, gaps),
  };
}
