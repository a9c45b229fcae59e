import type { PreparedProfile } from '../profile.ts';

/**
 * Height above ground, m, at a pressure: linear in ln p between the bracketing levels (the
 * hypsometric equation for a layer of constant mean virtual temperature). Above the top level the
 * last layer's ln p slope is extended, so a parcel level just above a shallow profile still gets a
 * height; the surface is the floor.
 */
export function heightAglAtPressureM(profile: PreparedProfile, targetPressureHpa: number): number {
  const pressures = profile.pressureHpa;
  const heights = profile.heightAglM;
  const last = pressures.length - 1;
  if (targetPressureHpa >= pressures[0]) return heights[0];
  let upper = 1;
  while (upper < last && pressures[upper] > targetPressureHpa) upper++;
  const lower = upper - 1;
  const fraction = Math.log(pressures[lower] / targetPressureHpa) / Math.log(pressures[lower] / pressures[upper]);
  return heights[lower] + fraction * (heights[upper] - heights[lower]);
}
