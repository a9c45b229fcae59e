import type { LayerClass } from '../analysisResult.ts';
import { DRY_ADIABATIC_LAPSE_RATE_C_PER_KM } from '../constants.ts';

/** Below this lapse rate (°C/km) a layer with Γ ≥ 0 is called isothermal (project definition, DESIGN.md). */
export const ISOTHERMAL_LIMIT_C_PER_KM = 0.5;
/** From this lapse rate (°C/km) a layer is near-dry-adiabatic (project definition, DESIGN.md). */
export const NEAR_DRY_ADIABATIC_LIMIT_C_PER_KM = 9.0;

/**
 * Class of a layer from its lapse rate Γ and the moist (pseudo-adiabatic) rate Γm at its mean
 * temperature and pressure (DESIGN.md). The bands are tested from the top down, so in very cold air,
 * where Γm itself exceeds 9.0 °C/km, a layer with Γ ≥ 9.0 is still near-dry-adiabatic: that is the
 * band the fire-weather reader needs to see, and it is the same test the dry-layer search uses.
 */
export function classifyLapseRate(lapseRateCPerKm: number, moistLapseRateCPerKm: number): LayerClass {
  if (lapseRateCPerKm > DRY_ADIABATIC_LAPSE_RATE_C_PER_KM) return 'absolutely-unstable';
  if (lapseRateCPerKm >= NEAR_DRY_ADIABATIC_LIMIT_C_PER_KM) return 'near-dry-adiabatic';
  if (lapseRateCPerKm < 0) return 'inversion';
  if (lapseRateCPerKm < ISOTHERMAL_LIMIT_C_PER_KM) return 'isothermal';
  if (lapseRateCPerKm < moistLapseRateCPerKm) return 'stable';
  return 'conditionally-unstable';
}
