import type { LevelInput, ProfileInput } from '../core/profile.ts';
import { DRY_AIR_GAS_CONSTANT_JKGK, GRAVITY_MS2 } from '../core/constants.ts';
import { potentialTemperatureK, temperatureOnDryAdiabatC, virtualTemperatureK } from '../core/thermo/potentialTemperature.ts';
import {
  dewpointFromVapourPressureC,
  mixingRatioFromVapourPressureKgKg,
  saturationVapourPressureHpa,
  vapourPressureFromMixingRatioHpa,
} from '../core/thermo/vapour.ts';

/**
 * The invented weather of the demo, generated from a handful of physical parameters so that every
 * number hangs together: temperatures by layer, a diurnal surface cycle, humidity conserved as the
 * air cools and mixed where it mixes, and heights from the hypsometric equation with the virtual
 * temperature. None of it is an observation or a forecast.
 *
 * The column, bottom up, before the afternoon mixes it:
 *   - a stable lower layer (lapse below the dry adiabat), with a nocturnal inversion at night;
 *   - a thin, very stable cap (the lid the mixed layer must overcome);
 *   - the residual near-dry-adiabatic, dry layer left by earlier days' mixing;
 *   - the free troposphere, the tropopause and an isothermal-then-warming stratosphere.
 * By day a mixed layer grows from the ground (θ of the 2 m air less a superadiabatic excess). When the
 * surface parcel's θ passes the θ at the top of the cap, the parcel-method mixing height leaps
 * through the dry layer: the coupling the bot exists to catch. The parameters put that crossing
 * around mid-afternoon local time on the first afternoon, and never before noon.
 */
export interface DemoScenarioParameters {
  /** Residual-layer temperature extrapolated to the ground at the reference site, first day, °C. */
  backgroundGroundTemperatureC: number;
  /** First day's 2 m minimum (about 06:00 local) and maximum (about 15:30 local), °C, reference site. */
  surfaceMinimumC: number;
  surfaceMaximumC: number;
  minimumLocalHour: number;
  maximumLocalHour: number;
  /** The day before the scenario starts was cooler by this much at its maximum, °C. */
  previousDayMaximumDeficitC: number;
  /** Day-over-day warming of the 2 m maximum and minimum, and of the whole column, °C per day. */
  surfaceWarmingPerDayC: number;
  columnWarmingPerDayC: number;
  stableLayerLapseRateCPerKm: number;
  capDepthM: number;
  capLapseRateCPerKm: number;
  dryLayerBaseAglM: number;
  dryLayerTopAglM: number;
  dryLayerLapseRateCPerKm: number;
  dryLayerRelativeHumidityPct: number;
  dryLayerDryingPerDayPct: number;
  freeTroposphereLapseRateCPerKm: number;
  tropopauseMslM: number;
  /** Relative humidity of the residual air at the ground, before any cooling, %. */
  groundRelativeHumidityPct: number;
  /** The lower air's water vapour shrinks by this fraction each day (the drying trend). */
  moistureLossPerDayFraction: number;
  /** How much warmer the 2 m air is than the mixed layer above it at full sun, °C. */
  superadiabaticExcessC: number;
  /** e-folding depth of the night cooling above the ground, m. */
  nocturnalCoolingDepthM: number;
  /** Wind: speed at the ground in the background flow, increase with height, jet at the tropopause. */
  lowWindMs: number;
  windShearMsPerKm: number;
  jetWindMs: number;
  windIncreasePerDayMs: number;
  /** The reference site the temperatures above are for; other sites shift with height and latitude. */
  referenceElevationM: number;
  referenceLatitudeDeg: number;
}

