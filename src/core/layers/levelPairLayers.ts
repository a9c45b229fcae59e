import type { LayerReport } from '../analysisResult.ts';
import type { PreparedProfile } from '../profile.ts';
import { layerReport } from './layerReport.ts';

/** Every adjacent pair of levels, surface first, as a classed layer. */
export function levelPairLayers(profile: PreparedProfile): LayerReport[] {
  const { pressureHpa, heightAglM, temperatureC } = profile;
  const layers: LayerReport[] = new Array(pressureHpa.length - 1);
  for (let i = 0; i < pressureHpa.length - 1; i++) {
    layers[i] = layerReport(pressureHpa[i], pressureHpa[i + 1], heightAglM[i], heightAglM[i + 1], temperatureC[i], temperatureC[i + 1]);
  }
  return layers;
}
