/**
 * Category tables of the Haines Index (Haines 1988, National Weather Digest 13(2), 23–27). Each
 * term is scored 1, 2 or 3 from a whole-degree difference: below the first limit 1, from the first
 * limit up to the second (exclusive) 2, from the second limit 3.
 *
 *   variant  lapse term A (°C)          moisture term B (°C)
 *   low      T950−T850: <4, 4–7, ≥8     Tdd850: <6, 6–9, ≥10
 *   mid      T850−T700: <6, 6–10, ≥11   Tdd850: <6, 6–12, ≥13
 *   high     T700−T500: <18, 18–21, ≥22 Tdd700: <15, 15–20, ≥21
 */
export type HainesVariant = 'low' | 'mid' | 'high';

export interface HainesVariantDefinition {
  variant: HainesVariant;
  /** Pressure of the base and top of the lapse layer, hPa. */
  basePressureHpa: number;
  topPressureHpa: number;
  /** Pressure where the dew point depression is read, hPa. */
  moisturePressureHpa: number;
  /** Whole-degree limits at which the lapse term becomes 2 and 3. */
  lapseLimitsC: readonly [number, number];
  /** Whole-degree limits at which the moisture term becomes 2 and 3. */
  moistureLimitsC: readonly [number, number];
}

export const HAINES_VARIANTS: readonly HainesVariantDefinition[] = [
  { variant: 'low', basePressureHpa: 950, topPressureHpa: 850, moisturePressureHpa: 850, lapseLimitsC: [4, 8], moistureLimitsC: [6, 10] },
  { variant: 'mid', basePressureHpa: 850, topPressureHpa: 700, moisturePressureHpa: 850, lapseLimitsC: [6, 11], moistureLimitsC: [6, 13] },
  { variant: 'high', basePressureHpa: 700, topPressureHpa: 500, moisturePressureHpa: 700, lapseLimitsC: [18, 22], moistureLimitsC: [15, 21] },
];

/**
 * A difference in whole degrees, as Haines tabulated it: rounded to the nearest degree, halves
 * upward (7.5 → 8). The inner rounding to 1e-6 keeps 7.4999999999 from arithmetic noise at 8 too.
 */
export function wholeDegreesC(differenceC: number): number {
  // + 0 turns −0 (from −0.4) into 0.
  return Math.round(Math.round(differenceC * 1e6) / 1e6) + 0;
}

/** Score 1, 2 or 3 of a whole-degree difference against a term's two limits. */
export function hainesTermScore(wholeDegreeDifferenceC: number, limitsC: readonly [number, number]): number {
  if (wholeDegreeDifferenceC >= limitsC[1]) return 3;
  if (wholeDegreeDifferenceC >= limitsC[0]) return 2;
  return 1;
}
