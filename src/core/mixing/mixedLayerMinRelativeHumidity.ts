import type { PreparedProfile } from '../profile.ts';
import { relativeHumidityPct } from '../thermo/vapour.ts';

/**
 * Lowest relative humidity, %, from the surface to the mixing height: every level inside, and the
 * mixing height itself with temperature and dew point interpolated linearly in height.
 */
export function mixedLayerMinRelativeHumidityPct(profile: PreparedProfile, levelRelativeHumidityPct: Float64Array, mixingHeightAglM: number): number {
  const { heightAglM, temperatureC, dewpointC } = profile;
  let minimumPct = levelRelativeHumidityPct[0];
  for (let i = 1; i < heightAglM.length; i++) {
    if (heightAglM[i] <= mixingHeightAglM) {
      if (levelRelativeHumidityPct[i] < minimumPct) minimumPct = levelRelativeHumidityPct[i];
      continue;
    }
    if (mixingHeightAglM > heightAglM[i - 1]) {
      const fraction = (mixingHeightAglM - heightAglM[i - 1]) / (heightAglM[i] - heightAglM[i - 1]);
      const topTemperatureC = temperatureC[i - 1] + fraction * (temperatureC[i] - temperatureC[i - 1]);
      const topDewpointC = dewpointC[i - 1] + fraction * (dewpointC[i] - dewpointC[i - 1]);
      const topPct = relativeHumidityPct(topTemperatureC, topDewpointC);
      if (topPct < minimumPct) minimumPct = topPct;
    }
    break;
  }
  return minimumPct;
}
