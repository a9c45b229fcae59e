import type { ProfileInput, PreparedProfile } from './profile.ts';
import { potentialTemperatureK } from './thermo/potentialTemperature.ts';

export type PreparedProfileResult = { ok: true; profile: PreparedProfile } | { ok: false; errors: string[] };

/** Rounding in providers' dew points (from RH) can put Td a hair above T; beyond this it is an error. */
const DEWPOINT_ROUNDING_TOLERANCE_C = 0.05;
/** A level this close above the ground gives a meaningless lapse rate against the 2 m temperature. */
const MIN_LEVEL_HEIGHT_ABOVE_GROUND_M = 10;
const MIN_USABLE_LEVELS = 3;

/**
 * Quality control and intake of a profile: sorts levels by pressure, drops levels under the ground
 * (pressure at or above the surface pressure: models extrapolate them and they are not air), computes
 * heights above ground and θ. Any fault in the air that is left is an error naming the level, the
 * field and why; a profile with errors yields no numbers.
 */
export function prepareProfile(input: ProfileInput): PreparedProfileResult {
  const errors: string[] = [];
  const surface = input.surface;
  if (!surface) return { ok: false, errors: ['missing surface: the profile needs a surface observation (pressureHpa, elevationM, temperatureC, dewpointC, windDirDeg, windSpeedMs)'] };
  checkFinite(errors, 'surface', surface as unknown as Record<string, number>, ['pressureHpa', 'elevationM', 'temperatureC', 'dewpointC', 'windDirDeg', 'windSpeedMs']);
  input.levels.forEach((level, index) =>
    checkFinite(errors, `level ${index} (${level.pressureHpa} hPa)`, level as unknown as Record<string, number>, ['pressureHpa', 'heightM', 'temperatureC', 'dewpointC', 'windDirDeg', 'windSpeedMs']),
  );
  if (errors.length > 0) return { ok: false, errors };

  const aboveGround = input.levels
    .filter((level) => level.pressureHpa < surface.pressureHpa)
    .sort((a, b) => b.pressureHpa - a.pressureHpa)
    .filter((level) => level.heightM - surface.elevationM >= MIN_LEVEL_HEIGHT_ABOVE_GROUND_M || level.heightM <= surface.elevationM);

  const rows = [
    { label: 'surface', pressureHpa: surface.pressureHpa, heightM: surface.elevationM, temperatureC: surface.temperatureC, dewpointC: surface.dewpointC, windDirDeg: surface.windDirDeg, windSpeedMs: surface.windSpeedMs },
    ...aboveGround.map((level) => ({ label: `level at ${level.pressureHpa} hPa`, ...level })),
  ];

  for (let index = 0; index < rows.length; index++) {
    const row = rows[index];
    if (row.dewpointC > row.temperatureC + DEWPOINT_ROUNDING_TOLERANCE_C) {
      errors.push(`${row.label}: dewpointC ${row.dewpointC} °C is above temperatureC ${row.temperatureC} °C; a dew point cannot exceed the temperature`);
    }
    if (index > 0) {
      const below = rows[index - 1];
      if (row.pressureHpa === below.pressureHpa) {
        errors.push(`${row.label}: pressure ${row.pressureHpa} hPa appears twice; each level needs its own pressure`);
      } else if (row.heightM <= below.heightM) {
        errors.push(`${row.label}: heightM ${row.heightM} m is not above the ${below.label} (${below.heightM} m); height must increase as pressure falls`);
      }
    }
  }
  if (rows.length < MIN_USABLE_LEVELS) {
    errors.push(`only ${rows.length} usable level(s) above the ground including the surface; at least ${MIN_USABLE_LEVELS} are needed (levels under the ground, with pressure at or above the surface pressure ${surface.pressureHpa} hPa, are dropped)`);
  }
  if (errors.length > 0) return { ok: false, errors };

  const count = rows.length;
  const profile: PreparedProfile = {
    name: input.name,
    validTime: input.validTime,
    latitude: input.latitude,
    longitude: input.longitude,
    elevationM: surface.elevationM,
    pressureHpa: new Float64Array(count),
    heightMslM: new Float64Array(count),
    heightAglM: new Float64Array(count),
    temperatureC: new Float64Array(count),
    dewpointC: new Float64Array(count),
    windUMs: new Float64Array(count),
    windVMs: new Float64Array(count),
    thetaK: new Float64Array(count),
  };
  rows.forEach((row, index) => {
    const directionRad = (row.windDirDeg * Math.PI) / 180;
    profile.pressureHpa[index] = row.pressureHpa;
    profile.heightMslM[index] = row.heightM;
    profile.heightAglM[index] = row.heightM - surface.elevationM;
    profile.temperatureC[index] = row.temperatureC;
    profile.dewpointC[index] = Math.min(row.dewpointC, row.temperatureC);
    // Meteorological direction is where the wind comes from: a north wind (0°) blows toward −v.
    profile.windUMs[index] = -row.windSpeedMs * Math.sin(directionRad);
    profile.windVMs[index] = -row.windSpeedMs * Math.cos(directionRad);
    profile.thetaK[index] = potentialTemperatureK(row.temperatureC, row.pressureHpa);
  });
  return { ok: true, profile };
}

function checkFinite(errors: string[], label: string, record: Record<string, number>, fields: string[]): void {
  for (const field of fields) {
    const value = record[field];
    if (typeof value !== 'number' || !Number.isFinite(value)) {
      errors.push(`${label}: ${field} is ${value === undefined ? 'missing' : String(value)}; it must be a finite number`);
    }
  }
}
