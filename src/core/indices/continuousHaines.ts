import type { ContinuousHainesReport } from '../analysisResult.ts';
import { valueAtPressure } from '../interpolateInLogPressure.ts';
import type { PreparedProfile } from '../profile.ts';

/**
 * Continuous Haines index, C-Haines (Mills and McCaw 2010, CAWCR Technical Report 20):
 *   CA = 0.5 (T850 − T700) − 2
 *   CB = (T850 − Td850)/3 − 1, with the depression capped at 30 °C first, and above 5 the excess
 *        halved: CB = 5 + (CB − 5)/2
 *   C-Haines = CA + CB
 * Unlike the original index the differences are not rounded. Written 0.3333 in the report; 1/3 here.
 */
export function continuousHainesFromValues(temperature850C: number, temperature700C: number, dewpoint850C: number): ContinuousHainesReport {
  const ca = 0.5 * (temperature850C - temperature700C) - 2;
  const depressionC = Math.min(30, temperature850C - dewpoint850C);
  let cb = depressionC / 3 - 1;
  if (cb > 5) cb = 5 + (cb - 5) / 2;
  return { ca, cb, total: ca + cb };
}

/** C-Haines of a profile; null when 850 hPa is under the ground or 700 hPa above the top. */
export function continuousHaines(profile: PreparedProfile): ContinuousHainesReport | null {
  const p = profile.pressureHpa;
  const temperature850C = valueAtPressure(p, profile.temperatureC, 850);
  const temperature700C = valueAtPressure(p, profile.temperatureC, 700);
  const dewpoint850C = valueAtPressure(p, profile.dewpointC, 850);
  if (temperature850C === null || temperature700C === null || dewpoint850C === null) return null;
  return continuousHainesFromValues(temperature850C, temperature700C, dewpoint850C);
}
