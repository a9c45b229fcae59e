import type { LevelInput, ProfileInput } from '../../../src/core/profile.ts';
import { dewpointFromRelativeHumidityC } from '../../../src/core/thermo/vapour.ts';
import type { ForecastSeries } from '../../../src/forecast/forecastSource.ts';

/**
 * An invented forecast series for tests and the benchmark: no real place, no real model. A dry
 * near-dry-adiabatic layer (Γ 9.5 °C/km, RH 20 %) sits 2600–4400 m above the ground over a stable
 * lower layer (Γ 6 °C/km, RH 55 %). The surface heats through the day; the mixed layer follows the
 * surface parcel's dry adiabat and, on the days asked for, reaches the dry layer at a chosen local
 * hour. Levels are at fixed heights above ground with pressures from the hypsometric equation.
 */

/** The invented place: its point falls in the America/Boise zone (UTC−6 in August). */
export const INVENTED_PLACE = { name: 'Cinder Flats (invented)', latitude: 44.12, longitude: -114.93, elevationM: 1450 };
export const INVENTED_UTC_OFFSET_H = -6;

const DRY_LAYER_BASE_AGL_M = 2600;
const DRY_LAYER_TOP_AGL_M = 4400;
const TROPOPAUSE_AGL_M = 11000;
const LOWER_LAPSE_C_PER_KM = 6.0;
const DRY_LAYER_LAPSE_C_PER_KM = 9.5;
const UPPER_LAPSE_C_PER_KM = 6.5;
/** The mixed layer slightly superadiabatic, so its θ stays under the surface parcel's. */
const MIXED_LAYER_LAPSE_C_PER_KM = 9.9;
/** Surface temperature above the night-time reference at which the parcel's adiabat reaches the dry layer base. */
const COUPLING_EXCESS_C = (9.76 - LOWER_LAPSE_C_PER_KM) * (DRY_LAYER_BASE_AGL_M / 1000);
/** 37 levels above ground, m: dense near the ground, one exactly at each dry-layer bound. */
export const LEVEL_HEIGHTS_AGL_M = [
  30, 80, 150, 250, 400, 550, 700, 850, 1000, 1200, 1400, 1600, 1800, 2000, 2200, 2400, 2600, 2800, 3000, 3300, 3600, 3900, 4200,
  4400, 4700, 5000, 5500, 6000, 6500, 7000, 8000, 9000, 10000, 11000, 12500, 14000, 16000,
];

const SURFACE_PRESSURE_HPA = 852;
const NIGHT_SURFACE_C = 14;
const GAS_CONSTANT = 287.04;
const GRAVITY = 9.80665;

function residualTemperatureC(heightAglM: number): number {
  const km = heightAglM / 1000;
  const baseKm = DRY_LAYER_BASE_AGL_M / 1000;
  const topKm = DRY_LAYER_TOP_AGL_M / 1000;
  const tropKm = TROPOPAUSE_AGL_M / 1000;
  let t = NIGHT_SURFACE_C - LOWER_LAPSE_C_PER_KM * Math.min(km, baseKm);
  if (km > baseKm) t -= DRY_LAYER_LAPSE_C_PER_KM * (Math.min(km, topKm) - baseKm);
  if (km > topKm) t -= UPPER_LAPSE_C_PER_KM * (Math.min(km, tropKm) - topKm);
  return t;
}

function relativeHumidityAtPct(heightAglM: number): number {
  if (heightAglM < DRY_LAYER_BASE_AGL_M) return 55;
  if (heightAglM <= DRY_LAYER_TOP_AGL_M) return 20;
  return 45;
}

/** A sharp afternoon bump, 0 at night, 1 at 15:00 local. */
function heating(localHour: number): number {
  return Math.max(0, Math.sin((Math.PI * (localHour - 8)) / 14)) ** 3;
}

export interface SyntheticSeriesOptions {
  hours?: number;
  /** First valid time, UTC; default local midnight of day 1 (2026-08-14T06:00Z). */
  startTime?: string;
  /** Local hour at which the mixed layer first reaches the dry layer, per day (index 0 = day 1); null: that day stays under it. */
  couplingLocalHourByDay?: Array<number | null>;
  runTime?: string;
  latitude?: number;
  longitude?: number;
  /** Valid hours (indices) whose profile is made faulty (dew point above temperature at 700 m). */
  faultyHourIndices?: number[];
}

