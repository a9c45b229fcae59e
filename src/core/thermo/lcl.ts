import { KAPPA, ZERO_CELSIUS_K } from '../constants.ts';
import { boltonLclTemperatureK } from './equivalentPotentialTemperature.ts';
import { dewpointFromVapourPressureC, mixingRatioKgKg, vapourPressureFromMixingRatioHpa } from './vapour.ts';

export interface LiftingCondensationLevel {
  pressureHpa: number;
  temperatureC: number;
}

const TOLERANCE_HPA = 1e-4;
const MAX_ITERATIONS = 50;

/**
 * Lifting condensation level of a parcel, found by iteration (not a rule of thumb): the pressure
 * where the parcel's dry adiabat meets the dew point of its conserved mixing ratio, with the same
 * saturation vapour pressure (Bolton 1980 eq. 10) the rest of the code uses. Bolton's eq. 15 gives the
 * starting guess; the fixed point p = p0 (Td(p)/T0)^(1/κ) then converges in a few steps.
 */
export function liftingCondensationLevel(pressureHpa: number, temperatureC: number, dewpointC: number): LiftingCondensationLevel {
  const temperatureK = temperatureC + ZERO_CELSIUS_K;
  const mixingRatio = mixingRatioKgKg(dewpointC, pressureHpa);
  if (dewpointC >= temperatureC) return { pressureHpa, temperatureC };
  let lclPressureHpa = pressureHpa * Math.pow(boltonLclTemperatureK(temperatureC, dewpointC) / temperatureK, 1 / KAPPA);
  for (let iteration = 0; iteration < MAX_ITERATIONS; iteration++) {
    const dewpointAtLevelK =
      dewpointFromVapourPressureC(vapourPressureFromMixingRatioHpa(mixingRatio, lclPressureHpa)) + ZERO_CELSIUS_K;
    const nextPressureHpa = pressureHpa * Math.pow(dewpointAtLevelK / temperatureK, 1 / KAPPA);
    const change = Math.abs(nextPressureHpa - lclPressureHpa);
    lclPressureHpa = nextPressureHpa;
    if (change < TOLERANCE_HPA) break;
  }
  const lclTemperatureC = temperatureK * Math.pow(lclPressureHpa / pressureHpa, KAPPA) - ZERO_CELSIUS_K;
  return { pressureHpa: lclPressureHpa, temperatureC: lclTemperatureC };
}