export const DEFAULT_DEMO_SCENARIO: DemoScenarioParameters = {
  backgroundGroundTemperatureC: 22,
  surfaceMinimumC: 10,
  surfaceMaximumC: 32.5,
  minimumLocalHour: 6,
  maximumLocalHour: 16,
  previousDayMaximumDeficitC: 4,
  surfaceWarmingPerDayC: 1.5,
  columnWarmingPerDayC: 0.5,
  stableLayerLapseRateCPerKm: 7,
  capDepthM: 500,
  capLapseRateCPerKm: 1.5,
  dryLayerBaseAglM: 2000,
  dryLayerTopAglM: 3600,
  dryLayerLapseRateCPerKm: 9.5,
  dryLayerRelativeHumidityPct: 16,
  dryLayerDryingPerDayPct: 3,
  freeTroposphereLapseRateCPerKm: 6.8,
  tropopauseMslM: 12_000,
  groundRelativeHumidityPct: 20,
  moistureLossPerDayFraction: 0.1,
  superadiabaticExcessC: 1.8,
  nocturnalCoolingDepthM: 180,
  lowWindMs: 3,
  windShearMsPerKm: 3.5,
  jetWindMs: 28,
  windIncreasePerDayMs: 1,
  referenceElevationM: 1450,
  referenceLatitudeDeg: 43.6,
};

/** 37 levels, 1000 to 100 hPa every 25 hPa; only those above the ground are emitted. */
export const DEMO_PRESSURE_LEVELS_HPA: readonly number[] = Array.from({ length: 37 }, (_, index) => 1000 - 25 * index);

/** Temperature change with height in the standard atmosphere, used to move the scenario between sites. */
const SITE_LAPSE_RATE_C_PER_KM = 6.5;
/** Cooler poleward: a rough summer gradient, °C per degree of latitude (an assumption of the demo). */
const LATITUDE_COOLING_C_PER_DEG = 0.5;
const COLUMN_STEP_M = 40;
/** Levels closer than this to the surface pressure are left out: a lapse rate over a few metres means nothing. */
const MIN_LEVEL_GAP_HPA = 2;
const STRATOSPHERE_ISOTHERMAL_DEPTH_M = 8000;

export interface DemoSite {
  latitude: number;
  longitude: number;
  elevationM: number;
}

/** Where an hour sits in the scenario: days since the scenario's first day, local hour of day. */
export interface ScenarioClock {
  dayIndex: number;
  localHour: number;
}

/** The column at one hour on a fine height grid, bottom (the ground) first. */
export interface DemoColumn {
  heightAglM: Float64Array;
  pressureHpa: Float64Array;
  temperatureC: Float64Array;
  dewpointC: Float64Array;
  windSpeedMs: Float64Array;
  windDirDeg: Float64Array;
  surface: ProfileInput['surface'];
  /** Parcel-method mixing height on the fine grid, for the surface wind and for tests. */
  parcelMixingHeightAglM: number;
}

function siteOffsetC(site: DemoSite, parameters: DemoScenarioParameters): number {
  return (
    (-SITE_LAPSE_RATE_C_PER_KM * (site.elevationM - parameters.referenceElevationM)) / 1000 -
    LATITUDE_COOLING_C_PER_DEG * (Math.abs(site.latitude) - parameters.referenceLatitudeDeg)
  );
}

/** The 2 m minimum and maximum of a scenario day (day −1 is the cooler day before), reference site. */
function dayExtremesC(dayIndex: number, parameters: DemoScenarioParameters): { minimumC: number; maximumC: number } {
  if (dayIndex < 0) {
    return { minimumC: parameters.surfaceMinimumC, maximumC: parameters.surfaceMaximumC - parameters.previousDayMaximumDeficitC };
  }
  return {
    minimumC: parameters.surfaceMinimumC + parameters.surfaceWarmingPerDayC * dayIndex,
    maximumC: parameters.surfaceMaximumC + parameters.surfaceWarmingPerDayC * dayIndex,
  };
}

