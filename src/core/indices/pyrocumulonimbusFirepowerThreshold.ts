import type { PyrocumulonimbusFirepowerReport } from '../analysisResult.ts';
import { KAPPA, ZERO_CELSIUS_K } from '../constants.ts';
import { heightAglAtPressureM } from '../parcels/heightAtPressure.ts';
import type { PreparedProfile } from '../profile.ts';
import { boltonLclTemperatureK, equivalentPotentialTemperatureK, saturatedEquivalentPotentialTemperatureK } from '../thermo/equivalentPotentialTemperature.ts';
import { dewpointFromVapourPressureC, vapourPressureFromMixingRatioHpa } from '../thermo/vapour.ts';

/**
 * Pyrocumulonimbus Firepower Threshold, PFT (Tory and Kepert 2021, Wea. Forecasting 36, 439–456):
 * the smallest fire power, GW, whose plume reaches a free-convection height zfc warm and moist enough
 * to rise freely as a deep moist cloud.
 *
 * 1. Mixed layer: the mass-weighted mean θ and mixing ratio from the surface up to the first level
 *    above the LCL of that mean (the authors' mixed layer reaches its own condensation level).
 *    Simplification: the authors weight each layer also by its height; we weight by mass only.
 * 2. Plume: heated by a fraction β, θpl = (1 + β) θML, with fire moisture wpl = wML + β φ θML,
 *    φ = 6×10⁻⁵ kg/kg/K (their ratio of fire moisture to heat). The plume's condensation points
 *    for growing β form their saturation-point curve.
 * 3. Free convection: the smallest β for which the saturated plume, rising from its condensation
 *    point, is warmer than the environment at every level up to the level where the environment is
 *    −20 °C (their electrification limit; the profile top if it is lower): its θe is at least the
 *    environment's saturated θe (Bolton 1980 eq. 43) everywhere in that range. The authors compare
 *    saturation specific entropy; θe is the same ordering of pseudo-adiabats. Their minimum extra
 *    buoyancy 0.002 is added: βFC = β + 0.002, ΔθFC = βFC θML, zfc and pfc from the condensation point.
 * 4. Firepower from Briggs's bent-over plume (their eqs. 25–28): plume radius βe z with βe = 0.4;
 *    zb = zfc / (1 + βe cos φ30) is the centre-line height at which 30 % of the plume cross-section
 *    reaches zfc (cos φ30 = 0.3197, the circle-cut geometry); pC the pressure at zb, interpolated
 *    linearly in height between the surface and pfc;
 *        PFT = (π/κ) (pC/θfc) (βe zb)² U ΔθFC   [W, with pC in Pa]
 *    U is the magnitude of the mean vector wind of the mixed-layer levels, at least 1 m/s.
 *    Simplification: the mean vertical motion term of their iteration for zb is left out (a profile
 *    has no vertical motion); with it zero their iteration gives this closed form.
 * gw is null when no plume within reach of the profile frees itself (then zfc, pfc and Δθ are null).
 */
export const PFT_BRIGGS_ENTRAINMENT = 0.4;
export const PFT_COS_PHI_30_PERCENT = 0.3197;
export const PFT_FIRE_MOISTURE_TO_HEAT_KGKGK = 6e-5;
export const PFT_MINIMUM_EXTRA_BETA = 0.002;
export const PFT_MINIMUM_WIND_MS = 1;
export const PFT_ELECTRIFICATION_TEMPERATURE_C = -20;
const MAX_BETA = 0.3;
/** 20 halvings of 0.3 leave β within 3e-7, Δθ within 0.0001 K. */
const BISECTION_STEPS = 20;

