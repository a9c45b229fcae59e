import { liftingCondensationLevel } from './lcl.ts';
import { temperatureOnPseudoAdiabatC } from './pseudoAdiabat.ts';

/**
 * Wet-bulb temperature, °C, by Normand's rule: lift the air dry-adiabatically to its LCL, then bring
 * it back down the pseudo-adiabat to its own pressure. This is the (pseudo-)adiabatic wet-bulb
 * temperature; it differs from the isobaric wet-bulb by a few hundredths of a kelvin.
 */
export function wetBulbTemperatureC(pressureHpa: number, temperatureC: number, dewpointC: number): number {
  const lcl = liftingCondensationLevel(pressureHpa, temperatureC, dewpointC);
  return temperatureOnPseudoAdiabatC(lcl.temperatureC, lcl.pressureHpa, pressureHpa);
}
