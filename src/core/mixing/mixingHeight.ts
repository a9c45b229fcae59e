import type { PreparedProfile } from '../profile.ts';
import { potentialTemperatureK } from '../thermo/potentialTemperature.ts';

/**
 * Mixing height by the parcel method (DESIGN.md): the height above ground where the environmental
 * potential temperature first exceeds the surface parcel's, linearly interpolated in height.
 * The surface level is the parcel itself, so the first segment runs from (0 m, θ parcel) to level 1:
 * 0 m when level 1 is already warmer in θ, the profile top when no level is.
 */
export function mixingHeightForParcelThetaAglM(heightAglM: Float64Array, thetaK: Float64Array, parcelThetaK: number): number {
  let lowerHeightM = heightAglM[0];
  let lowerThetaK = parcelThetaK;
  for (let i = 1; i < thetaK.length; i++) {
    const upperThetaK = thetaK[i];
    if (upperThetaK > parcelThetaK) {
      // lowerThetaK ≤ parcelThetaK < upperThetaK, so the fraction lies in [0, 1).
      const fraction = (parcelThetaK - lowerThetaK) / (upperThetaK - lowerThetaK);
      return lowerHeightM + fraction * (heightAglM[i] - lowerHeightM);
    }
    lowerHeightM = heightAglM[i];
    lowerThetaK = upperThetaK;
  }
  return heightAglM[heightAglM.length - 1];
}

/** True when no level above the surface is warmer in θ than the parcel: the mixing height is the profile top. */
export function parcelMixesThroughProfile(thetaK: Float64Array, parcelThetaK: number): boolean {
  for (let i = 1; i < thetaK.length; i++) if (thetaK[i] > parcelThetaK) return false;
  return true;
}

/** θ, K, of the surface parcel at the profile's own surface temperature or at a given one. */
export function surfaceParcelThetaK(profile: PreparedProfile, surfaceTemperatureC?: number | null): number {
  return surfaceTemperatureC === undefined || surfaceTemperatureC === null
    ? profile.thetaK[0]
    : potentialTemperatureK(surfaceTemperatureC, profile.pressureHpa[0]);
}

/**
 * Mixing height above ground, m, at the profile's surface temperature or at a given (afternoon)
 * surface temperature, °C.
 */
export function mixingHeightAglM(profile: PreparedProfile, surfaceTemperatureC?: number | null): number {
  return mixingHeightForParcelThetaAglM(profile.heightAglM, profile.thetaK, surfaceParcelThetaK(profile, surfaceTemperatureC));
}
