import type { WindReport } from '../analysisResult.ts';

/** Below this speed, m/s, a wind has no meaningful direction; it is reported as calm from 0°. */
const CALM_SPEED_MS = 1e-9;

/** Speed and the direction the wind blows FROM, degrees true (meteorological convention), of u and v. */
export function windReportFromComponents(windUMs: number, windVMs: number): WindReport {
  const speedMs = Math.hypot(windUMs, windVMs);
  if (speedMs < CALM_SPEED_MS) return { speedMs: 0, dirDeg: 0 };
  const dirDeg = (Math.atan2(-windUMs, -windVMs) * 180) / Math.PI;
  return { speedMs, dirDeg: dirDeg < 0 ? dirDeg + 360 : dirDeg };
}
