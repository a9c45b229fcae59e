import type { ForecastLocation, ForecastResult, ForecastSource, ForecastWindow } from '../forecast/forecastSource.ts';
import { timeProviderRequest } from '../observability/processMetrics.ts';

/**
 * Times every request that reaches the provider and counts its failures by kind, for /metrics. It
 * wraps the source behind the cache, so cache hits are not counted as provider requests.
 */
export function instrumentedSource(inner: ForecastSource): ForecastSource {
  const firstFailureKind = (results: ForecastResult[]) => results.find((result) => !result.ok)?.error.kind ?? null;
  return {
    name: inner.name,
    fetchSeries: (location: ForecastLocation, window: ForecastWindow) =>
      timeProviderRequest(inner.name, () => inner.fetchSeries(location, window), (result) => (result.ok ? null : result.error.kind)),
    fetchMany: (locations: ForecastLocation[], window: ForecastWindow) =>
      timeProviderRequest(inner.name, () => inner.fetchMany(locations, window), firstFailureKind),
    // Not timed: a metadata probe, not a forecast request.
    ...(inner.latestRunTime ? { latestRunTime: () => inner.latestRunTime!() } : {}),
  };
}
