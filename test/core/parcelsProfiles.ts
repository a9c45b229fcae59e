/**
 * Invented profiles for the parcel and index tests and the benchmark (demo data, not observations).
 * Heights are built with the hypsometric equation from the virtual temperature, so that the
 * profile is hydrostatically consistent and height-based and ln p-based integrals agree.
 */
import { DRY_AIR_GAS_CONSTANT_JKGK, GRAVITY_MS2, ZERO_CELSIUS_K } from '../../src/core/constants.ts';
import { prepareProfile } from '../../src/core/prepareProfile.ts';
import type { LevelInput, PreparedProfile, ProfileInput } from '../../src/core/profile.ts';
import { virtualTemperatureK } from '../../src/core/thermo/potentialTemperature.ts';
import { mixingRatioKgKg } from '../../src/core/thermo/vapour.ts';

export interface ColumnPoint {
  pressureHpa: number;
  temperatureC: number;
  dewpointC: number;
  windDirDeg?: number;
  windSpeedMs?: number;
}

/** A ProfileInput from a surface point and levels, heights integrated hypsometrically from elevationM. */
export function profileInputFromColumn(surface: ColumnPoint, levels: ColumnPoint[], elevationM = 0, name = 'invented'): ProfileInput {
  const all = [surface, ...levels];
  const heights = [elevationM];
  for (let i = 1; i < all.length; i++) {
    const a = all[i - 1];
    const b = all[i];
    const tva = virtualTemperatureK(a.temperatureC + ZERO_CELSIUS_K, mixingRatioKgKg(a.dewpointC, a.pressureHpa));
    const tvb = virtualTemperatureK(b.temperatureC + ZERO_CELSIUS_K, mixingRatioKgKg(b.dewpointC, b.pressureHpa));
    heights.push(heights[i - 1] + ((DRY_AIR_GAS_CONSTANT_JKGK * (tva + tvb)) / 2 / GRAVITY_MS2) * Math.log(a.pressureHpa / b.pressureHpa));
  }
  const levelInputs: LevelInput[] = levels.map((level, i) => ({
    pressureHpa: level.pressureHpa,
    heightM: heights[i + 1],
    temperatureC: level.temperatureC,
    dewpointC: level.dewpointC,
    windDirDeg: level.windDirDeg ?? 270,
    windSpeedMs: level.windSpeedMs ?? 10,
  }));
  return {
    name,
    validTime: '2026-08-14T21:00:00Z',
    latitude: 40,
    longitude: -110,
    surface: {
      pressureHpa: surface.pressureHpa,
      elevationM,
      temperatureC: surface.temperatureC,
      dewpointC: surface.dewpointC,
      windDirDeg: surface.windDirDeg ?? 270,
      windSpeedMs: surface.windSpeedMs ?? 5,
    },
    levels: levelInputs,
  };
}

export function prepared(input: ProfileInput): PreparedProfile {
  const result = prepareProfile(input);
  if (!result.ok) throw new Error(result.errors.join('; '));
  return result.profile;
}

/**
 * A 37-level convective afternoon column (1000 to 100 hPa every 25 hPa), invented: a dry-adiabatic
 * mixed layer to 850 hPa, 6.5 °C/km-like cooling above, a tropopause near 200 hPa; moist low levels.
 */
export function convectiveColumnInput(surfaceTemperatureC = 32, surfaceDewpointC = 18): ProfileInput {
  const surface = { pressureHpa: 1000, temperatureC: surfaceTemperatureC, dewpointC: surfaceDewpointC, windSpeedMs: 6 };
  const levels: ColumnPoint[] = [];
  for (let pressureHpa = 975; pressureHpa >= 100; pressureHpa -= 25) {
    const thetaSurfaceK = surfaceTemperatureC + ZERO_CELSIUS_K;
    let temperatureC: number;
    if (pressureHpa >= 850) temperatureC = thetaSurfaceK * Math.pow(pressureHpa / 1000, 0.2854) - ZERO_CELSIUS_K;
    else {
      const t850 = thetaSurfaceK * Math.pow(0.85, 0.2854) - ZERO_CELSIUS_K;
      temperatureC = Math.max(-58, t850 - 46 * Math.log(850 / pressureHpa));
    }
    const depression = pressureHpa >= 850 ? surfaceTemperatureC - surfaceDewpointC + (1000 - pressureHpa) * 0.02 : 12 + (850 - pressureHpa) * 0.02;
    levels.push({
      pressureHpa,
      temperatureC,
      dewpointC: temperatureC - depression,
      windDirDeg: 250,
      windSpeedMs: 5 + (1000 - pressureHpa) * 0.03,
    });
  }
  return profileInputFromColumn(surface, levels, 100, 'invented convective column');
}
