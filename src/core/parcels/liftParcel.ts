import type { ParcelReport } from '../analysisResult.ts';
import { KAPPA, ZERO_CELSIUS_K } from '../constants.ts';
import type { PreparedProfile } from '../profile.ts';
import { liftingCondensationLevel } from '../thermo/lcl.ts';
import { virtualTemperatureK } from '../thermo/potentialTemperature.ts';
import { temperatureOnPseudoAdiabatC } from '../thermo/pseudoAdiabat.ts';
import { mixingRatioKgKg } from '../thermo/vapour.ts';
import { layerBuoyancyArea, type SignedArea } from './buoyancyIntegral.ts';
import type { EnvironmentColumns } from './environmentColumns.ts';
import { heightAglAtPressureM } from './heightAtPressure.ts';

/**
 * Lifts one parcel from the surface pressure through the profile and integrates its buoyancy.
 *
 * The parcel follows its dry adiabat to the LCL (found by iteration, thermo/lcl.ts) and the
 * pseudo-adiabat above it, integrated level by level with RK4 in ln p (thermo/pseudoAdiabat.ts), so
 * each parcel is lifted exactly once. With the virtual temperature correction (Doswell and Rasmussen
 * 1994) the parcel's Tv uses its own mixing ratio below the LCL and the saturation mixing ratio above
 * it (no condensate loading, as they recommend), and the environment's Tv uses its own mixing ratio.
 *
 * Definitions (common practice; Doswell and Rasmussen 1994 for the integral):
 * - LFC: the lowest level at or above the LCL where the parcel becomes positively buoyant; a parcel
 *   already buoyant at its LCL has LFC = LCL. Buoyancy below the LCL (a superadiabatic surface layer)
 *   is dry convection, not free convection, and is neither CAPE nor CIN.
 * - EL: the highest level where the parcel turns from positively to negatively buoyant; null when the
 *   parcel is still buoyant at the top of the profile (CAPE is then integrated to the top).
 * - CAPE: the positive area between LFC and EL (negative pockets in between are not subtracted).
 * - CIN: the negative area from the surface to the LFC, ≤ 0; 0 when there is no LFC (then CAPE is 0
 *   too), as the open toolkits commonly report it.
 */
export function liftParcel(
  profile: PreparedProfile,
  environment: EnvironmentColumns,
  startTemperatureC: number,
  startDewpointC: number,
): ParcelReport {
  return liftParcelWithLclTemperature(profile, environment, startTemperatureC, startDewpointC).report;
}

