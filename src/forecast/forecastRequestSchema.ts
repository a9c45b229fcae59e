import { z } from 'zod';
import type { ForecastLocation, ForecastWindow } from './forecastSource.ts';

const HOUR_MS = 3_600_000;
/** Longer than any source here can serve; guards against a typo asking for years of hours. */
export const MAX_WINDOW_HOURS = 384;

export const forecastLocationSchema = z.object({
  latitude: z.number().finite().min(-90).max(90),
  longitude: z.number().finite().min(-180).max(180),
  elevationM: z.number().finite().min(-500).max(9000).optional(),
  name: z.string().max(200).optional(),
});

export const forecastWindowSchema = z.object({
  startTime: z.iso.datetime({ offset: true }),
  hours: z.number().int().min(1).max(MAX_WINDOW_HOURS),
});

export interface CheckedWindow {
  /** First valid hour, floored to the hour, epoch ms. */
  startMs: number;
  hours: number;
  /** Every valid hour of the window, epoch ms. */
  validTimesMs: number[];
}

export type CheckedRequest = { ok: true; window: CheckedWindow } | { ok: false; reason: string };

/**
 * Checks a location and a window at the source's door. The reason says what is wrong, where, and
 * shows a correct example, so the caller can pass it on unchanged.
 */
export function checkForecastRequest(location: ForecastLocation, window: ForecastWindow): CheckedRequest {
  const locationCheck = forecastLocationSchema.safeParse(location);
  if (!locationCheck.success) {
    const issue = locationCheck.error.issues[0];
    return {
      ok: false,
      reason: `the location is not usable (${issue.path.join('.') || 'location'}: ${issue.message}); give latitude -90..90 and longitude -180..180 in decimal degrees, e.g. { latitude: 43.62, longitude: -115.48 }`,
    };
  }
  const windowCheck = forecastWindowSchema.safeParse(window);
  if (!windowCheck.success) {
    const issue = windowCheck.error.issues[0];
    return {
      ok: false,
      reason: `the time window is not usable (${issue.path.join('.') || 'window'}: ${issue.message}); give an ISO 8601 instant and a whole number of hours 1..${MAX_WINDOW_HOURS}, e.g. { startTime: "2026-08-14T12:00:00Z", hours: 48 }`,
    };
  }
  const startMs = Math.floor(Date.parse(window.startTime) / HOUR_MS) * HOUR_MS;
  const validTimesMs = Array.from({ length: window.hours }, (_, index) => startMs + index * HOUR_MS);
  return { ok: true, window: { startMs, hours: window.hours, validTimesMs } };
}

/** "2026-08-14T21:00:00Z": the instant format every profile's validTime uses. */
export function isoHour(epochMs: number): string {
  return new Date(epochMs).toISOString().replace('.000Z', 'Z');
}
