import { DRY_AIR_GAS_CONSTANT_JKGK, ZERO_CELSIUS_K } from '../constants.ts';
import type { PreparedProfile } from '../profile.ts';
import { equivalentPotentialTemperatureK } from '../thermo/equivalentPotentialTemperature.ts';
import { virtualTemperatureK } from '../thermo/potentialTemperature.ts';
import { temperatureOnPseudoAdiabatC } from '../thermo/pseudoAdiabat.ts';
import { mixingRatioKgKg } from '../thermo/vapour.ts';
import { wetBulbTemperatureC } from '../thermo/wetBulb.ts';
import type { EnvironmentColumns } from './environmentColumns.ts';

/** Depth above the surface searched for the downdraft's source, hPa (Gilmore and Wicker 1998). */
export const DOWNDRAFT_SOURCE_DEPTH_HPA = 400;

/**
 * Downdraft CAPE, J/kg, reported as a positive number. Definition as in Gilmore and Wicker (1998,
 * Mon. Wea. Rev. 126, 943–958), after Emanuel (1994 §6.4): the source is the level of minimum θe
 * (Bolton 1980 eq. 43) within the lowest 400 hPa above the surface; a parcel at that level's wet-bulb
 * temperature descends along the pseudo-adiabat (kept saturated by evaporating rain) to the surface.
 * DCAPE = Rd ∫ (Tve − Tvp) d ln p from the surface to the source: the net negative buoyancy of the
 * descent, never below 0. With the virtual correction the saturated parcel uses its saturation w.
 * The surface itself is not a candidate source (a parcel there has no depth to descend).
 */
export function downdraftCapeJkg(profile: PreparedProfile, environment: EnvironmentColumns): number {
  const pressures = profile.pressureHpa;
  const count = pressures.length;
  const limitPressureHpa = pressures[0] - DOWNDRAFT_SOURCE_DEPTH_HPA;
  let sourceIndex = -1;
  let minimumThetaEK = Infinity;
  for (let index = 1; index < count && pressures[index] >= limitPressureHpa; index++) {
    const thetaEK = equivalentPotentialTemperatureK(profile.temperatureC[index], profile.dewpointC[index], pressures[index]);
    if (thetaEK < minimumThetaEK) {
      minimumThetaEK = thetaEK;
      sourceIndex = index;
    }
  }
  if (sourceIndex < 1) return 0;

  const envK = environment.buoyancyTemperatureK;
  const useVirtual = environment.virtualTemperature;
  let parcelTemperatureC = wetBulbTemperatureC(pressures[sourceIndex], profile.temperatureC[sourceIndex], profile.dewpointC[sourceIndex]);
  let upperDifferenceK = envK[sourceIndex] - parcelBuoyancyTemperatureK(parcelTemperatureC, pressures[sourceIndex], useVirtual);
  let energyJkg = 0;
  for (let index = sourceIndex - 1; index >= 0; index--) {
    parcelTemperatureC = temperatureOnPseudoAdiabatC(parcelTemperatureC, pressures[index + 1], pressures[index]);
    const lowerDifferenceK = envK[index] - parcelBuoyancyTemperatureK(parcelTemperatureC, pressures[index], useVirtual);
    energyJkg += (DRY_AIR_GAS_CONSTANT_JKGK * (upperDifferenceK + lowerDifferenceK) * Math.log(pressures[index] / pressures[index + 1])) / 2;
    upperDifferenceK = lowerDifferenceK;
  }
  return Math.max(0, energyJkg);
}

function parcelBuoyancyTemperatureK(temperatureC: number, pressureHpa: number, useVirtual: boolean): number {
  const temperatureK = temperatureC + ZERO_CELSIUS_K;
  return useVirtual ? virtualTemperatureK(temperatureK, mixingRatioKgKg(temperatureC, pressureHpa)) : temperatureK;
}
