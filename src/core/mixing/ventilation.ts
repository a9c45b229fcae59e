/** Ventilation index, m²/s: mixing height × transport wind speed (DESIGN.md). */
export function ventilationM2s(mixingHeightAglM: number, transportWindSpeedMs: number): number {
  return mixingHeightAglM * transportWindSpeedMs;
}
