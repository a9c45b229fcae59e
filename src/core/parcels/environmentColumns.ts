import { ZERO_CELSIUS_K } from '../constants.ts';
import type { PreparedProfile } from '../profile.ts';
import { mixingRatioKgKg } from '../thermo/vapour.ts';
import { virtualTemperatureK } from '../thermo/potentialTemperature.ts';

/**
 * Per-level quantities of the environment that every parcel needs, computed once per profile so
 * that the parcel loops only read arrays: mixing ratio, and the temperature the buoyancy is measured
 * against (virtual, or plain when the virtual temperature correction is switched off).
 */
export interface EnvironmentColumns {
  mixingRatioKgKg: Float64Array;
  /** Temperature, K, the parcel is compared with: Tv (Doswell and Rasmussen 1994) or T. */
  buoyancyTemperatureK: Float64Array;
  virtualTemperature: boolean;
}

export function environmentColumns(profile: PreparedProfile, virtualTemperature: boolean): EnvironmentColumns {
  const count = profile.pressureHpa.length;
  const mixingRatio = new Float64Array(count);
  const buoyancyTemperature = new Float64Array(count);
  for (let index = 0; index < count; index++) {
    const w = mixingRatioKgKg(profile.dewpointC[index], profile.pressureHpa[index]);
    const temperatureK = profile.temperatureC[index] + ZERO_CELSIUS_K;
    mixingRatio[index] = w;
    buoyancyTemperature[index] = virtualTemperature ? virtualTemperatureK(temperatureK, w) : temperatureK;
  }
  return { mixingRatioKgKg: mixingRatio, buoyancyTemperatureK: buoyancyTemperature, virtualTemperature };
}
