/**
 * zod schemas for what callers hand the store. The store is a boundary: a bad value is refused
 * with a message naming the field before anything is written.
 */
import { z } from 'zod';
import { StoreError } from './storeError.ts';

export const platformSchema = z.enum(['slack', 'discord', 'terminal']);
export const unitSystemSchema = z.enum(['metric', 'us']);

export const channelTargetSchema = z.object({
  platform: platformSchema,
  teamId: z.string().max(200),
  channelId: z.string().min(1).max(200),
});

export const localTimeSchema = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'must be HH:MM, 00:00 to 23:59');
export const localDateSchema = z
  .string()
  .regex(/^\d{4}-(0[1-9]|1[0-2])-(0[1-9]|[12]\d|3[01])$/, 'must be a date YYYY-MM-DD');

export const epochMsSchema = z.number().int().nonnegative().max(8.64e15);
export const idSchema = z.string().min(1).max(200);
export const ruleIdSchema = z.string().trim().min(1).max(100);
export const locationKeySchema = z.string().min(1).max(200);

export const latitudeSchema = z.number().finite().min(-90).max(90);
export const longitudeSchema = z.number().finite().min(-180).max(180);
export const elevationSchema = z.number().finite().min(-500).max(9000).nullable().optional();
export const timeZoneSchema = z
  .string()
  .min(1)
  .max(64)
  .refine(isKnownTimeZone, 'is not a known IANA time zone')
  .nullable()
  .optional();

export const placeNameSchema = z.string().trim().min(1, 'must not be empty').max(80);

export const newSavedPlaceSchema = z.object({
  name: placeNameSchema,
  latitudeDeg: latitudeSchema,
  longitudeDeg: longitudeSchema,
  elevationM: elevationSchema,
  timeZone: timeZoneSchema,
});

export const newWatchSchema = z.object({
  placeName: placeNameSchema.nullable().optional(),
  latitudeDeg: latitudeSchema,
  longitudeDeg: longitudeSchema,
  elevationM: elevationSchema,
  timeZone: timeZoneSchema,
  createdBy: z.string().min(1).max(200),
});

export const crossingSchema = z.object({
  locationKey: locationKeySchema,
  ruleId: ruleIdSchema,
  validLocalDay: localDateSchema,
  direction: z.enum(['up', 'down']),
  validTime: z.iso.datetime({ offset: true }),
  value: z.number().finite(),
  effectiveDepthM: z.number().finite().nullable(),
});

export const outboxKindSchema = z.enum(['alert', 'summary', 'notice']);

/** Validates `value`, or throws 'invalid-input' naming `what` and each bad field. */
export function parseInput<T>(schema: z.ZodType<T>, value: unknown, what: string): T {
  const result = schema.safeParse(value);
  if (result.success) return result.data;
  const problems = result.error.issues
    .map((issue) => `${issue.path.length > 0 ? issue.path.join('.') : 'value'} ${issue.message}`)
    .join('; ');
  throw new StoreError('invalid-input', `${what}: ${problems}`);
}

/** A payload becomes JSON text here; anything JSON cannot carry is refused now, not at send time. */
export function payloadToJson(payload: unknown, what: string): string {
  let text: string | undefined;
  try {
    text = JSON.stringify(payload);
  } catch (error) {
    throw new StoreError('invalid-input', `${what}: payload is not JSON-serialisable (${String(error)})`);
  }
  if (text === undefined) throw new StoreError('invalid-input', `${what}: payload is missing or not JSON-serialisable`);
  return text;
}

function isKnownTimeZone(zone: string): boolean {
  try {
    new Intl.DateTimeFormat('en', { timeZone: zone });
    return true;
  } catch {
    return false;
  }
}
