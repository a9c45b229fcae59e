import type { ForecastLocation } from '../forecast/forecastSource.ts';
import type { Watch } from '../store/storeTypes.ts';

/** What the forecast source is asked for a watched point: its own elevation and name when known. */
export function watchLocation(watch: Watch): ForecastLocation {
  return {
    latitude: watch.latitudeDeg,
    longitude: watch.longitudeDeg,
    ...(watch.elevationM !== null ? { elevationM: watch.elevationM } : {}),
    ...(watch.placeName !== null ? { name: watch.placeName } : {}),
  };
}
