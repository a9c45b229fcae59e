import type { PreparedProfile } from '../profile.ts';
import { vapourPressureDeficitHpa } from '../thermo/vapour.ts';

/** Depth of the layer the Hot-Dry-Windy Index looks at, m above ground (Srock et al. 2018). */
export const HOT_DRY_WINDY_DEPTH_M = 500;

export interface HotDryWindyReport {
  /** HDW, hPa·m/s. */
  hdw: number;
  maxVapourPressureDeficitHpa: number;
  maxWindSpeedMs: number;
}

/**
 * Hot-Dry-Windy Index (Srock, Charney, Potter and Goodrick 2018, Atmosphere 9, 279, eq. 1):
 * HDW = max(VPD) × max(U) over the levels in the lowest 500 m above ground, each maximum taken on its
 * own; VPD in hPa (es(T) − e(Td), Bolton 1980 eq. 10), U the wind speed in m/s. The surface counts
 * as a level, and the 500 m point itself is included, interpolated linearly in height.
 */
export function hotDryWindyIndex(profile: PreparedProfile): HotDryWindyReport {
  const heights = profile.heightAglM;
  const count = heights.length;
  let maxVpd = 0;
  let maxSpeed = 0;
  for (let index = 0; index < count && heights[index] <= HOT_DRY_WINDY_DEPTH_M; index++) {
    const vpd = vapourPressureDeficitHpa(profile.temperatureC[index], profile.dewpointC[index]);
    const speed = Math.hypot(profile.windUMs[index], profile.windVMs[index]);
    if (vpd > maxVpd) maxVpd = vpd;
    if (speed > maxSpeed) maxSpeed = speed;
  }
  for (let index = 1; index < count; index++) {
    if (heights[index] > HOT_DRY_WINDY_DEPTH_M) {
      if (heights[index - 1] < HOT_DRY_WINDY_DEPTH_M) {
        const f = (HOT_DRY_WINDY_DEPTH_M - heights[index - 1]) / (heights[index] - heights[index - 1]);
        const at = (values: Float64Array): number => values[index - 1] + f * (values[index] - values[index - 1]);
        const vpd = vapourPressureDeficitHpa(at(profile.temperatureC), at(profile.dewpointC));
        const speed = Math.hypot(at(profile.windUMs), at(profile.windVMs));
        if (vpd > maxVpd) maxVpd = vpd;
        if (speed > maxSpeed) maxSpeed = speed;
      }
      break;
    }
  }
  return { hdw: maxVpd * maxSpeed, maxVapourPressureDeficitHpa: maxVpd, maxWindSpeedMs: maxSpeed };
}
