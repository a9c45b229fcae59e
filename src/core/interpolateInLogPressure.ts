/**
 * Linear interpolation in ln p, the natural vertical coordinate of a hydrostatic profile (height is
 * nearly linear in ln p within a layer). Pressures are in decreasing order, as in PreparedProfile.
 * Returns null outside the profile: a value that is not there is not invented.
 */
export function valueAtPressure(pressureHpa: Float64Array, values: Float64Array, targetPressureHpa: number): number | null {
  const count = pressureHpa.length;
  if (count === 0 || targetPressureHpa > pressureHpa[0] || targetPressureHpa < pressureHpa[count - 1]) return null;
  for (let index = 1; index < count; index++) {
    if (pressureHpa[index] <= targetPressureHpa) {
      const upperPressureHpa = pressureHpa[index];
      const lowerPressureHpa = pressureHpa[index - 1];
      if (upperPressureHpa === targetPressureHpa) return values[index];
      const fraction = Math.log(lowerPressureHpa / targetPressureHpa) / Math.log(lowerPressureHpa / upperPressureHpa);
      return values[index - 1] + fraction * (values[index] - values[index - 1]);
    }
  }
  return values[0];
}

/** Pressure, hPa, at a height, by interpolating ln p linearly in height; null outside the profile. */
export function pressureAtHeight(heightM: Float64Array, pressureHpa: Float64Array, targetHeightM: number): number | null {
  const count = heightM.length;
  if (count === 0 || targetHeightM < heightM[0] || targetHeightM > heightM[count - 1]) return null;
  for (let index = 1; index < count; index++) {
    if (heightM[index] >= targetHeightM) {
      const fraction = (targetHeightM - heightM[index - 1]) / (heightM[index] - heightM[index - 1]);
      return Math.exp(Math.log(pressureHpa[index - 1]) + fraction * Math.log(pressureHpa[index] / pressureHpa[index - 1]));
    }
  }
  return pressureHpa[count - 1];
}

/** Linear interpolation of a field in height; null outside the profile. */
export function valueAtHeight(heightM: Float64Array, values: Float64Array, targetHeightM: number): number | null {
  const count = heightM.length;
  if (count === 0 || targetHeightM < heightM[0] || targetHeightM > heightM[count - 1]) return null;
  for (let index = 1; index < count; index++) {
    if (heightM[index] >= targetHeightM) {
      const fraction = (targetHeightM - heightM[index - 1]) / (heightM[index] - heightM[index - 1]);
      return values[index - 1] + fraction * (values[index] - values[index - 1]);
    }
  }
  return values[count - 1];
}
