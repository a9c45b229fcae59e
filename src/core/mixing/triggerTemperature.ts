import type { PreparedProfile } from '../profile.ts';
import { temperatureOnDryAdiabatC } from '../thermo/potentialTemperature.ts';

/**
 * Above this surface temperature, °C, heating is not a plausible way to reach a layer, and its
 * trigger temperature is null. The hottest reliably measured air temperature is about 57 °C
 * (from memory); 60 °C leaves a margin. A project choice.
 */
export const MAX_PLAUSIBLE_SURFACE_TEMPERATURE_C = 60;

/**
 * Trigger temperature of a layer whose base is level `baseLevelIndex`: the surface temperature, °C,
 * at which the mixed layer reaches that base. The parcel method mixes up to the first level warmer
 * in θ than the surface parcel, so the base is reached once the surface parcel's θ equals the highest
 * environmental θ of the levels from the first above the surface up to the base. The surface level
 * itself is left out: its temperature is the quantity being sought. A layer that starts at the
 * surface is mixed already; its trigger is the profile's own surface temperature.
 */
export function triggerTemperatureC(profile: PreparedProfile, baseLevelIndex: number): number | null {
  if (baseLevelIndex <= 0) return profile.temperatureC[0];
  let highestThetaK = -Infinity;
  for (let i = 1; i <= baseLevelIndex; i++) if (profile.thetaK[i] > highestThetaK) highestThetaK = profile.thetaK[i];
  const temperatureC = temperatureOnDryAdiabatC(highestThetaK, profile.pressureHpa[0]);
  return temperatureC <= MAX_PLAUSIBLE_SURFACE_TEMPERATURE_C ? temperatureC : null;
}
