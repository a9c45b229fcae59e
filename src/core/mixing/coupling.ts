import type { DryNearAdiabaticLayer } from '../analysisResult.ts';

/**
 * A dry near-dry-adiabatic layer that starts this close to the ground is the heated surface layer
 * itself, not a layer aloft for the mixed layer to reach. 50 m is our choice: a little above the
 * lowest model levels.
 */
export const GROUND_BASED_LAYER_MAX_BASE_AGL_M = 50;

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
 * Only layers ALOFT count. A dry layer that starts at (or within 50 m of) the ground is the sun-heated mixed layer
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
    if (layer.baseAglM <= GROUND_BASED_LAYER_MAX_BASE_AGL_M) continue;
    if (effectiveAglM < layer.baseAglM) break;
    coupledLayerIndex = i;
    if (layer.topAglM > effectiveAglM) effectiveAglM = layer.topAglM;
  }
  return { effectiveAglM, coupledLayerIndex };
}
