import type { ForecastLocation } from './forecastSource.ts';

/** "43.620, -115.480 (Kestrel Bench ICP)": how every forecast message names a place. */
export function describeLocation(location: ForecastLocation): string {
  const latitude = Number.isFinite(location.latitude) ? location.latitude.toFixed(3) : String(location.latitude);
  const longitude = Number.isFinite(location.longitude) ? location.longitude.toFixed(3) : String(location.longitude);
  return location.name ? `${latitude}, ${longitude} (${location.name})` : `${latitude}, ${longitude}`;
}