/** liftParcel, also giving the parcel's LCL temperature (the analysis reports it for the surface parcel). */
export function liftParcelWithLclTemperature(
  profile: PreparedProfile,
  environment: EnvironmentColumns,
  startTemperatureC: number,
  startDewpointC: number,
): { report: ParcelReport; lclTemperatureC: number } {
  const pressures = profile.pressureHpa;
  const envTemperatureK = environment.buoyancyTemperatureK;
  const useVirtual = environment.virtualTemperature;
  const count = pressures.length;
  const startPressureHpa = pressures[0];
  const startDewpoint = Math.min(startDewpointC, startTemperatureC);

  const lcl = liftingCondensationLevel(startPressureHpa, startTemperatureC, startDewpoint);
  const lclPressureHpa = lcl.pressureHpa;
  const parcelMixingRatio = mixingRatioKgKg(startDewpoint, startPressureHpa);
  const parcelThetaK = (startTemperatureC + ZERO_CELSIUS_K) * Math.pow(1000 / startPressureHpa, KAPPA);

  const area: SignedArea = { positiveJkg: 0, negativeJkg: 0, crossingFraction: -1 };
  let lfcPressureHpa: number | null = null;
  let elPressureHpa: number | null = null;
  let cinJkg = 0;
  let capeRunningJkg = 0;
  let capeAtElJkg = 0;

  // The previous point of the walk: pressure and parcel-minus-environment difference.
  let previousPressureHpa = startPressureHpa;
  let previousDifferenceK =
    parcelBuoyancyTemperatureK(startTemperatureC, startPressureHpa, parcelMixingRatio, false, useVirtual) - envTemperatureK[0];
  let saturated = lclPressureHpa >= startPressureHpa;
  let parcelTemperatureC = startTemperatureC;
  let parcelPressureHpa = startPressureHpa;

  // One segment of the walk, from the previous point up to (pressureHpa, differenceK).
  const step = (pressureHpa: number, differenceK: number, segmentAboveLcl: boolean): void => {
    const depth = Math.log(previousPressureHpa / pressureHpa);
    layerBuoyancyArea(previousDifferenceK, differenceK, depth, area);
    if (!segmentAboveLcl) {
      cinJkg += area.negativeJkg;
    } else {
      const negativeToPositive = previousDifferenceK <= 0 && differenceK > 0;
      const positiveToNegative = previousDifferenceK > 0 && differenceK <= 0;
      const crossingPressureHpa = negativeToPositive || positiveToNegative
        ? previousPressureHpa * Math.exp(-depth * (previousDifferenceK / (previousDifferenceK - differenceK)))
        : pressureHpa;
      if (lfcPressureHpa === null) {
        if (negativeToPositive) {
          lfcPressureHpa = crossingPressureHpa;
          cinJkg += area.negativeJkg;
        } else if (previousDifferenceK > 0) {
          lfcPressureHpa = previousPressureHpa;
        } else {
          cinJkg += area.negativeJkg;
        }
      }
      if (lfcPressureHpa !== null) {
        capeRunningJkg += area.positiveJkg;
        if (positiveToNegative) {
          elPressureHpa = crossingPressureHpa;
          capeAtElJkg = capeRunningJkg;
        }
      }
    }
    previousPressureHpa = pressureHpa;
    previousDifferenceK = differenceK;
  };

  for (let index = 1; index < count; index++) {
    const pressureHpa = pressures[index];
    if (!saturated && pressureHpa <= lclPressureHpa) {
      // Insert the LCL as a point of its own, so the dry and moist parts are integrated separately.
      const fraction = Math.log(pressures[index - 1] / lclPressureHpa) / Math.log(pressures[index - 1] / pressureHpa);
      const envAtLclK = envTemperatureK[index - 1] + fraction * (envTemperatureK[index] - envTemperatureK[index - 1]);
      const parcelAtLclK = parcelBuoyancyTemperatureK(lcl.temperatureC, lclPressureHpa, parcelMixingRatio, false, useVirtual);
      step(lclPressureHpa, parcelAtLclK - envAtLclK, false);
      saturated = true;
      parcelTemperatureC = lcl.temperatureC;
      parcelPressureHpa = lclPressureHpa;
    }
    if (saturated) {
      parcelTemperatureC = temperatureOnPseudoAdiabatC(parcelTemperatureC, parcelPressureHpa, pressureHpa);
      parcelPressureHpa = pressureHpa;
      const parcelK = parcelBuoyancyTemperatureK(parcelTemperatureC, pressureHpa, 0, true, useVirtual);
      step(pressureHpa, parcelK - envTemperatureK[index], true);
    } else {
      const parcelTemperatureDryC = parcelThetaK * Math.pow(pressureHpa / 1000, KAPPA) - ZERO_CELSIUS_K;
      const parcelK = parcelBuoyancyTemperatureK(parcelTemperatureDryC, pressureHpa, parcelMixingRatio, false, useVirtual);
      step(pressureHpa, parcelK - envTemperatureK[index], false);
    }
  }

  let capeJkg = 0;
  if (lfcPressureHpa === null) {
    cinJkg = 0;
    elPressureHpa = null;
  } else if (previousDifferenceK > 0) {
    capeJkg = capeRunningJkg;
    elPressureHpa = null;
  } else {
    capeJkg = capeAtElJkg;
  }

  const report: ParcelReport = {
    startPressureHpa,
    startTemperatureC,
    startDewpointC: startDewpoint,
    capeJkg: Math.max(0, capeJkg),
    cinJkg: Math.min(0, cinJkg),
    lclPressureHpa,
    lclHeightAglM: heightAglAtPressureM(profile, lclPressureHpa),
    lfcPressureHpa,
    elPressureHpa,
  };
  return { report, lclTemperatureC: lcl.temperatureC };
}

/** Temperature, K, of the parcel as buoyancy sees it: Tv with its own (or saturation) mixing ratio, or T. */
function parcelBuoyancyTemperatureK(
  temperatureC: number,
  pressureHpa: number,
  unsaturatedMixingRatioKgKg: number,
  saturated: boolean,
  useVirtual: boolean,
): number {
  const temperatureK = temperatureC + ZERO_CELSIUS_K;
  if (!useVirtual) return temperatureK;
  const mixingRatio = saturated ? mixingRatioKgKg(temperatureC, pressureHpa) : unsaturatedMixingRatioKgKg;
  return virtualTemperatureK(temperatureK, mixingRatio);
}