/** Smooth (half-cosine) passage from a to b as x goes from 0 to 1. */
function easeBetween(a: number, b: number, x: number): number {
  return a + ((b - a) * (1 - Math.cos(Math.PI * Math.min(1, Math.max(0, x))))) / 2;
}

/** 2 m temperature at the reference site: rising from the morning minimum to the afternoon maximum, then falling. */
export function surfaceTemperatureC(clock: ScenarioClock, parameters: DemoScenarioParameters): number {
  const { minimumLocalHour, maximumLocalHour } = parameters;
  const hour = clock.localHour;
  const day = clock.dayIndex;
  if (hour >= minimumLocalHour && hour <= maximumLocalHour) {
    const { minimumC, maximumC } = dayExtremesC(day, parameters);
    return easeBetween(minimumC, maximumC, (hour - minimumLocalHour) / (maximumLocalHour - minimumLocalHour));
  }
  // Falling from the last maximum to the next minimum, across midnight.
  const fallHours = 24 - (maximumLocalHour - minimumLocalHour);
  const fromDay = hour > maximumLocalHour ? day : day - 1;
  const hoursSinceMaximum = hour > maximumLocalHour ? hour - maximumLocalHour : hour + 24 - maximumLocalHour;
  return easeBetween(
    dayExtremesC(fromDay, parameters).maximumC,
    dayExtremesC(fromDay + 1, parameters).minimumC,
    hoursSinceMaximum / fallHours,
  );
}

/** Sunshine weight 0..1: zero at night, one at local midday (a stand-in for the solar cycle). */
function sunWeight(localHour: number): number {
  return localHour <= 7 || localHour >= 19 ? 0 : Math.sin((Math.PI * (localHour - 7)) / 12);
}

/** The background (residual) column's temperature at a height, before the day's heating or the night's cooling. */
function backgroundTemperatureC(heightAglM: number, site: DemoSite, dayIndex: number, parameters: DemoScenarioParameters): number {
  const p = parameters;
  const groundC = p.backgroundGroundTemperatureC + siteOffsetC(site, p) + p.columnWarmingPerDayC * Math.max(0, dayIndex);
  const capBaseM = p.dryLayerBaseAglM - p.capDepthM;
  const atCapBaseC = groundC - (p.stableLayerLapseRateCPerKm * capBaseM) / 1000;
  if (heightAglM <= capBaseM) return groundC - (p.stableLayerLapseRateCPerKm * heightAglM) / 1000;
  const atDryBaseC = atCapBaseC - (p.capLapseRateCPerKm * p.capDepthM) / 1000;
  if (heightAglM <= p.dryLayerBaseAglM) return atCapBaseC - (p.capLapseRateCPerKm * (heightAglM - capBaseM)) / 1000;
  const atDryTopC = atDryBaseC - (p.dryLayerLapseRateCPerKm * (p.dryLayerTopAglM - p.dryLayerBaseAglM)) / 1000;
  if (heightAglM <= p.dryLayerTopAglM) return atDryBaseC - (p.dryLayerLapseRateCPerKm * (heightAglM - p.dryLayerBaseAglM)) / 1000;
  const tropopauseAglM = Math.max(p.tropopauseMslM - site.elevationM, p.dryLayerTopAglM);
  const atTropopauseC = atDryTopC - (p.freeTroposphereLapseRateCPerKm * (tropopauseAglM - p.dryLayerTopAglM)) / 1000;
  if (heightAglM <= tropopauseAglM) return atDryTopC - (p.freeTroposphereLapseRateCPerKm * (heightAglM - p.dryLayerTopAglM)) / 1000;
  // Stratosphere: isothermal, then warming 1 °C/km (roughly the standard atmosphere above 20 km).
  const aboveM = heightAglM - tropopauseAglM;
  return atTropopauseC + Math.max(0, aboveM - STRATOSPHERE_ISOTHERMAL_DEPTH_M) / 1000;
}

