import { KAPPA, ZERO_CELSIUS_K } from '../constants.ts';
import { mixingRatioKgKg } from './vapour.ts';

/**
 * Temperature at the lifting condensation level, K, from temperature and dew point:
 * Bolton (1980) eq. 15, accurate to 0.1 K. Used only inside θe, where Bolton pairs it with eq. 43;
 * the LCL the project reports comes from the exact iteration in lcl.ts.
 */
export function boltonLclTemperatureK(temperatureC: number, dewpointC: number): number {
  const temperatureK = temperatureC + ZERO_CELSIUS_K;
  const dewpointK = dewpointC + ZERO_CELSIUS_K;
  return 1 / (1 / (dewpointK - 56) + Math.log(temperatureK / dewpointK) / 800) + 56;
}

/**
 * Equivalent potential temperature, K, Bolton (1980) eq. 43 (his most accurate form, 0.3 K),
 * using eq. 15 for the LCL temperature. Pseudo-adiabats are lines of constant θe in this form.
 */
export function equivalentPotentialTemperatureK(temperatureC: number, dewpointC: number, pressureHpa: number): number {
  const temperatureK = temperatureC + ZERO_CELSIUS_K;
  const mixingRatioGkg = 1000 * mixingRatioKgKg(dewpointC, pressureHpa);
  const lclTemperatureK = boltonLclTemperatureK(temperatureC, dewpointC);
  const thetaDryK =
    temperatureK * Math.pow(1000 / pressureHpa, KAPPA * (1 - 0.00028 * mixingRatioGkg));
  return thetaDryK * Math.exp((3.376 / lclTemperatureK - 0.00254) * mixingRatioGkg * (1 + 0.00081 * mixingRatioGkg));
}

/** Saturated equivalent potential temperature, K: θe of saturated air at T and p. */
export function saturatedEquivalentPotentialTemperatureK(temperatureC: number, pressureHpa: number): number {
  return equivalentPotentialTemperatureK(temperatureC, temperatureC, pressureHpa);
}
