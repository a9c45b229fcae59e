import {
  DRY_AIR_GAS_CONSTANT_JKGK,
  DRY_AIR_SPECIFIC_HEAT_JKGK,
  EPSILON,
  GRAVITY_MS2,
  LATENT_HEAT_VAPORISATION_JKG,
  ZERO_CELSIUS_K,
} from '../constants.ts';
import { mixingRatioKgKg } from './vapour.ts';

/**
 * The pseudo-adiabat: saturated ascent with all condensate removed. The lapse rate is the standard
 * form (AMS Glossary, "pseudoadiabatic lapse rate"; the same expression as in common open
 * meteorology toolkits) with constant latent heat and cp of dry air; it is integrated in ln p with
 * fourth-order Runge-Kutta and a step no larger than MAX_STEP_LN_P, so the path does not drift with
 * the distance travelled.
 */

/** dT/d(ln p) along the pseudo-adiabat, K, at temperature T (K) and pressure p (hPa). */
function pseudoAdiabaticSlopeK(temperatureK: number, pressureHpa: number): number {
  const saturationMixingRatio = mixingRatioKgKg(temperatureK - ZERO_CELSIUS_K, pressureHpa);
  const numerator = DRY_AIR_GAS_CONSTANT_JKGK * temperatureK + LATENT_HEAT_VAPORISATION_JKG * saturationMixingRatio;
  const denominator =
    DRY_AIR_SPECIFIC_HEAT_JKGK +
    (LATENT_HEAT_VAPORISATION_JKG * LATENT_HEAT_VAPORISATION_JKG * saturationMixingRatio * EPSILON) /
      (DRY_AIR_GAS_CONSTANT_JKGK * temperatureK * temperatureK);
  return numerator / denominator;
}

/** Largest Runge-Kutta step in ln p (about 3 % in pressure); finer steps change results by < 0.001 K. */
const MAX_STEP_LN_P = 0.03;

/** Temperature, °C, reached at endPressureHpa by saturated air starting at (startTemperatureC, startPressureHpa). */
export function temperatureOnPseudoAdiabatC(startTemperatureC: number, startPressureHpa: number, endPressureHpa: number): number {
  const totalLnP = Math.log(endPressureHpa / startPressureHpa);
  const steps = Math.max(1, Math.ceil(Math.abs(totalLnP) / MAX_STEP_LN_P));
  const stepLnP = totalLnP / steps;
  let temperatureK = startTemperatureC + ZERO_CELSIUS_K;
  let lnPressure = Math.log(startPressureHpa);
  for (let step = 0; step < steps; step++) {
    const pressureHpa = Math.exp(lnPressure);
    const midPressureHpa = Math.exp(lnPressure + stepLnP / 2);
    const endStepPressureHpa = Math.exp(lnPressure + stepLnP);
    const k1 = pseudoAdiabaticSlopeK(temperatureK, pressureHpa);
    const k2 = pseudoAdiabaticSlopeK(temperatureK + (stepLnP * k1) / 2, midPressureHpa);
    const k3 = pseudoAdiabaticSlopeK(temperatureK + (stepLnP * k2) / 2, midPressureHpa);
    const k4 = pseudoAdiabaticSlopeK(temperatureK + stepLnP * k3, endStepPressureHpa);
    temperatureK += (stepLnP * (k1 + 2 * k2 + 2 * k3 + k4)) / 6;
    lnPressure += stepLnP;
  }
  return temperatureK - ZERO_CELSIUS_K;
}

/**
 * Pseudo-adiabatic (moist) lapse rate in height, °C/km, at temperature T and pressure p:
 * Γm = g (1 + L rs / (Rd T)) / (cp + L² rs ε / (Rd T²)) (AMS Glossary).
 */
export function pseudoAdiabaticLapseRateCPerKm(temperatureC: number, pressureHpa: number): number {
  const temperatureK = temperatureC + ZERO_CELSIUS_K;
  const saturationMixingRatio = mixingRatioKgKg(temperatureC, pressureHpa);
  const numerator = GRAVITY_MS2 * (1 + (LATENT_HEAT_VAPORISATION_JKG * saturationMixingRatio) / (DRY_AIR_GAS_CONSTANT_JKGK * temperatureK));
  const denominator =
    DRY_AIR_SPECIFIC_HEAT_JKGK +
    (LATENT_HEAT_VAPORISATION_JKG * LATENT_HEAT_VAPORISATION_JKG * saturationMixingRatio * EPSILON) /
      (DRY_AIR_GAS_CONSTANT_JKGK * temperatureK * temperatureK);
  return (1000 * numerator) / denominator;
}