/** Relative humidity of the background column, %: moist-ish below, the dry layer, a dry stratosphere. */
function backgroundRelativeHumidityPct(heightAglM: number, site: DemoSite, dayIndex: number, parameters: DemoScenarioParameters): number {
  const p = parameters;
  const day = Math.max(0, dayIndex);
  const capBaseM = p.dryLayerBaseAglM - p.capDepthM;
  if (heightAglM <= capBaseM) return p.groundRelativeHumidityPct + (30 - p.groundRelativeHumidityPct) * (heightAglM / capBaseM);
  if (heightAglM <= p.dryLayerBaseAglM) return 30;
  if (heightAglM <= p.dryLayerTopAglM) return Math.max(5, p.dryLayerRelativeHumidityPct - p.dryLayerDryingPerDayPct * day);
  if (heightAglM + site.elevationM <= p.tropopauseMslM) return 30;
  return 10;
}

function backgroundWind(heightAglM: number, site: DemoSite, dayIndex: number, parameters: DemoScenarioParameters): { speedMs: number; dirDeg: number } {
  const p = parameters;
  const extraMs = p.windIncreasePerDayMs * Math.max(0, dayIndex);
  const atDryTopMs = p.lowWindMs + (p.windShearMsPerKm * p.dryLayerTopAglM) / 1000 + extraMs;
  const tropopauseAglM = Math.max(p.tropopauseMslM - site.elevationM, p.dryLayerTopAglM + 1);
  let speedMs: number;
  if (heightAglM <= p.dryLayerTopAglM) speedMs = p.lowWindMs + (p.windShearMsPerKm * heightAglM) / 1000 + extraMs;
  else if (heightAglM <= tropopauseAglM) speedMs = atDryTopMs + ((p.jetWindMs - atDryTopMs) * (heightAglM - p.dryLayerTopAglM)) / (tropopauseAglM - p.dryLayerTopAglM);
  else speedMs = Math.max(8, p.jetWindMs - (1.5 * (heightAglM - tropopauseAglM)) / 1000);
  // Veering with height, south-southwest at the ground to west-southwest aloft.
  const dirDeg = 200 + 50 * Math.min(1, heightAglM / 4000) + 5 * Math.min(1, Math.max(0, (heightAglM - 4000) / 6000));
  return { speedMs, dirDeg };
}

function standardSurfacePressureHpa(elevationM: number): number {
  // ICAO standard atmosphere below 11 km.
  return 1013.25 * Math.pow(1 - 2.25577e-5 * elevationM, 5.25588);
}

/**
 * The afternoon's residual mixed layer stays whole through the evening (hours after the maximum),
 * then relaxes back into the background column before the next morning.
 */
const RESIDUAL_HOLD_HOURS = 8;
const RESIDUAL_RELAX_HOURS = 6;

/** Mean of f over [0, topM] by the midpoint rule. */
function meanOverHeight(topM: number, f: (heightAglM: number) => number): number {
  const steps = Math.max(1, Math.ceil(topM / 100));
  let sum = 0;
  for (let i = 0; i < steps; i++) sum += f(((i + 0.5) * topM) / steps);
  return sum / steps;
}

/**
 * The whole column at one hour on a fine height grid. Pressure is integrated upward from the
 * surface with the hypsometric equation on the mean virtual temperature of each step; the mixed
 * layer's temperature follows the dry adiabat, so it needs the pressure it is at.
 *
 * Phases of the day: from the morning minimum to the afternoon maximum a mixed layer grows (θ of the
 * 2 m air less the superadiabatic excess) and its water vapour is the mean of the air it has taken
 * in, so reaching the dry layer dries the ground air. After the maximum the mixed layer is left as a
 * residual layer that relaxes back into the background over the night, while the ground cools under
 * an inversion.
 */
