import type { WindReport } from '../analysisResult.ts';
import type { PreparedProfile } from '../profile.ts';
import { windReportFromComponents } from './windFromComponents.ts';

/**
 * Transport wind: the mean wind vector through the mixed layer (DESIGN.md), each component
 * averaged over height with the trapezoid rule and the wind at the mixing height interpolated
 * linearly in height. A mixed layer of no depth has the surface wind.
 */
export function transportWind(profile: PreparedProfile, mixingHeightAglM: number): WindReport {
  const { heightAglM, windUMs, windVMs } = profile;
  if (!(mixingHeightAglM > heightAglM[0])) return windReportFromComponents(windUMs[0], windVMs[0]);
  let uIntegral = 0;
  let vIntegral = 0;
  for (let i = 0; i < heightAglM.length - 1; i++) {
    const baseM = heightAglM[i];
    if (baseM >= mixingHeightAglM) break;
    const fullDepthM = heightAglM[i + 1] - baseM;
    const topM = Math.min(heightAglM[i + 1], mixingHeightAglM);
    const fraction = (topM - baseM) / fullDepthM;
    const uTop = windUMs[i] + fraction * (windUMs[i + 1] - windUMs[i]);
    const vTop = windVMs[i] + fraction * (windVMs[i + 1] - windVMs[i]);
    uIntegral += 0.5 * (windUMs[i] + uTop) * (topM - baseM);
    vIntegral += 0.5 * (windVMs[i] + vTop) * (topM - baseM);
  }
  const depthM = mixingHeightAglM - heightAglM[0];
  return windReportFromComponents(uIntegral / depthM, vIntegral / depthM);
}
