import type { AnalysisResult } from './analysisResult.ts';
import { continuousHaines } from './indices/continuousHaines.ts';
import { hainesIndex } from './indices/hainesIndex.ts';
import { hotDryWindyIndex } from './indices/hotDryWindyIndex.ts';
import { pyrocumulonimbusFirepowerThreshold } from './indices/pyrocumulonimbusFirepowerThreshold.ts';
import { downdraftCapeJkg } from './parcels/downdraftCape.ts';
import { environmentColumns } from './parcels/environmentColumns.ts';
import { liftParcel, liftParcelWithLclTemperature } from './parcels/liftParcel.ts';
import { mixedLayerMeans } from './parcels/mixedLayerParcel.ts';
import { precipitableWaterMm } from './parcels/precipitableWater.ts';
import type { PreparedProfile } from './profile.ts';

/**
 * The parcel and index part of the analysis. cHaines is null where 850 hPa is under the ground or
 * 700 hPa above the profile top: C-Haines is defined on those two levels only (Mills and McCaw 2010).
 */
export type ParcelsAndIndices = Pick<
  AnalysisResult,
  'lcl' | 'parcels' | 'dcapeJkg' | 'precipitableWaterMm' | 'haines' | 'cHaines' | 'hdw' | 'hdwInputs' | 'pft'
>;

export interface ParcelsAndIndicesOptions {
  /** Lift with the virtual temperature correction (Doswell and Rasmussen 1994). */
  virtualTemperature: boolean;
}

/**
 * Surface-based and mixed-layer parcels, downdraft CAPE, precipitable water, Haines, C-Haines,
 * Hot-Dry-Windy Index and the pyroCb firepower threshold of one prepared profile. Pure.
 */
export function analyzeParcelsAndIndices(profile: PreparedProfile, options: ParcelsAndIndicesOptions): ParcelsAndIndices {
  const environment = environmentColumns(profile, options.virtualTemperature);
  const surfaceLift = liftParcelWithLclTemperature(profile, environment, profile.temperatureC[0], profile.dewpointC[0]);
  const surfaceParcel = surfaceLift.report;
  const mixedLayer = mixedLayerMeans(profile, environment.mixingRatioKgKg);
  const mixedLayerParcel = liftParcel(profile, environment, mixedLayer.startTemperatureC, mixedLayer.startDewpointC);
  const hdw = hotDryWindyIndex(profile);
  return {
    lcl: { pressureHpa: surfaceParcel.lclPressureHpa, temperatureC: surfaceLift.lclTemperatureC, heightAglM: surfaceParcel.lclHeightAglM },
    parcels: { surface: surfaceParcel, mixedLayer: mixedLayerParcel },
    dcapeJkg: downdraftCapeJkg(profile, environment),
    precipitableWaterMm: precipitableWaterMm(profile.pressureHpa, environment.mixingRatioKgKg),
    haines: hainesIndex(profile),
    cHaines: continuousHaines(profile),
    hdw: hdw.hdw,
    hdwInputs: { maxVapourPressureDeficitHpa: hdw.maxVapourPressureDeficitHpa, maxWindSpeedMs: hdw.maxWindSpeedMs },
    pft: pyrocumulonimbusFirepowerThreshold(profile, environment.mixingRatioKgKg),
  };
}