/** The closed form of step 4, W: exported for checks of the formula on its own. */
export function firepowerThresholdW(freeConvectionHeightAglM: number, freeConvectionPressureHpa: number, surfacePressureHpa: number, thetaFcK: number, meanWindMs: number, thetaExcessK: number): number {
  const centreLineHeightM = freeConvectionHeightAglM / (1 + PFT_BRIGGS_ENTRAINMENT * PFT_COS_PHI_30_PERCENT);
  const centreLinePressurePa =
    100 * (surfacePressureHpa + ((freeConvectionPressureHpa - surfacePressureHpa) * centreLineHeightM) / freeConvectionHeightAglM);
  const plumeRadiusM = PFT_BRIGGS_ENTRAINMENT * centreLineHeightM;
  return (Math.PI / KAPPA) * (centreLinePressurePa / thetaFcK) * plumeRadiusM * plumeRadiusM * meanWindMs * thetaExcessK;
}

interface CondensationPoint {
  pressureHpa: number;
  thetaEK: number;
}

/** Condensation point (Bolton 1980 eq. 15 for its temperature) and θe of air with θ and w. */
function condensationPoint(thetaK: number, mixingRatioKgKg: number, into: CondensationPoint): CondensationPoint {
  // At 1000 hPa the temperature equals θ, so the parcel is evaluated there.
  const temperatureC = thetaK - ZERO_CELSIUS_K;
  const dewpointC = Math.min(temperatureC, dewpointFromVapourPressureC(vapourPressureFromMixingRatioHpa(mixingRatioKgKg, 1000)));
  const lclTemperatureK = boltonLclTemperatureK(temperatureC, dewpointC);
  into.pressureHpa = 1000 * Math.pow(lclTemperatureK / thetaK, 1 / KAPPA);
  into.thetaEK = equivalentPotentialTemperatureK(temperatureC, dewpointC, 1000);
  return into;
}

