import { z } from 'zod';
import { locationKeyOf } from '../store/storeKeys.ts';

/**
 * Button values, written here and parsed back by the router. Kept short: Discord's custom_id
 * holds 100 characters in all.
 *   show-detail: "LAT,LON|VALID_TIME"   e.g. "44.8123,-115.4321|2026-08-14T21:00:00Z"
 *   mute-rule:   "RULE_ID|PLACE_KEY"    e.g. "mixing-reaches-dry-layer|44.8123,-115.4321"
 */
/** A place's key: its point to four decimals (about 11 m), the same key the store gives the place. */
export function placeKeyOf(latitude: number, longitude: number): string {
  return locationKeyOf(latitude, longitude);
}

export function encodeDetailValue(latitude: number, longitude: number, validTime: string): string {
  return `${placeKeyOf(latitude, longitude)}|${validTime}`;
}

export function encodeMuteValue(ruleId: string, placeKey: string): string {
  return `${ruleId}|${placeKey}`;
}

export type ParsedValue<T> = { ok: true; value: T } | { ok: false; message: string };

const detailValueSchema = z
  .string()
  .regex(/^-?\d+(\.\d+)?,-?\d+(\.\d+)?\|\S+$/, 'expected "LAT,LON|VALID_TIME", e.g. "44.8123,-115.4321|2026-08-14T21:00:00Z"')
  .transform((text) => {
    const [point, validTime] = text.split('|');
    const [latitude, longitude] = point.split(',').map(Number);
    return { latitude, longitude, validTime };
  })
  .pipe(
    z.object({
      latitude: z.number().min(-90).max(90),
      longitude: z.number().min(-180).max(180),
      validTime: z.iso.datetime({ offset: true }),
    }),
  );

const muteValueSchema = z
  .string()
  .regex(/^[a-z0-9-]+\|\S+$/, 'expected "RULE_ID|PLACE_KEY", e.g. "mixing-reaches-dry-layer|44.8123,-115.4321"')
  .transform((text) => {
    const cut = text.indexOf('|');
    return { ruleId: text.slice(0, cut), placeKey: text.slice(cut + 1) };
  });

function describe(error: z.ZodError, what: string, raw: string): string {
  return `The ${what} button value "${raw.slice(0, 120)}" is not valid: ${error.issues.map((issue) => issue.message).join('; ')}.`;
}

export function parseDetailValue(raw: string): ParsedValue<{ latitude: number; longitude: number; validTime: string }> {
  const parsed = detailValueSchema.safeParse(raw);
  return parsed.success ? { ok: true, value: parsed.data } : { ok: false, message: describe(parsed.error, 'show-detail', raw) };
}

export function parseMuteValue(raw: string): ParsedValue<{ ruleId: string; placeKey: string }> {
  const parsed = muteValueSchema.safeParse(raw);
  return parsed.success ? { ok: true, value: parsed.data } : { ok: false, message: describe(parsed.error, 'mute-rule', raw) };
}
