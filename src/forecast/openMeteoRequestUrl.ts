import type { OpenMeteoConfig } from './openMeteoConfig.ts';
import { hourlyVariableNames } from './openMeteoVariables.ts';
import type { ForecastLocation } from './forecastSource.ts';

const HOUR_MS = 3_600_000;

/** "2026-08-14T21:00": the start_hour/end_hour format the API documents (yyyy-mm-ddThh:mm, GMT here). */
function apiHour(epochMs: number): string {
  return new Date(epochMs).toISOString().slice(0, 16);
}

/**
 * The /v1/forecast URL for one or more locations (comma-separated coordinates, documented) and a
 * window of whole hours. Winds are asked in m/s and times as unix seconds in GMT, so that nothing
 * but the level values needs reading.
 */
export function openMeteoForecastUrl(
  config: OpenMeteoConfig,
  locations: readonly ForecastLocation[],
  startMs: number,
  hours: number,
): string {
  const url = new URL('/v1/forecast', config.baseUrl);
  const params = url.searchParams;
  params.set('latitude', locations.map((location) => String(location.latitude)).join(','));
  params.set('longitude', locations.map((location) => String(location.longitude)).join(','));
  // A user-given terrain height steers the provider's downscaling; otherwise its own 90 m terrain model.
  if (locations.every((location) => location.elevationM !== undefined)) {
    params.set('elevation', locations.map((location) => String(location.elevationM)).join(','));
  }
  params.set('hourly', hourlyVariableNames(config.pressureLevelsHpa).join(','));
  params.set('models', config.model);
  params.set('wind_speed_unit', 'ms');
  params.set('temperature_unit', 'celsius');
  params.set('timeformat', 'unixtime');
  params.set('timezone', 'GMT');
  params.set('start_hour', apiHour(startMs));
  params.set('end_hour', apiHour(startMs + (hours - 1) * HOUR_MS));
  return url.toString();
}
