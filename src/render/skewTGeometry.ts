/**
 * Geometry of our skew-T log-p chart: log-pressure upward, isotherms skewed 45° to the right.
 * The guide curves (dry and moist adiabats, mixing-ratio lines) are drawn from textbook formulas
 * by a plain integration here; they are a visual guide only. The science the bot reports lives in
 * src/core.
 */
export interface SkewTFrame {
  leftPx: number;
  topPx: number;
  widthPx: number;
  heightPx: number;
  bottomPressureHpa: number;
  topPressureHpa: number;
  /** Temperatures at the bottom-left and bottom-right corners. */
  leftTemperatureC: number;
  rightTemperatureC: number;
}

export const DEFAULT_SKEWT_FRAME: SkewTFrame = {
  leftPx: 62,
  topPx: 64,
  widthPx: 580,
  heightPx: 640,
  bottomPressureHpa: 1050,
  topPressureHpa: 200,
  leftTemperatureC: -25,
  rightTemperatureC: 55,
};

/** Vertical position of a pressure: linear in ln p. */
export function yOfPressure(frame: SkewTFrame, pressureHpa: number): number {
  const span = Math.log(frame.bottomPressureHpa) - Math.log(frame.topPressureHpa);
  const fraction = (Math.log(frame.bottomPressureHpa) - Math.log(pressureHpa)) / span;
  return frame.topPx + frame.heightPx * (1 - fraction);
}

/** Horizontal position: temperature scale plus one pixel right per pixel up (45° isotherms). */
export function xOfTemperature(frame: SkewTFrame, temperatureC: number, pressureHpa: number): number {
  const pxPerC = frame.widthPx / (frame.rightTemperatureC - frame.leftTemperatureC);
  const rise = frame.topPx + frame.heightPx - yOfPressure(frame, pressureHpa);
  return frame.leftPx + (temperatureC - frame.leftTemperatureC) * pxPerC + rise;
}

export function pointOf(frame: SkewTFrame, temperatureC: number, pressureHpa: number): [number, number] {
  return [xOfTemperature(frame, temperatureC, pressureHpa), yOfPressure(frame, pressureHpa)];
}

const KAPPA = 0.2857; // Rd/cp for dry air
const RD = 287.04; // J kg⁻¹ K⁻¹
const CPD = 1005.7; // J kg⁻¹ K⁻¹
const LV = 2.501e6; // J kg⁻¹
const EPSILON = 0.622;

/** Temperature on the dry adiabat of potential temperature thetaK. */
export function dryAdiabatTemperatureC(thetaK: number, pressureHpa: number): number {
  return thetaK * (pressureHpa / 1000) ** KAPPA - 273.15;
}

/** Saturation vapour pressure over water, hPa (Bolton 1980). */
export function saturationVapourPressureHpa(temperatureC: number): number {
  return 6.112 * Math.exp((17.67 * temperatureC) / (temperatureC + 243.5));
}

/** Dew point of air with mixing ratio mixingRatioGkg at a pressure (inverse of Bolton's form). */
export function dewpointForMixingRatioC(mixingRatioGkg: number, pressureHpa: number): number {
  const w = mixingRatioGkg / 1000;
  const vapourHpa = (w * pressureHpa) / (EPSILON + w);
  const ln = Math.log(vapourHpa / 6.112);
  return (243.5 * ln) / (17.67 - ln);
}

/** dT/dp along a pseudo-adiabat, K per hPa. */
function moistSlopeKPerHpa(temperatureK: number, pressureHpa: number): number {
  const es = saturationVapourPressureHpa(temperatureK - 273.15);
  const rs = (EPSILON * es) / Math.max(pressureHpa - es, 1e-3);
  const numerator = RD * temperatureK + LV * rs;
  const denominator = CPD + (LV * LV * rs * EPSILON) / (RD * temperatureK * temperatureK);
  return numerator / (denominator * pressureHpa);
}

/**
 * Points along a pseudo-adiabat from (startTemperatureC, startPressureHpa) to endPressureHpa,
 * by midpoint steps of at most 10 hPa.
 */
export function moistAdiabatPath(startTemperatureC: number, startPressureHpa: number, endPressureHpa: number): Array<{ pressureHpa: number; temperatureC: number }> {
  const steps = Math.max(1, Math.ceil(Math.abs(endPressureHpa - startPressureHpa) / 10));
  const dp = (endPressureHpa - startPressureHpa) / steps;
  let temperatureK = startTemperatureC + 273.15;
  let pressureHpa = startPressureHpa;
  const path = [{ pressureHpa, temperatureC: startTemperatureC }];
  for (let step = 0; step < steps; step += 1) {
    const half = temperatureK + 0.5 * dp * moistSlopeKPerHpa(temperatureK, pressureHpa);
    temperatureK += dp * moistSlopeKPerHpa(half, pressureHpa + 0.5 * dp);
    pressureHpa += dp;
    path.push({ pressureHpa, temperatureC: temperatureK - 273.15 });
  }
  return path;
}

/** Pressures from bottom to top of the frame, for sampling a guide curve. */
export function samplePressures(frame: SkewTFrame, stepHpa = 10): number[] {
  const pressures: number[] = [];
  for (let p = frame.bottomPressureHpa; p > frame.topPressureHpa; p -= stepHpa) pressures.push(p);
  pressures.push(frame.topPressureHpa);
  return pressures;
}
