import { EPSILON, ZERO_CELSIUS_K } from '../constants.ts';

/**
 * Water vapour quantities. Saturation vapour pressure over liquid water by Bolton (1980) eq. 10,
 * accurate to 0.1 % between −30 and +35 °C; used over liquid water at all temperatures, as is the
 * common practice of sounding analysis.
 */

/** Saturation vapour pressure over liquid water, hPa (Bolton 1980, eq. 10). */
export function saturationVapourPressureHpa(temperatureC: number): number {
  return 6.112 * Math.exp((17.67 * temperatureC) / (temperatureC + 243.5));
}

/** Dew point, °C, of a vapour pressure in hPa: the inverse of Bolton's eq. 10 (his eq. 11). */
export function dewpointFromVapourPressureC(vapourPressureHpa: number): number {
  const logRatio = Math.log(vapourPressureHpa / 6.112);
  return (243.5 * logRatio) / (17.67 - logRatio);
}

/** Mixing ratio, kg/kg, of vapour pressure e at total pressure p. */
export function mixingRatioFromVapourPressureKgKg(vapourPressureHpa: number, pressureHpa: number): number {
  return (EPSILON * vapourPressureHpa) / (pressureHpa - vapourPressureHpa);
}

/** Vapour pressure, hPa, of a mixing ratio at total pressure p. */
export function vapourPressureFromMixingRatioHpa(mixingRatioKgKg: number, pressureHpa: number): number {
  return (mixingRatioKgKg * pressureHpa) / (EPSILON + mixingRatioKgKg);
}

/** Mixing ratio, kg/kg, of air with dew point Td at pressure p (saturation mixing ratio when Td = T). */
export function mixingRatioKgKg(dewpointC: number, pressureHpa: number): number {
  return mixingRatioFromVapourPressureKgKg(saturationVapourPressureHpa(dewpointC), pressureHpa);
}

/** Relative humidity over liquid water, %, as the ratio of vapour pressures. */
export function relativeHumidityPct(temperatureC: number, dewpointC: number): number {
  return (100 * saturationVapourPressureHpa(dewpointC)) / saturationVapourPressureHpa(temperatureC);
}

/** Dew point, °C, from temperature and relative humidity (%). */
export function dewpointFromRelativeHumidityC(temperatureC: number, relativeHumidityPctValue: number): number {
  const clampedPct = Math.min(100, Math.max(0.01, relativeHumidityPctValue));
  return dewpointFromVapourPressureC((saturationVapourPressureHpa(temperatureC) * clampedPct) / 100);
}

/** Vapour pressure deficit es(T) − e(Td), hPa (the moisture term of the Hot-Dry-Windy Index). */
export function vapourPressureDeficitHpa(temperatureC: number, dewpointC: number): number {
  return saturationVapourPressureHpa(temperatureC) - saturationVapourPressureHpa(dewpointC);
}

/** Specific humidity, kg/kg, from mixing ratio. */
export function specificHumidityKgKg(mixingRatioKgKgValue: number): number {
  return mixingRatioKgKgValue / (1 + mixingRatioKgKgValue);
}

export function celsiusToKelvin(temperatureC: number): number {
  return temperatureC + ZERO_CELSIUS_K;
}

export function kelvinToCelsius(temperatureK: number): number {
  return temperatureK - ZERO_CELSIUS_K;
}
