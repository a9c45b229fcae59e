import { DRY_AIR_GAS_CONSTANT_JKGK } from '../constants.ts';

/**
 * Buoyant energy, J/kg, of one layer where the parcel-minus-environment temperature difference
 * varies linearly in ln p from bottomDifferenceK to topDifferenceK: Rd ∫ (Tvp − Tve) d ln p, the
 * hydrostatic form of g ∫ (Tvp − Tve)/Tve dz (Doswell and Rasmussen 1994, eq. 1; Emanuel 1994 §6.3).
 * The two signs are split at the zero crossing, so a layer that changes sign gives both parts.
 */
export interface SignedArea {
  positiveJkg: number;
  negativeJkg: number;
  /** Fraction of the layer's ln p depth, from the bottom, where the difference crosses zero; −1 if it does not. */
  crossingFraction: number;
}

export function layerBuoyancyArea(bottomDifferenceK: number, topDifferenceK: number, lnPressureDepth: number, into: SignedArea): SignedArea {
  into.positiveJkg = 0;
  into.negativeJkg = 0;
  into.crossingFraction = -1;
  const scale = DRY_AIR_GAS_CONSTANT_JKGK * lnPressureDepth;
  if ((bottomDifferenceK >= 0 && topDifferenceK >= 0) || (bottomDifferenceK <= 0 && topDifferenceK <= 0)) {
    const area = (scale * (bottomDifferenceK + topDifferenceK)) / 2;
    if (area > 0) into.positiveJkg = area;
    else into.negativeJkg = area;
    return into;
  }
  const fraction = bottomDifferenceK / (bottomDifferenceK - topDifferenceK);
  const bottomPart = (scale * bottomDifferenceK * fraction) / 2;
  const topPart = (scale * topDifferenceK * (1 - fraction)) / 2;
  into.crossingFraction = fraction;
  if (bottomPart > 0) {
    into.positiveJkg = bottomPart;
    into.negativeJkg = topPart;
  } else {
    into.positiveJkg = topPart;
    into.negativeJkg = bottomPart;
  }
  return into;
}
