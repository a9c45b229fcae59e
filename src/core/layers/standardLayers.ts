import type { StandardLayerReport } from '../analysisResult.ts';
import { pressureAtHeight, valueAtHeight, valueAtPressure } from '../interpolateInLogPressure.ts';
import type { PreparedProfile } from '../profile.ts';
import { layerReport } from './layerReport.ts';

/** Height-bounded standard layers, m above ground (issue 2). */
const HEIGHT_LAYERS: ReadonlyArray<readonly [name: string, baseAglM: number, topAglM: number]> = [
  ['sfc-1km', 0, 1000],
  ['1-3km', 1000, 3000],
  ['3-6km', 3000, 6000],
];

/** Pressure-bounded standard layers, hPa: the layers of the three Haines variants (Haines 1988). */
const PRESSURE_LAYERS: ReadonlyArray<readonly [name: string, basePressureHpa: number, topPressureHpa: number]> = [
  ['950-850hPa', 950, 850],
  ['850-700hPa', 850, 700],
  ['700-500hPa', 700, 500],
];

/**
 * The standard layers that lie wholly in the profile and above the ground. Temperature at a height
 * bound is interpolated linearly in height; at a pressure bound, temperature and height are
 * interpolated linearly in ln p.
 */
export function standardLayers(profile: PreparedProfile): StandardLayerReport[] {
  const { pressureHpa, heightAglM, temperatureC } = profile;
  const layers: StandardLayerReport[] = [];
  for (const [name, baseAglM, topAglM] of HEIGHT_LAYERS) {
    const baseTemperatureC = valueAtHeight(heightAglM, temperatureC, baseAglM);
    const topTemperatureC = valueAtHeight(heightAglM, temperatureC, topAglM);
    const basePressureHpa = pressureAtHeight(heightAglM, pressureHpa, baseAglM);
    const topPressureHpa = pressureAtHeight(heightAglM, pressureHpa, topAglM);
    if (baseTemperatureC === null || topTemperatureC === null || basePressureHpa === null || topPressureHpa === null) continue;
    layers.push({ name, ...layerReport(basePressureHpa, topPressureHpa, baseAglM, topAglM, baseTemperatureC, topTemperatureC) });
  }
  for (const [name, basePressureHpa, topPressureHpa] of PRESSURE_LAYERS) {
    const baseTemperatureC = valueAtPressure(pressureHpa, temperatureC, basePressureHpa);
    const topTemperatureC = valueAtPressure(pressureHpa, temperatureC, topPressureHpa);
    const baseAglM = valueAtPressure(pressureHpa, heightAglM, basePressureHpa);
    const topAglM = valueAtPressure(pressureHpa, heightAglM, topPressureHpa);
    if (baseTemperatureC === null || topTemperatureC === null || baseAglM === null || topAglM === null) continue;
    layers.push({ name, ...layerReport(basePressureHpa, topPressureHpa, baseAglM, topAglM, baseTemperatureC, topTemperatureC) });
  }
  return layers;
}