export function demoColumn(site: DemoSite, clock: ScenarioClock, parameters: DemoScenarioParameters = DEFAULT_DEMO_SCENARIO): DemoColumn {
  const p = parameters;
  const offsetC = siteOffsetC(site, p);
  const sun = sunWeight(clock.localHour);
  const surfaceC = surfaceTemperatureC(clock, p) + offsetC;
  const surfacePressureHpa = standardSurfacePressureHpa(site.elevationM) - 0.8 * Math.max(0, clock.dayIndex) - 1.2 * sun;
  const parcelThetaK = potentialTemperatureK(surfaceC, surfacePressureHpa);
  const moistureFactor = Math.pow(1 - p.moistureLossPerDayFraction, Math.max(0, clock.dayIndex));
  const standardPressureAt = (heightAglM: number) => standardSurfacePressureHpa(site.elevationM + heightAglM);

  // Water vapour of the background air at a height (kept as the air cools; the lower air dries day by day).
  const backgroundMixingRatio = (heightAglM: number, pressureHpa: number) => {
    const backgroundC = backgroundTemperatureC(heightAglM, site, clock.dayIndex, p);
    const vapourHpa = (saturationVapourPressureHpa(backgroundC) * backgroundRelativeHumidityPct(heightAglM, site, clock.dayIndex, p)) / 100;
    return mixingRatioFromVapourPressureKgKg(vapourHpa, pressureHpa) * (heightAglM <= p.dryLayerBaseAglM ? moistureFactor : 1);
  };

  const rising = clock.localHour >= p.minimumLocalHour && clock.localHour <= p.maximumLocalHour;
  let warmThetaK: number;
  let residualWeight: number;
  if (rising) {
    warmThetaK = potentialTemperatureK(surfaceC - p.superadiabaticExcessC * sun, surfacePressureHpa);
    residualWeight = 1;
  } else {
    const maximumDay = clock.localHour > p.maximumLocalHour ? clock.dayIndex : clock.dayIndex - 1;
    const hoursSinceMaximum = clock.localHour > p.maximumLocalHour ? clock.localHour - p.maximumLocalHour : clock.localHour + 24 - p.maximumLocalHour;
    const maximumC = surfaceTemperatureC({ dayIndex: maximumDay, localHour: p.maximumLocalHour }, p) + offsetC;
    warmThetaK = potentialTemperatureK(maximumC - p.superadiabaticExcessC * sunWeight(p.maximumLocalHour), surfacePressureHpa);
    residualWeight = Math.min(1, Math.max(0, 1 - (hoursSinceMaximum - RESIDUAL_HOLD_HOURS) / RESIDUAL_RELAX_HOURS));
  }

  // The warm (mixed or residual) part of the column, before the ground's night cooling.
  const warmAir = (heightAglM: number, pressureHpa: number) => {
    const backgroundC = backgroundTemperatureC(heightAglM, site, clock.dayIndex, p);
    const adiabatC = temperatureOnDryAdiabatC(warmThetaK, pressureHpa);
    const excessC = Math.max(0, adiabatC - backgroundC) * residualWeight;
    return { temperatureC: backgroundC + excessC, mixed: excessC > 0 };
  };
  const groundWarmC = warmAir(0, surfacePressureHpa).temperatureC;
  const coolingC = Math.min(0, surfaceC - groundWarmC);

  // First the depth the warm air reaches (standard pressures suffice), then its mean water vapour.
  let mixedTopAglM = 0;
  for (let height = 0; height < 12_000; height += 20) {
    if (!warmAir(height, standardPressureAt(height)).mixed) break;
    mixedTopAglM = height;
  }
  const mixedLayerMixingRatio =
    mixedTopAglM > 0 ? meanOverHeight(mixedTopAglM, (height) => backgroundMixingRatio(height, standardPressureAt(height))) : backgroundMixingRatio(0, surfacePressureHpa);
  // A residual layer hands its vapour back to the background as it relaxes.
  const warmMixingRatio = (heightAglM: number, pressureHpa: number) =>
    rising ? mixedLayerMixingRatio : residualWeight * mixedLayerMixingRatio + (1 - residualWeight) * backgroundMixingRatio(heightAglM, pressureHpa);

  const airAt = (heightAglM: number, pressureHpa: number) => {
    const warm = warmAir(heightAglM, pressureHpa);
    const temperatureC = warm.temperatureC + coolingC * Math.exp(-heightAglM / p.nocturnalCoolingDepthM);
    const wanted = warm.mixed ? warmMixingRatio(heightAglM, pressureHpa) : backgroundMixingRatio(heightAglM, pressureHpa);
    const dewpointC = Math.min(temperatureC - 0.2, dewpointFromVapourPressureC(vapourPressureFromMixingRatioHpa(wanted, pressureHpa)));
    // The mixing ratio that goes into the virtual temperature is that of the dew point actually given.
    return { temperatureC, dewpointC, mixingRatioKgKg: mixingRatioFromVapourPressureKgKg(saturationVapourPressureHpa(dewpointC), pressureHpa), mixed: warm.mixed };
  };

  const topPressureHpa = Math.min(...DEMO_PRESSURE_LEVELS_HPA) - 5;
  const heights: number[] = [];
  const pressures: number[] = [];
  const temperatures: number[] = [];
  const dewpoints: number[] = [];
  const mixingRatios: number[] = [];

  let heightAglM = 0;
  let pressureHpa = surfacePressureHpa;
  let parcelMixingHeightAglM = -1;
  let air = airAt(0, pressureHpa);
  // The 2 m air is the parcel: warmer than the mixed layer above it by the superadiabatic excess.
  const surfaceDewpointC = Math.min(surfaceC - 0.5, air.dewpointC);
  air = { ...air, temperatureC: surfaceC, dewpointC: surfaceDewpointC, mixingRatioKgKg: mixingRatioFromVapourPressureKgKg(saturationVapourPressureHpa(surfaceDewpointC), pressureHpa) };
  while (pressureHpa > topPressureHpa) {
    heights.push(heightAglM);
    pressures.push(pressureHpa);
    temperatures.push(air.temperatureC);
    dewpoints.push(air.dewpointC);
    mixingRatios.push(air.mixingRatioKgKg);
    if (parcelMixingHeightAglM < 0 && heightAglM > 0 && potentialTemperatureK(air.temperatureC, pressureHpa) > parcelThetaK) parcelMixingHeightAglM = heightAglM;
    // Hypsometric step on the slab's mean virtual temperature (predictor, then corrector).
    const stepM = heightAglM < 6000 ? COLUMN_STEP_M : 4 * COLUMN_STEP_M;
    const lowerTvK = virtualTemperatureK(air.temperatureC + 273.15, air.mixingRatioKgKg);
    const guessPressureHpa = pressureHpa * Math.exp((-GRAVITY_MS2 * stepM) / (DRY_AIR_GAS_CONSTANT_JKGK * lowerTvK));
    const guessAir = airAt(heightAglM + stepM, guessPressureHpa);
    const meanTvK = (lowerTvK + virtualTemperatureK(guessAir.temperatureC + 273.15, guessAir.mixingRatioKgKg)) / 2;
    pressureHpa = pressureHpa * Math.exp((-GRAVITY_MS2 * stepM) / (DRY_AIR_GAS_CONSTANT_JKGK * meanTvK));
    heightAglM += stepM;
    // The guess differs from the corrected pressure by hundredths of a hPa (thousandths of a kelvin
    // on the dry adiabat), so its air is kept rather than computed again.
    air = guessAir;
  }
  if (parcelMixingHeightAglM < 0) parcelMixingHeightAglM = heights[heights.length - 1];

  // Winds: a mixed layer shares the background wind of its middle; above it, the background.
  const speeds: number[] = [];
  const directions: number[] = [];
  const mixedWind = backgroundWind(mixedTopAglM / 2, site, clock.dayIndex, p);
  const windMixed = rising && mixedTopAglM > 0;
  for (const height of heights) {
    const wind = windMixed && height <= mixedTopAglM ? mixedWind : backgroundWind(height, site, clock.dayIndex, p);
    speeds.push(wind.speedMs);
    directions.push(wind.dirDeg);
  }
  // Surface wind: light drainage at night; by day, momentum mixed down from the middle of the parcel's reach.
  const reachWind = backgroundWind(Math.min(parcelMixingHeightAglM, p.dryLayerTopAglM) / 2, site, clock.dayIndex, p);
  const surfaceWind = sun > 0 && parcelMixingHeightAglM > 50 ? { speedMs: 1 + 0.55 * reachWind.speedMs, dirDeg: reachWind.dirDeg } : { speedMs: 1.5, dirDeg: 120 };
  speeds[0] = surfaceWind.speedMs;
  directions[0] = surfaceWind.dirDeg;

  return {
    heightAglM: Float64Array.from(heights),
    pressureHpa: Float64Array.from(pressures),
    temperatureC: Float64Array.from(temperatures),
    dewpointC: Float64Array.from(dewpoints),
    windSpeedMs: Float64Array.from(speeds),
    windDirDeg: Float64Array.from(directions),
    surface: {
      pressureHpa: round(surfacePressureHpa, 2),
      elevationM: site.elevationM,
      temperatureC: round(surfaceC, 2),
      dewpointC: Math.min(round(surfaceDewpointC, 2), round(surfaceC, 2)),
      windDirDeg: round(surfaceWind.dirDeg, 1),
      windSpeedMs: round(surfaceWind.speedMs, 2),
    },
    parcelMixingHeightAglM,
  };
}

