import type { DryNearAdiabaticLayer } from '../analysisResult.ts';

export interface Coupling {
  effectiveAglM: number;
  /** Index of the highest dry layer aloft the mixed layer reaches, null when it reaches none. */
  coupledLayerIndex: number | null;
}

/**
 * Coupling (DESIGN.md): once the mixing height is at or above a dry near-dry-adiabatic layer's base,
 * the mixed layer runs through it and the effective mixing height is its top; from there the next
 * layer up may be reached in turn. The layers come ordered from the ground up.
 *
 * Only layers ALOFT count. A dry layer that starts at the ground is the sun-heated mixed layer
 * itself (dry and near-dry-adiabatic by construction in the afternoon): "reaching" it would flag
 * coupling every late morning. Its top never exceeds the parcel mixing height by much, so skipping it
 * changes no effective height; a merged mixed-plus-residual layer is tracked across hours by the
 * series assessment.
 */
export function coupleMixedLayer(mixingHeightAglM: number, dryLayers: readonly DryNearAdiabaticLayer[]): Coupling {
  let effectiveAglM = mixingHeightAglM;
  let coupledLayerIndex: number | null = null;
  for (let i = 0; i < dryLayers.length; i++) {
    const layer = dryLayers[i];
    if (layer.baseAglM <= 0) continue;
    if (effectiveAglM < layer.baseAglM) break;
    coupledLayerIndex = i;
    if (layer.topAglM > effectiveAglM) effectiveAglM = layer.topAglM;
  }
  return { effectiveAglM, coupledLayerIndex };
}
