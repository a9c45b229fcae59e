import type { LevelInput, ProfileInput, PreparedProfile } from './profile.ts';
import { potentialTemperatureK } from './thermo/potentialTemperature.ts';

export type PreparedProfileResult = { ok: true; profile: PreparedProfile } | { ok: false; errors: string[] };

/** Rounding in providers' dew points (from RH) can put Td a hair above T; beyond this it is an error. */
const DEWPOINT_ROUNDING_TOLERANCE_C = 0.05;
/** A level this close above the ground gives a meaningless lapse rate against the 2 m temperature. */
const MIN_LEVEL_HEIGHT_ABOVE_GROUND_M = 10;
const MIN_USABLE_LEVELS = 3;

const SURFACE_FIELDS = ['pressureHpa', 'elevationM', 'temperatureC', 'dewpointC', 'windDirDeg', 'windSpeedMs'] as const;
const LEVEL_FIELDS = ['pressureHpa', 'heightM', 'temperatureC', 'dewpointC', 'windDirDeg', 'windSpeedMs'] as const;

/**
 * Quality control and intake of a profile: sorts levels by pressure, drops levels under the ground
 * (pressure at or above the surface pressure: models extrapolate them and they are not air), computes
 * heights above ground and θ. Any fault in the air that is left is an error naming the level, the
 * field and why; a profile with errors yields no numbers. Runs once per forecast hour, so it builds
 * no strings unless something is wrong.
 */
export function prepareProfile(input: ProfileInput): PreparedProfileResult {
  const errors: string[] = [];
  const surface = input.surface;
  if (!surface) {
    return { ok: false, errors: ['missing surface: the profile needs a surface observation (pressureHpa, elevationM, temperatureC, dewpointC, windDirDeg, windSpeedMs)'] };
  }
  for (const field of SURFACE_FIELDS) {
    if (!isFiniteNumber(surface[field])) errors.push(`surface: ${field} is ${describeValue(surface[field])}; it must be a finite number`);
  }
  const levels = input.levels ?? [];
  for (let index = 0; index < levels.length; index++) {
    const level = levels[index];
    for (const field of LEVEL_FIELDS) {
      if (!isFiniteNumber(level[field])) errors.push(`level ${index} (${level.pressureHpa} hPa): ${field} is ${describeValue(level[field])}; it must be a finite number`);
    }
  }
  if (errors.length > 0) return { ok: false, errors };

  const aboveGround: LevelInput[] = [];
  for (const level of levels) {
    if (level.pressureHpa >= surface.pressureHpa) continue;
    // A level just above the ground is dropped; one at or below the ground's height is kept so the
    // height check below reports it.
    const heightAboveGroundM = level.heightM - surface.elevationM;
    if (heightAboveGroundM > 0 && heightAboveGroundM < MIN_LEVEL_HEIGHT_ABOVE_GROUND_M) continue;
    aboveGround.push(level);
  }
  aboveGround.sort((a, b) => b.pressureHpa - a.pressureHpa);

  const count = aboveGround.length + 1;
  const label = (index: number) => (index === 0 ? 'surface' : `level at ${aboveGround[index - 1].pressureHpa} hPa`);
  const pressureAt = (index: number) => (index === 0 ? surface.pressureHpa : aboveGround[index - 1].pressureHpa);
  const heightAt = (index: number) => (index === 0 ? surface.elevationM : aboveGround[index - 1].heightM);
  for (let index = 0; index < count; index++) {
    const temperatureC = index === 0 ? surface.temperatureC : aboveGround[index - 1].temperatureC;
    const dewpointC = index === 0 ? surface.dewpointC : aboveGround[index - 1].dewpointC;
    if (dewpointC > temperatureC + DEWPOINT_ROUNDING_TOLERANCE_C) {
      errors.push(`${label(index)}: dewpointC ${dewpointC} °C is above temperatureC ${temperatureC} °C; a dew point cannot exceed the temperature`);
    }
    if (index === 0) continue;
    if (pressureAt(index) === pressureAt(index - 1)) {
      errors.push(`${label(index)}: pressure ${pressureAt(index)} hPa appears twice; each level needs its own pressure`);
    } else if (heightAt(index) <= heightAt(index - 1)) {
      errors.push(`${label(index)}: heightM ${heightAt(index)} m is not above the ${label(index - 1)} (${heightAt(index - 1)} m); height must increase as pressure falls`);
    }
  }
  if (count < MIN_USABLE_LEVELS) {
    errors.push(`only ${count} usable level(s) above the ground including the surface; at least ${MIN_USABLE_LEVELS} are needed (levels under the ground, with pressure at or above the surface pressure ${surface.pressureHpa} hPa, are dropped)`);
  }
  if (errors.length > 0) return { ok: false, errors };

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
  for (let index = 0; index < count; index++) {
    const level = index === 0 ? null : aboveGround[index - 1];
    const pressureHpa = level ? level.pressureHpa : surface.pressureHpa;
    const heightM = level ? level.heightM : surface.elevationM;
    const temperatureC = level ? level.temperatureC : surface.temperatureC;
    const dewpointC = level ? level.dewpointC : surface.dewpointC;
    const windSpeedMs = level ? level.windSpeedMs : surface.windSpeedMs;
    const directionRad = ((level ? level.windDirDeg : surface.windDirDeg) * Math.PI) / 180;
    profile.pressureHpa[index] = pressureHpa;
    profile.heightMslM[index] = heightM;
    profile.heightAglM[index] = heightM - surface.elevationM;
    profile.temperatureC[index] = temperatureC;
    profile.dewpointC[index] = Math.min(dewpointC, temperatureC);
    // Meteorological direction is where the wind comes from: a north wind (0°) blows toward −v.
    profile.windUMs[index] = -windSpeedMs * Math.sin(directionRad);
    profile.windVMs[index] = -windSpeedMs * Math.cos(directionRad);
    profile.thetaK[index] = potentialTemperatureK(temperatureC, pressureHpa);
  }
  return { ok: true, profile };
}

function isFiniteNumber(value: unknown): value is number {
  return typeof value === 'number' && Number.isFinite(value);
}

function describeValue(value: unknown): string {
  return value === undefined ? 'missing' : String(value);
}
