import { describeLocation } from './describeLocation.ts';
import type { ForecastErrorKind, ForecastLocation, ForecastResult } from './forecastSource.ts';

/**
 * A failed forecast as a value. The message always starts with the source and the place so that a
 * person reading it in a channel knows which forecast is missing, then says why.
 */
export function forecastFailure(
  kind: ForecastErrorKind,
  sourceName: string,
  location: ForecastLocation,
  cause: string,
): ForecastResult & { ok: false } {
  return {
    ok: false,
    error: { kind, location, message: `${sourceName} forecast for ${describeLocation(location)} failed: ${cause}` },
  };
}
