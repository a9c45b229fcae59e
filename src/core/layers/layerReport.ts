import type { LayerReport } from '../analysisResult.ts';
import { DRY_ADIABATIC_LAPSE_RATE_C_PER_KM } from '../constants.ts';
import { pseudoAdiabaticLapseRateCPerKm } from '../thermo/pseudoAdiabat.ts';
import { classifyLapseRate } from './classifyLayer.ts';
import { lapseRateCPerKm } from './lapseRate.ts';

/**
 * One layer between two levels, classed. Γm is taken at the mean of the two temperatures and at the
 * layer's middle in ln p (the geometric mean of the pressures), which is where the mean temperature
 * sits in a layer whose temperature is linear in ln p.
 */
export function layerReport(
  basePressureHpa: number,
  topPressureHpa: number,
  baseAglM: number,
  topAglM: number,
  baseTemperatureC: number,
  topTemperatureC: number,
): LayerReport {
  const lapseRate = lapseRateCPerKm(baseTemperatureC, topTemperatureC, baseAglM, topAglM);
  const moistLapseRate = pseudoAdiabaticLapseRateCPerKm(
    (baseTemperatureC + topTemperatureC) / 2,
    Math.sqrt(basePressureHpa * topPressureHpa),
  );
  return {
    basePressureHpa,
    topPressureHpa,
    baseAglM,
    topAglM,
    lapseRateCPerKm: lapseRate,
    moistLapseRateCPerKm: moistLapseRate,
    ratioToDryAdiabat: lapseRate / DRY_ADIABATIC_LAPSE_RATE_C_PER_KM,
    class: classifyLapseRate(lapseRate, moistLapseRate),
  };
}
