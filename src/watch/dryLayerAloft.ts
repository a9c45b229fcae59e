import type { DryNearAdiabaticLayer } from '../core/analysisResult.ts';
import type { HourAssessment } from './seriesAssessment.ts';

import { GROUND_BASED_LAYER_MAX_BASE_AGL_M } from '../core/mixing/coupling.ts';

export { GROUND_BASED_LAYER_MAX_BASE_AGL_M };

/** The lowest dry near-dry-adiabatic layer whose base is above the ground, or null. */
export function lowestDryLayerAloft(layers: readonly DryNearAdiabaticLayer[]): DryNearAdiabaticLayer | null {
  for (const layer of layers) if (layer.baseAglM > GROUND_BASED_LAYER_MAX_BASE_AGL_M) return layer;
  return null;
}

/**
 * Marks, hour by hour, the dry layer aloft the mixed layer has to reach and whether it has (the
 * coupling DESIGN.md describes: the mixing height at or above the layer's base). Two things need
 * the hours before:
 * - Once the mixed layer has run through the layer aloft, that hour's profile no longer shows a
 *   layer aloft (the mixed layer has taken it in, and the dry layer found there starts at the
 *   ground). The layer seen last is kept while only ground-based dry layers remain, so the
 *   coupling lasts as long as the mixing does.
 * - A ground-based dry layer on its own is not something to reach: without a layer aloft now or
 *   remembered, there is nothing to couple with.
 * Changes the hours in place; they must be in time order.
 */
export function markCouplingAloft(hours: HourAssessment[]): void {
  let remembered: DryNearAdiabaticLayer | null = null;
  for (const hour of hours) {
    const aloft = lowestDryLayerAloft(hour.dryNearAdiabaticLayers);
    if (aloft) remembered = aloft;
    else if (hour.dryNearAdiabaticLayers.length === 0) remembered = null;
    const target = aloft ?? remembered;
    hour.dryLayerAloftBaseAglM = target ? target.baseAglM : null;
    hour.coupled = target !== null && hour.mixingHeightAglM >= target.baseAglM;
    hour.coupledLayer = hour.coupled ? target : null;
  }
}