/** The column read at pressure levels (interpolated linearly in ln p), those above the ground only. */
export function levelsFromColumn(column: DemoColumn, pressureLevelsHpa: readonly number[], elevationM: number): LevelInput[] {
  const levels: LevelInput[] = [];
  const { pressureHpa } = column;
  const surfacePressureHpa = pressureHpa[0];
  let index = 0;
  for (const levelHpa of [...pressureLevelsHpa].sort((a, b) => b - a)) {
    if (levelHpa > surfacePressureHpa - MIN_LEVEL_GAP_HPA) continue;
    while (index < pressureHpa.length - 1 && pressureHpa[index + 1] > levelHpa) index++;
    if (index >= pressureHpa.length - 1) break;
    const fraction = Math.log(pressureHpa[index] / levelHpa) / Math.log(pressureHpa[index] / pressureHpa[index + 1]);
    const at = (values: Float64Array) => values[index] + fraction * (values[index + 1] - values[index]);
    const temperatureC = round(at(column.temperatureC), 2);
    levels.push({
      pressureHpa: levelHpa,
      heightM: round(elevationM + at(column.heightAglM), 1),
      temperatureC,
      dewpointC: Math.min(round(at(column.dewpointC), 2), temperatureC),
      windDirDeg: round(at(column.windDirDeg), 1),
      windSpeedMs: round(at(column.windSpeedMs), 2),
    });
  }
  return levels;
}

/** One hour of the scenario as a profile. */
export function demoProfile(
  site: DemoSite,
  clock: ScenarioClock,
  validTime: string,
  name: string,
  parameters: DemoScenarioParameters = DEFAULT_DEMO_SCENARIO,
): ProfileInput {
  const column = demoColumn(site, clock, parameters);
  return {
    name,
    validTime,
    latitude: site.latitude,
    longitude: site.longitude,
    surface: column.surface,
    levels: levelsFromColumn(column, DEMO_PRESSURE_LEVELS_HPA, site.elevationM),
  };
}

function round(value: number, decimals: number): number {
  const factor = 10 ** decimals;
  return Math.round(value * factor) / factor;
}
