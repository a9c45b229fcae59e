import type { DryNearAdiabaticLayer } from '../analysisResult.ts';
import type { PreparedProfile } from '../profile.ts';
import { triggerTemperatureC } from '../mixing/triggerTemperature.ts';
import { NEAR_DRY_ADIABATIC_LIMIT_C_PER_KM } from './classifyLayer.ts';
import { lapseRateCPerKm } from './lapseRate.ts';

/** Relative humidity, %, at or below which both ends of a level pair count as dry (DESIGN.md). */
export const DRY_LAYER_MAX_RELATIVE_HUMIDITY_PCT = 40;
/** Shallowest merged dry layer kept, m (DESIGN.md). */
export const DRY_LAYER_MIN_DEPTH_M = 500;

/**
 * The dry near-dry-adiabatic layers (DESIGN.md): runs of consecutive level pairs, each with
 * Γ ≥ 9.0 °C/km and RH ≤ 40 % at both ends, merged and kept when at least 500 m deep. The mean lapse
 * rate is that of the merged layer end to end; the humidity reported is the largest at its levels.
 */
export function dryNearAdiabaticLayers(profile: PreparedProfile, levelRelativeHumidityPct: Float64Array): DryNearAdiabaticLayer[] {
  const { heightAglM, temperatureC } = profile;
  const layers: DryNearAdiabaticLayer[] = [];
  let runBase = -1;
  for (let i = 0; i < heightAglM.length - 1; i++) {
    const qualifies =
      lapseRateCPerKm(temperatureC[i], temperatureC[i + 1], heightAglM[i], heightAglM[i + 1]) >= NEAR_DRY_ADIABATIC_LIMIT_C_PER_KM &&
      levelRelativeHumidityPct[i] <= DRY_LAYER_MAX_RELATIVE_HUMIDITY_PCT &&
      levelRelativeHumidityPct[i + 1] <= DRY_LAYER_MAX_RELATIVE_HUMIDITY_PCT;
    if (qualifies && runBase < 0) runBase = i;
    if (!qualifies && runBase >= 0) {
      pushIfDeep(layers, profile, levelRelativeHumidityPct, runBase, i);
      runBase = -1;
    }
  }
  if (runBase >= 0) pushIfDeep(layers, profile, levelRelativeHumidityPct, runBase, heightAglM.length - 1);
  return layers;
}

function pushIfDeep(
  layers: DryNearAdiabaticLayer[],
  profile: PreparedProfile,
  levelRelativeHumidityPct: Float64Array,
  baseIndex: number,
  topIndex: number,
): void {
  const { heightAglM, temperatureC, pressureHpa } = profile;
  if (heightAglM[topIndex] - heightAglM[baseIndex] < DRY_LAYER_MIN_DEPTH_M) return;
  let maxRelativeHumidityPct = levelRelativeHumidityPct[baseIndex];
  for (let i = baseIndex + 1; i <= topIndex; i++) {
    if (levelRelativeHumidityPct[i] > maxRelativeHumidityPct) maxRelativeHumidityPct = levelRelativeHumidityPct[i];
  }
  layers.push({
    baseAglM: heightAglM[baseIndex],
    topAglM: heightAglM[topIndex],
    basePressureHpa: pressureHpa[baseIndex],
    topPressureHpa: pressureHpa[topIndex],
    meanLapseRateCPerKm: lapseRateCPerKm(temperatureC[baseIndex], temperatureC[topIndex], heightAglM[baseIndex], heightAglM[topIndex]),
    maxRelativeHumidityPct,
    triggerTemperatureC: triggerTemperatureC(profile, baseIndex),
  });
}
