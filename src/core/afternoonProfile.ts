import type { PreparedProfile } from './profile.ts';
import { potentialTemperatureK } from './thermo/potentialTemperature.ts';

/**
 * The profile as it stands once the surface has warmed (or cooled) to a given temperature: only
 * the surface level changes. Its temperature is replaced, its θ follows, and its dew point is kept
 * (the afternoon's moisture is not known) unless it would exceed the new temperature, when it is
 * capped at it. Levels above the surface are untouched; arrays that do not change are shared.
 */
export function withSurfaceTemperature(profile: PreparedProfile, surfaceTemperatureC: number): PreparedProfile {
  const temperatureC = Float64Array.from(profile.temperatureC);
  const dewpointC = Float64Array.from(profile.dewpointC);
  const thetaK = Float64Array.from(profile.thetaK);
  temperatureC[0] = surfaceTemperatureC;
  dewpointC[0] = Math.min(dewpointC[0], surfaceTemperatureC);
  thetaK[0] = potentialTemperatureK(surfaceTemperatureC, profile.pressureHpa[0]);
  return { ...profile, temperatureC, dewpointC, thetaK };
}
