/** Lapse rate −ΔT/Δz of a layer, °C/km: positive when temperature falls with height (DESIGN.md). */
export function lapseRateCPerKm(baseTemperatureC: number, topTemperatureC: number, baseHeightM: number, topHeightM: number): number {
  return (1000 * (baseTemperatureC - topTemperatureC)) / (topHeightM - baseHeightM);
}
