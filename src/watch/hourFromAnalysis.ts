import type { AnalysisResult } from '../core/analysisResult.ts';
import type { HourAssessment } from './seriesAssessment.ts';

/** What the series keeps of one hour's full analysis; the analysis itself only when asked. */
export function hourFromAnalysis(analysis: AnalysisResult, localTime: string, keepAnalysis: boolean): HourAssessment {
  const mixing = analysis.mixingHeight;
  const haines = analysis.haines;
  const hainesScore = haines[haines.variant];
  const hour: HourAssessment = {
    validTime: analysis.validTime,
    localTime,
    mixingHeightAglM: mixing.aglM,
    mixingReachesProfileTop: mixing.reachesProfileTop ?? false,
    effectiveMixingHeightAglM: mixing.effectiveAglM,
    // Coupling with a layer aloft needs the hours before; markCouplingAloft sets these for the series.
    coupled: false,
    coupledLayer: null,
    dryLayerAloftBaseAglM: null,
    dryNearAdiabaticLayers: analysis.dryNearAdiabaticLayers,
    transportWind: analysis.transportWind,
    ventilationM2s: analysis.ventilationM2s,
    hdw: analysis.hdw,
    cHaines: analysis.cHaines ? analysis.cHaines.total : null,
    pftGw: analysis.pft.gw,
    lclHeightAglM: analysis.parcels.surface.lclHeightAglM,
    plumeCloudPossible: analysis.plumeCloudPossible,
    mixedLayerMinRelativeHumidityPct: analysis.mixedLayerMinRelativeHumidityPct,
    // A variant that could not be scored (its levels are under the ground) reads as 0, never as a high value.
    hainesTotal: hainesScore ? hainesScore.total : 0,
    hainesVariant: haines.variant,
    surfaceTemperatureC: analysis.levels[0].temperatureC,
    surfaceRelativeHumidityPct: analysis.levels[0].relativeHumidityPct,
  };
  if (keepAnalysis) hour.analysis = analysis;
  return hour;
}
