import { z } from 'zod';

/**
 * The profile file contract (JSON form), with the physical ranges a real profile can have. A value
 * outside them is a typo or a unit mix-up (Kelvin for Celsius, Pa for hPa), so it is refused with
 * the field named rather than analysed.
 */
const finite = (min: number, max: number, what: string) =>
  z
    .number({ error: `must be a number (${what})` })
    .refine(Number.isFinite, { message: `must be a finite number (${what})` })
    .refine((value) => value >= min && value <= max, {
      message: `must be between ${min} and ${max} (${what})`,
    });

const pressureHpa = finite(10, 1100, 'hPa');
const temperatureC = finite(-100, 60, '°C');
const dewpointC = finite(-130, 60, '°C');
const windDirDeg = finite(0, 360, 'degrees from which the wind blows');
const windSpeedMs = finite(0, 150, 'm/s');

export const surfaceSchema = z.object({
  pressureHpa,
  elevationM: finite(-500, 9000, 'm above sea level'),
  temperatureC,
  dewpointC,
  windDirDeg,
  windSpeedMs,
});

export const levelSchema = z.object({
  pressureHpa,
  heightM: finite(-1000, 40000, 'geopotential m above sea level'),
  temperatureC,
  dewpointC,
  windDirDeg,
  windSpeedMs,
});

export const profileSchema = z.object({
  name: z.string().min(1).max(200).default('profile'),
  validTime: z.string().min(1).max(64),
  latitude: finite(-90, 90, 'degrees north').nullable().default(null),
  longitude: finite(-180, 180, 'degrees east').nullable().default(null),
  surface: surfaceSchema,
  levels: z.array(levelSchema).min(2, { message: 'needs at least 2 pressure levels above the surface' }),
});

/** A zod issue path as a person reads it: levels[3].dewpointC. */
export function describeIssuePath(path: readonly PropertyKey[]): string {
  return path
    .map((part, index) => (typeof part === 'number' ? `[${part}]` : index === 0 ? String(part) : `.${String(part)}`))
    .join('');
}
