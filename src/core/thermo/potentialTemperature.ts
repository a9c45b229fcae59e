import { EPSILON, KAPPA, REFERENCE_PRESSURE_HPA, ZERO_CELSIUS_K } from '../constants.ts';

/** Potential temperature, K (Poisson's equation, reference 1000 hPa, κ = 0.2854 as in Bolton 1980). */
export function potentialTemperatureK(temperatureC: number, pressureHpa: number): number {
  return (temperatureC + ZERO_CELSIUS_K) * Math.pow(REFERENCE_PRESSURE_HPA / pressureHpa, KAPPA);
}

/** Temperature, °C, of air with potential temperature θ at pressure p: the dry adiabat. */
export function temperatureOnDryAdiabatC(thetaK: number, pressureHpa: number): number {
  return thetaK * Math.pow(pressureHpa / REFERENCE_PRESSURE_HPA, KAPPA) - ZERO_CELSIUS_K;
}

/**
 * Virtual temperature, K: the temperature dry air would need for the density of the moist air.
 * Tv = T (w + ε) / (ε (1 + w)) (Doswell and Rasmussen 1994 use it for CAPE; exact form, AMS glossary).
 */
export function virtualTemperatureK(temperatureK: number, mixingRatioKgKg: number): number {
  return (temperatureK * (mixingRatioKgKg + EPSILON)) / (EPSILON * (1 + mixingRatioKgKg));
}
