import type { ForecastWindow } from './forecastSource.ts';

const HOUR_MS = 3_600_000;

/** The window every caller asks for: `hours` hourly profiles from the hour that contains `nowMs`. */
export function forecastWindowFrom(nowMs: number, hours: number): ForecastWindow {
  return { startTime: new Date(Math.floor(nowMs / HOUR_MS) * HOUR_MS).toISOString(), hours };
}
