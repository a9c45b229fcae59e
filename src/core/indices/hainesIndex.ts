import type { HainesReport, HainesScore, LayerClass } from '../analysisResult.ts';
import { DRY_ADIABATIC_LAPSE_RATE_C_PER_KM } from '../constants.ts';
import { valueAtPressure } from '../interpolateInLogPressure.ts';
import { classifyLapseRate } from '../layers/classifyLayer.ts';
import type { PreparedProfile } from '../profile.ts';
import { pseudoAdiabaticLapseRateCPerKm } from '../thermo/pseudoAdiabat.ts';
import { HAINES_VARIANTS, hainesTermScore, wholeDegreesC, type HainesVariant, type HainesVariantDefinition } from './hainesCategories.ts';

export const HAINES_LABEL = 'dryness-and-lapse-rate index (not a stability measure)';

/** Terrain elevation limits of the variants (common practice, from memory): 1000 ft and 3000 ft. */
export const HAINES_LOW_TO_MID_ELEVATION_M = 304.8;
export const HAINES_MID_TO_HIGH_ELEVATION_M = 914.4;

const ORDER: readonly HainesVariant[] = ['low', 'mid', 'high'];
const STABLE_CLASSES: ReadonlySet<LayerClass> = new Set(['stable', 'isothermal', 'inversion']);

/** The variant the terrain elevation calls for: low below 1000 ft, mid to 3000 ft, high above. */
export function hainesVariantForElevation(elevationM: number): HainesVariant {
  if (elevationM < HAINES_LOW_TO_MID_ELEVATION_M) return 'low';
  if (elevationM <= HAINES_MID_TO_HIGH_ELEVATION_M) return 'mid';
  return 'high';
}

/**
 * One variant's score, or null when one of its levels is not in the air of this profile (under the
 * ground, or above the top). Temperatures, dew points and heights at the standard pressures are
 * linear in ln p between levels. The layer's real class uses its lapse rate from heights and the
 * pseudo-adiabatic rate at its mean temperature and pressure (DESIGN.md).
 */
export function hainesScore(profile: PreparedProfile, definition: HainesVariantDefinition): HainesScore | null {
  const p = profile.pressureHpa;
  const baseTemperatureC = valueAtPressure(p, profile.temperatureC, definition.basePressureHpa);
  const topTemperatureC = valueAtPressure(p, profile.temperatureC, definition.topPressureHpa);
  const moistureTemperatureC = valueAtPressure(p, profile.temperatureC, definition.moisturePressureHpa);
  const moistureDewpointC = valueAtPressure(p, profile.dewpointC, definition.moisturePressureHpa);
  const baseHeightM = valueAtPressure(p, profile.heightAglM, definition.basePressureHpa);
  const topHeightM = valueAtPressure(p, profile.heightAglM, definition.topPressureHpa);
  if (
    baseTemperatureC === null || topTemperatureC === null || moistureTemperatureC === null ||
    moistureDewpointC === null || baseHeightM === null || topHeightM === null
  ) {
    return null;
  }
  const lapseDifferenceC = wholeDegreesC(baseTemperatureC - topTemperatureC);
  const dewpointDepressionC = wholeDegreesC(moistureTemperatureC - moistureDewpointC);
  const a = hainesTermScore(lapseDifferenceC, definition.lapseLimitsC);
  const b = hainesTermScore(dewpointDepressionC, definition.moistureLimitsC);
  const layerLapseRateCPerKm = (1000 * (baseTemperatureC - topTemperatureC)) / (topHeightM - baseHeightM);
  const moistLapseRateCPerKm = pseudoAdiabaticLapseRateCPerKm(
    (baseTemperatureC + topTemperatureC) / 2,
    (definition.basePressureHpa + definition.topPressureHpa) / 2,
  );
  return {
    a,
    b,
    total: a + b,
    lapseDifferenceC,
    dewpointDepressionC,
    layerClass: classifyLapseRate(layerLapseRateCPerKm, moistLapseRateCPerKm),
  };
}

/**
 * The Haines Index (Haines 1988) of a profile: all three variants where their levels are above the
 * ground, the variant for this point by its terrain elevation (or the next higher one when that
 * variant's base is under the ground), a label that never calls it a stability measure, and a plain
 * note when its lapse term scores 2 or 3 on a layer that is in fact stable.
 */
export function hainesIndex(profile: PreparedProfile): HainesReport {
  const scores = {
    low: hainesScore(profile, HAINES_VARIANTS[0]),
    mid: hainesScore(profile, HAINES_VARIANTS[1]),
    high: hainesScore(profile, HAINES_VARIANTS[2]),
  };
  const surfacePressureHpa = profile.pressureHpa[0];
  const byElevation = hainesVariantForElevation(profile.elevationM);
  let variant = byElevation;
  let variantNote: string | null = null;
  for (let order = ORDER.indexOf(byElevation); order < ORDER.length; order++) {
    const definition = HAINES_VARIANTS[order];
    variant = definition.variant;
    if (definition.basePressureHpa <= surfacePressureHpa) break;
    if (order === ORDER.length - 1) {
      variantNote = `No Haines variant fits: even 700 hPa is below the ground here (surface ${formatHpa(surfacePressureHpa)} hPa).`;
    }
  }
  if (variant !== byElevation && variantNote === null) {
    const skipped = HAINES_VARIANTS[ORDER.indexOf(byElevation)];
    variantNote =
      `Elevation ${Math.round(profile.elevationM)} m calls for the ${byElevation} variant, but ${skipped.basePressureHpa} hPa ` +
      `is below the ground here (surface ${formatHpa(surfacePressureHpa)} hPa); the ${variant} variant is used.`;
  }
  return {
    variant,
    variantNote,
    low: scores.low,
    mid: scores.mid,
    high: scores.high,
    label: HAINES_LABEL,
    stableLayerNote: stableLayerNote(profile, variant, scores[variant]),
  };
}

function stableLayerNote(profile: PreparedProfile, variant: HainesVariant, score: HainesScore | null): string | null {
  if (score === null || score.a < 2 || !STABLE_CLASSES.has(score.layerClass)) return null;
  const definition = HAINES_VARIANTS[ORDER.indexOf(variant)];
  const p = profile.pressureHpa;
  const baseT = valueAtPressure(p, profile.temperatureC, definition.basePressureHpa) as number;
  const topT = valueAtPressure(p, profile.temperatureC, definition.topPressureHpa) as number;
  const baseZ = valueAtPressure(p, profile.heightAglM, definition.basePressureHpa) as number;
  const topZ = valueAtPressure(p, profile.heightAglM, definition.topPressureHpa) as number;
  const lapseRate = (1000 * (baseT - topT)) / (topZ - baseZ);
  return (
    `Lapse term scores ${score.a} but the ${definition.basePressureHpa}–${definition.topPressureHpa} hPa layer is ` +
    `${score.layerClass === 'inversion' ? 'an inversion' : score.layerClass} (${lapseRate.toFixed(1)} °C/km; dry adiabat ${DRY_ADIABATIC_LAPSE_RATE_C_PER_KM.toFixed(1)}).`
  );
}

function formatHpa(pressureHpa: number): string {
  return (Math.round(pressureHpa * 10) / 10).toString();
}