export function syntheticProfile(validTimeMs: number, surfaceC: number, latitude: number, longitude: number): ProfileInput {
  const levels: LevelInput[] = [];
  let pressureHpa = SURFACE_PRESSURE_HPA;
  let belowHeightM = 0;
  let belowTemperatureC = surfaceC;
  for (const heightAglM of LEVEL_HEIGHTS_AGL_M) {
    const temperatureC = Math.max(residualTemperatureC(heightAglM), surfaceC - (MIXED_LAYER_LAPSE_C_PER_KM * heightAglM) / 1000);
    const meanK = (temperatureC + belowTemperatureC) / 2 + 273.15;
    pressureHpa *= Math.exp((-GRAVITY * (heightAglM - belowHeightM)) / (GAS_CONSTANT * meanK));
    const speedMs = Math.min(25, 3 + (3 * heightAglM) / 1000);
    levels.push({
      pressureHpa: Math.round(pressureHpa * 100) / 100,
      heightM: INVENTED_PLACE.elevationM + heightAglM,
      temperatureC,
      dewpointC: dewpointFromRelativeHumidityC(temperatureC, relativeHumidityAtPct(heightAglM)),
      windDirDeg: 230,
      windSpeedMs: speedMs,
    });
    belowHeightM = heightAglM;
    belowTemperatureC = temperatureC;
  }
  return {
    name: INVENTED_PLACE.name,
    validTime: new Date(validTimeMs).toISOString().replace('.000Z', 'Z'),
    latitude,
    longitude,
    surface: {
      pressureHpa: SURFACE_PRESSURE_HPA,
      elevationM: INVENTED_PLACE.elevationM,
      temperatureC: surfaceC,
      dewpointC: dewpointFromRelativeHumidityC(surfaceC, 45),
      windDirDeg: 230,
      windSpeedMs: 3,
    },
    levels,
  };
}

/** Surface temperature for a local hour on a day that couples at `couplingLocalHour` (or peaks short of it). */
export function syntheticSurfaceC(localHour: number, couplingLocalHour: number | null): number {
  const nightC = NIGHT_SURFACE_C - 4;
  // On a coupling day the amplitude puts the surface 1 °C past the coupling value at the chosen hour.
  const neededRiseC = NIGHT_SURFACE_C + COUPLING_EXCESS_C + 1 - nightC;
  const amplitudeC = couplingLocalHour === null ? 0.75 * (neededRiseC - 1) : neededRiseC / heating(couplingLocalHour);
  return nightC + amplitudeC * heating(localHour);
}

export function syntheticSeries(options: SyntheticSeriesOptions = {}): ForecastSeries {
  const hours = options.hours ?? 48;
  const startMs = Date.parse(options.startTime ?? '2026-08-14T06:00:00Z');
  const couplingByDay = options.couplingLocalHourByDay ?? [14, null];
  const latitude = options.latitude ?? INVENTED_PLACE.latitude;
  const longitude = options.longitude ?? INVENTED_PLACE.longitude;
  const faulty = new Set(options.faultyHourIndices ?? []);
  const profiles: ProfileInput[] = [];
  for (let index = 0; index < hours; index++) {
    const validMs = startMs + index * 3_600_000;
    const localMs = validMs + INVENTED_UTC_OFFSET_H * 3_600_000;
    const localHour = new Date(localMs).getUTCHours();
    const day = Math.floor((localMs - Date.parse('2026-08-14T00:00:00Z')) / 86_400_000);
    const couplingHour = couplingByDay[day] ?? null;
    const profile = syntheticProfile(validMs, syntheticSurfaceC(localHour, couplingHour), latitude, longitude);
    if (faulty.has(index)) profile.levels[6].dewpointC = profile.levels[6].temperatureC + 3;
    profiles.push(profile);
  }
  return {
    location: { latitude, longitude, elevationM: INVENTED_PLACE.elevationM, name: INVENTED_PLACE.name },
    sourceName: 'synthetic test series (invented data)',
    model: 'invented-model',
    runTime: options.runTime ?? '2026-08-14T00:00:00Z',
    providerUnits: {},
    invented: true,
    profiles,
  };
}