export function pyrocumulonimbusFirepowerThreshold(profile: PreparedProfile, mixingRatioKgKg: Float64Array): PyrocumulonimbusFirepowerReport {
  const p = profile.pressureHpa;
  const count = p.length;
  const point: CondensationPoint = { pressureHpa: 0, thetaEK: 0 };

  // 1. The mixed layer, grown level by level until it reaches its own condensation level.
  let thetaSum = 0;
  let mixingRatioSum = 0;
  let topIndex = -1;
  let thetaMlK = profile.thetaK[0];
  let mixingRatioMl = mixingRatioKgKg[0];
  for (let index = 1; index < count; index++) {
    const weight = (p[index - 1] - p[index]) / 2;
    thetaSum += weight * (profile.thetaK[index - 1] + profile.thetaK[index]);
    mixingRatioSum += weight * (mixingRatioKgKg[index - 1] + mixingRatioKgKg[index]);
    thetaMlK = thetaSum / (p[0] - p[index]);
    mixingRatioMl = mixingRatioSum / (p[0] - p[index]);
    if (condensationPoint(thetaMlK, mixingRatioMl, point).pressureHpa > p[index]) {
      topIndex = index;
      break;
    }
  }
  const report: PyrocumulonimbusFirepowerReport = {
    gw: null,
    freeConvectionHeightAglM: null,
    freeConvectionPressureHpa: null,
    thetaExcessK: null,
    meanWindMs: null,
    mixedLayerThetaK: thetaMlK,
    mixedLayerMixingRatioGkg: 1000 * mixingRatioMl,
  };
  if (topIndex < 0) return report;

  let meanU = 0;
  let meanV = 0;
  for (let index = 0; index <= topIndex; index++) {
    meanU += profile.windUMs[index];
    meanV += profile.windVMs[index];
  }
  const meanWindMs = Math.max(PFT_MINIMUM_WIND_MS, Math.hypot(meanU, meanV) / (topIndex + 1));
  report.meanWindMs = meanWindMs;

  // 3. The environment's saturated θe, and its running maximum from the top limit downward.
  let limitPressureHpa = p[count - 1];
  for (let index = 1; index < count; index++) {
    if (profile.temperatureC[index] <= PFT_ELECTRIFICATION_TEMPERATURE_C) {
      const f = (PFT_ELECTRIFICATION_TEMPERATURE_C - profile.temperatureC[index - 1]) / (profile.temperatureC[index] - profile.temperatureC[index - 1]);
      limitPressureHpa = p[index - 1] * Math.pow(p[index] / p[index - 1], f);
      break;
    }
  }
  // Only levels up to the first one above the limit are ever read.
  let lastNeeded = 1;
  while (lastNeeded < count - 1 && p[lastNeeded] > limitPressureHpa) lastNeeded++;
  const saturatedThetaEK = new Float64Array(count).fill(-Infinity);
  for (let index = 0; index <= lastNeeded; index++) {
    saturatedThetaEK[index] = saturatedEquivalentPotentialTemperatureK(profile.temperatureC[index], p[index]);
  }
  const thetaEsAt = (pressureHpa: number): number => {
    let upper = 1;
    while (upper < count - 1 && p[upper] > pressureHpa) upper++;
    const f = Math.log(p[upper - 1] / pressureHpa) / Math.log(p[upper - 1] / p[upper]);
    return saturatedThetaEK[upper - 1] + f * (saturatedThetaEK[upper] - saturatedThetaEK[upper - 1]);
  };
  const maxAboveFromTop = new Float64Array(count).fill(-Infinity);
  const limitThetaEK = thetaEsAt(limitPressureHpa);
  let running = limitThetaEK;
  for (let index = count - 1; index >= 0; index--) {
    if (p[index] >= limitPressureHpa) running = Math.max(running, saturatedThetaEK[index]);
    maxAboveFromTop[index] = running;
  }
  // Largest environmental θes between a condensation pressure and the limit.
  const requiredThetaEK = (condensationPressureHpa: number): number => {
    if (condensationPressureHpa <= limitPressureHpa) return limitThetaEK;
    let index = 0;
    while (index < count && p[index] >= condensationPressureHpa) index++;
    const here = condensationPressureHpa >= p[0] ? saturatedThetaEK[0] : thetaEsAt(condensationPressureHpa);
    return Math.max(here, index < count ? maxAboveFromTop[index] : limitThetaEK);
  };
  const excessThetaE = (beta: number): number => {
    condensationPoint((1 + beta) * thetaMlK, mixingRatioMl + beta * PFT_FIRE_MOISTURE_TO_HEAT_KGKGK * thetaMlK, point);
    return point.thetaEK - requiredThetaEK(point.pressureHpa);
  };

  // The plume's θe grows with β while the range it must clear shrinks: the excess is monotone, so bisect.
  let betaSp = 0;
  if (excessThetaE(0) < 0) {
    if (excessThetaE(MAX_BETA) < 0) return report;
    let low = 0;
    let high = MAX_BETA;
    for (let stepIndex = 0; stepIndex < BISECTION_STEPS; stepIndex++) {
      const middle = (low + high) / 2;
      if (excessThetaE(middle) < 0) low = middle;
      else high = middle;
    }
    betaSp = high;
  }
  const betaFc = betaSp + PFT_MINIMUM_EXTRA_BETA;
  const thetaFcK = (1 + betaFc) * thetaMlK;
  condensationPoint(thetaFcK, mixingRatioMl + betaFc * PFT_FIRE_MOISTURE_TO_HEAT_KGKGK * thetaMlK, point);
  const pfcHpa = Math.min(point.pressureHpa, p[0]);
  if (pfcHpa < p[count - 1]) return report;
  const zfcM = heightAglAtPressureM(profile, pfcHpa);
  const thetaExcessK = betaFc * thetaMlK;
  report.freeConvectionPressureHpa = pfcHpa;
  report.freeConvectionHeightAglM = zfcM;
  report.thetaExcessK = thetaExcessK;
  report.gw = zfcM > 0 ? firepowerThresholdW(zfcM, pfcHpa, p[0], thetaFcK, meanWindMs, thetaExcessK) / 1e9 : 0;
  return report;
}
