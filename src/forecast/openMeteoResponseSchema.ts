import { z } from 'zod';

/**
 * One location's answer from /v1/forecast (open-meteo.com/en/docs, "API Response"): grid-cell
 * coordinates, terrain elevation, the unit of every hourly variable, and arrays of hourly values in
 * which a missing value is null. With several coordinates the body is a JSON list of these.
 */
export const openMeteoLocationSchema = z.object({
  latitude: z.number(),
  longitude: z.number(),
  elevation: z.number(),
  utc_offset_seconds: z.number().optional(),
  timezone: z.string().optional(),
  hourly_units: z.record(z.string(), z.string()),
  hourly: z
    .object({ time: z.array(z.number().int()) })
    .catchall(z.array(z.number().nullable())),
});

export type OpenMeteoLocationResponse = z.output<typeof openMeteoLocationSchema>;

/** The documented error body: {"error": true, "reason": "..."}. */
export const openMeteoErrorSchema = z.object({ error: z.literal(true), reason: z.string() });
