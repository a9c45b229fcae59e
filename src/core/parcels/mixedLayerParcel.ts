import { KAPPA, ZERO_CELSIUS_K } from '../constants.ts';
import type { PreparedProfile } from '../profile.ts';
import { dewpointFromVapourPressureC, vapourPressureFromMixingRatioHpa } from '../thermo/vapour.ts';

/** Depth of the mixed layer the parcel represents, hPa (common practice: the lowest 100 hPa). */
export const MIXED_LAYER_DEPTH_HPA = 100;

export interface MixedLayerMeans {
  thetaK: number;
  mixingRatioKgKg: number;
  /** Start of the lifted parcel: the surface pressure, with the mean θ and mean w brought there. */
  startTemperatureC: number;
  startDewpointC: number;
  /** Pressure of the top of the layer actually averaged (shallower when the profile is). */
  topPressureHpa: number;
}

/**
 * Mean potential temperature and mean mixing ratio of the lowest MIXED_LAYER_DEPTH_HPA, weighted by
 * pressure (mass): trapezoids in p over the levels, with the top interpolated linearly in ln p. The
 * parcel starts at the surface pressure with that θ and w (common practice for the "ML" parcel).
 */
export function mixedLayerMeans(profile: PreparedProfile, mixingRatioKgKg: Float64Array, depthHpa = MIXED_LAYER_DEPTH_HPA): MixedLayerMeans {
  const pressures = profile.pressureHpa;
  const theta = profile.thetaK;
  const count = pressures.length;
  const surfacePressureHpa = pressures[0];
  const topPressureHpa = Math.max(surfacePressureHpa - depthHpa, pressures[count - 1]);
  let thetaSum = 0;
  let mixingRatioSum = 0;
  for (let index = 1; index < count; index++) {
    const bottomP = pressures[index - 1];
    if (bottomP <= topPressureHpa) break;
    let topP = pressures[index];
    let topTheta = theta[index];
    let topW = mixingRatioKgKg[index];
    if (topP < topPressureHpa) {
      const fraction = Math.log(bottomP / topPressureHpa) / Math.log(bottomP / topP);
      topTheta = theta[index - 1] + fraction * (topTheta - theta[index - 1]);
      topW = mixingRatioKgKg[index - 1] + fraction * (topW - mixingRatioKgKg[index - 1]);
      topP = topPressureHpa;
    }
    const weight = (bottomP - topP) / 2;
    thetaSum += weight * (theta[index - 1] + topTheta);
    mixingRatioSum += weight * (mixingRatioKgKg[index - 1] + topW);
  }
  const totalHpa = surfacePressureHpa - topPressureHpa;
  const thetaK = thetaSum / totalHpa;
  const mixingRatio = mixingRatioSum / totalHpa;
  const startTemperatureC = thetaK * Math.pow(surfacePressureHpa / 1000, KAPPA) - ZERO_CELSIUS_K;
  const startDewpointC = Math.min(
    startTemperatureC,
    dewpointFromVapourPressureC(vapourPressureFromMixingRatioHpa(mixingRatio, surfacePressureHpa)),
  );
  return { thetaK, mixingRatioKgKg: mixingRatio, startTemperatureC, startDewpointC, topPressureHpa };
}
