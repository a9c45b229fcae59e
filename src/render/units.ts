import { z } from 'zod';

/**
 * A channel's unit system.
 * - 'metric': heights in m, wind in km/h (the unit fire-weather forecasts in metric countries
 *   commonly use for wind; common practice), temperature in °C, ventilation in m²/s.
 * - 'us' (US customary): heights in ft, wind in mph, temperature in °F, ventilation in kt-ft
 *   (knot-feet, as US fire-weather forecasts state it; common practice).
 * Both: lapse rate in °C/km (the unit the project's science definitions use), pressure in hPa,
 * relative humidity in %, PFT in GW, HDW and the Haines indices as unitless numbers.
 */
export type UnitSystem = 'metric' | 'us';

export const unitSystemSchema = z.enum(['metric', 'us']);

const FEET_PER_METRE = 3.280839895;
const KMH_PER_MS = 3.6;
const MPH_PER_MS = 2.2369362921;
const KNOTS_PER_MS = 1.9438444924;

const grouped = new Intl.NumberFormat('en-US', { maximumFractionDigits: 0 });

function finiteOr(value: number, format: (v: number) => string): string {
  return Number.isFinite(value) ? format(value) : 'n/a';
}

/** Rounds to a step and never prints "-0". */
function roundTo(value: number, step: number): number {
  const rounded = Math.round(value / step) * step;
  return rounded === 0 ? 0 : rounded;
}

export function metresToFeet(heightM: number): number {
  return heightM * FEET_PER_METRE;
}

export function celsiusToFahrenheit(temperatureC: number): number {
  return (temperatureC * 9) / 5 + 32;
}

export function fahrenheitToCelsius(temperatureF: number): number {
  return ((temperatureF - 32) * 5) / 9;
}

/** Height to the nearest 10 m or 10 ft: "2,450 m" / "8,040 ft". */
export function formatHeight(heightM: number, system: UnitSystem): string {
  return finiteOr(heightM, (h) =>
    system === 'us' ? `${grouped.format(roundTo(metresToFeet(h), 10))} ft` : `${grouped.format(roundTo(h, 10))} m`,
  );
}

/** Height above ground: "2,450 m AGL". */
export function formatHeightAgl(heightAglM: number, system: UnitSystem): string {
  return `${formatHeight(heightAglM, system)} AGL`;
}

/** The unit a height axis uses in this system. */
export function heightUnitLabel(system: UnitSystem): string {
  return system === 'us' ? 'ft' : 'm';
}

/** Converts metres to the system's height unit (for chart axes). */
export function heightInSystemUnit(heightM: number, system: UnitSystem): number {
  return system === 'us' ? metresToFeet(heightM) : heightM;
}

/** Wind speed, whole units: "28 km/h" / "17 mph". */
export function formatWindSpeed(windSpeedMs: number, system: UnitSystem): string {
  return finiteOr(windSpeedMs, (s) =>
    system === 'us' ? `${roundTo(s * MPH_PER_MS, 1)} mph` : `${roundTo(s * KMH_PER_MS, 1)} km/h`,
  );
}

const COMPASS_16 = ['N', 'NNE', 'NE', 'ENE', 'E', 'ESE', 'SE', 'SSE', 'S', 'SSW', 'SW', 'WSW', 'W', 'WNW', 'NW', 'NNW'];

/** The 16-point compass name of a direction the wind blows from. */
export function compassPoint(dirDeg: number): string {
  if (!Number.isFinite(dirDeg)) return '?';
  const normalised = ((dirDeg % 360) + 360) % 360;
  return COMPASS_16[Math.round(normalised / 22.5) % 16];
}

/** Wind from a direction: "SW 28 km/h". */
export function formatWind(wind: { speedMs: number; dirDeg: number }, system: UnitSystem): string {
  return `${compassPoint(wind.dirDeg)} ${formatWindSpeed(wind.speedMs, system)}`;
}

/** Temperature, whole degrees: "31 °C" / "88 °F". */
export function formatTemperature(temperatureC: number, system: UnitSystem): string {
  return finiteOr(temperatureC, (t) =>
    system === 'us' ? `${roundTo(celsiusToFahrenheit(t), 1)} °F` : `${roundTo(t, 1)} °C`,
  );
}

/** Lapse rate in °C/km in both systems, one decimal: "9.4 °C/km". */
export function formatLapseRate(lapseRateCPerKm: number): string {
  return finiteOr(lapseRateCPerKm, (l) => `${roundTo(l, 0.1).toFixed(1)} °C/km`);
}

/** Ventilation: "106,000 m²/s" / "676,000 kt-ft", to three significant figures. */
export function formatVentilation(ventilationM2s: number, system: UnitSystem): string {
  return finiteOr(ventilationM2s, (v) => {
    const inUnit = system === 'us' ? v * KNOTS_PER_MS * FEET_PER_METRE : v;
    const step = inUnit >= 1000 ? 10 ** (Math.floor(Math.log10(inUnit)) - 2) : 10;
    return `${grouped.format(roundTo(inUnit, step))} ${system === 'us' ? 'kt-ft' : 'm²/s'}`;
  });
}

/** Relative humidity, whole percent: "9%". */
export function formatRelativeHumidity(relativeHumidityPct: number): string {
  return finiteOr(relativeHumidityPct, (rh) => `${roundTo(rh, 1)}%`);
}

/** Hot-Dry-Windy Index: unitless in practice (formally hPa·m/s), whole number. */
export function formatHdw(hdw: number): string {
  return finiteOr(hdw, (h) => grouped.format(roundTo(h, 1)));
}

/** PyroCb Firepower Threshold: "1.8 GW"; null means no pyroCb is possible within the profile. */
export function formatPft(pftGw: number | null): string {
  if (pftGw === null) return 'none possible in the profile';
  return finiteOr(pftGw, (g) => `${g >= 10 ? grouped.format(roundTo(g, 1)) : roundTo(g, 0.1).toFixed(1)} GW`);
}

export function formatPressure(pressureHpa: number): string {
  return finiteOr(pressureHpa, (p) => `${grouped.format(roundTo(p, 1))} hPa`);
}

/** Continuous Haines, one decimal, unitless. */
export function formatCHaines(cHaines: number): string {
  return finiteOr(cHaines, (c) => roundTo(c, 0.1).toFixed(1));
}
