import tzLookup from 'tz-lookup';

/**
 * The IANA time zone of a point, looked up offline from latitude and longitude (tz-lookup), so a
 * day summary's "day" is the day people at the fire live in. Out at sea or for a point the table
 * cannot place, the lookup falls back to UTC, which every local time then shows in its offset.
 */
export function timeZoneAt(latitude: number, longitude: number): string {
  try {
    return tzLookup(latitude, longitude);
  } catch {
    return 'UTC';
  }
}
