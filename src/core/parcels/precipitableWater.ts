import { GRAVITY_MS2, WATER_DENSITY_KGM3 } from '../constants.ts';

/**
 * Precipitable water, mm: the water in the column above the surface, PW = (1/(ρw g)) ∫ q dp, with
 * q the specific humidity (AMS Glossary, "precipitable water"). Trapezoids in p between levels.
 * Many texts write w dp/g with the mixing ratio w; q is the exact mass fraction and differs from w by
 * under 2 % (w = q/(1 − q)); NCL's prcwater_dp takes q too.
 */
export function precipitableWaterMm(pressureHpa: Float64Array, mixingRatioKgKg: Float64Array): number {
  let integralPaKgKg = 0;
  let lowerQ = mixingRatioKgKg[0] / (1 + mixingRatioKgKg[0]);
  for (let index = 1; index < pressureHpa.length; index++) {
    const upperQ = mixingRatioKgKg[index] / (1 + mixingRatioKgKg[index]);
    integralPaKgKg += ((lowerQ + upperQ) / 2) * (pressureHpa[index - 1] - pressureHpa[index]) * 100;
    lowerQ = upperQ;
  }
  // kg/m² of water is mm of depth at ρw = 1000 kg/m³.
  return (integralPaKgKg / GRAVITY_MS2 / WATER_DENSITY_KGM3) * 1000;
}
