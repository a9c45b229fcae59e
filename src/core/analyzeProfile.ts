import type { AnalysisResult, LevelReport } from './analysisResult.ts';
import { withSurfaceTemperature } from './afternoonProfile.ts';
import { pressureAtHeight } from './interpolateInLogPressure.ts';
import { dryNearAdiabaticLayers } from './layers/dryNearAdiabaticLayers.ts';
import { levelPairLayers } from './layers/levelPairLayers.ts';
import { standardLayers } from './layers/standardLayers.ts';
import { coupleMixedLayer } from './mixing/coupling.ts';
import { mixedLayerMinRelativeHumidityPct } from './mixing/mixedLayerMinRelativeHumidity.ts';
import { mixingHeightForParcelThetaAglM, parcelMixesThroughProfile } from './mixing/mixingHeight.ts';
import { transportWind } from './mixing/transportWind.ts';
import { ventilationM2s } from './mixing/ventilation.ts';
import { windReportFromComponents } from './mixing/windFromComponents.ts';
import { analyzeParcelsAndIndices } from './parcelsAndIndices.ts';
import { prepareProfile } from './prepareProfile.ts';
import type { PreparedProfile, ProfileInput } from './profile.ts';
import { relativeHumidityPct } from './thermo/vapour.ts';

export interface AnalyzeOptions {
  /**
   * An afternoon surface temperature, °C: the analysis of the afternoon. The profile as forecast
   * still describes the air: `levels`, `layers`, `standardLayers` and `dryNearAdiabaticLayers`
   * (with their trigger temperatures) are those of the profile, unchanged. Everything that starts
   * from the surface air is computed with the surface temperature replaced by this one (the
   * surface θ follows; the surface dew point is kept unless it would exceed the new temperature,
   * then it is capped at it): the mixing height and with it the coupling, transport wind,
   * ventilation, mixed-layer minimum RH and plume-cloud flag; the surface parcel (`lcl`,
   * `parcels.surface`); the mixed-layer parcel (its lowest 100 hPa include the surface); DCAPE,
   * precipitable water, HDW and PFT where they read the surface level. Haines and C-Haines read
   * pressure levels above the ground and do not change unless the surface is one of those levels.
   * `mixingHeight.surfaceTemperatureC` and `options.surfaceTemperatureC` say which was used.
   */
  surfaceTemperatureC?: number | null;
  /** Lift parcels with the virtual temperature correction (default true). */
  virtualTemperature?: boolean;
}

/**
 * The full read of one prepared profile. Pure; every array it reads belongs to the profile and is
 * not changed.
 */
export function analyzeProfile(preparedProfile: PreparedProfile, options: AnalyzeOptions = {}): AnalysisResult {
  const surfaceTemperatureC = options.surfaceTemperatureC ?? null;
  const virtualTemperature = options.virtualTemperature ?? true;
  // `forecast` is the air as given; `surfaceAir` is the same with the afternoon surface, when one is given.
  const forecast = preparedProfile;
  const surfaceAir = surfaceTemperatureC === null ? forecast : withSurfaceTemperature(forecast, surfaceTemperatureC);
  const count = forecast.pressureHpa.length;

  const levelRelativeHumidityPct = new Float64Array(count);
  for (let i = 0; i < count; i++) levelRelativeHumidityPct[i] = relativeHumidityPct(forecast.temperatureC[i], forecast.dewpointC[i]);
  const dryLayers = dryNearAdiabaticLayers(forecast, levelRelativeHumidityPct);

  const parcelThetaK = surfaceAir.thetaK[0];
  const mixingAglM = mixingHeightForParcelThetaAglM(surfaceAir.heightAglM, surfaceAir.thetaK, parcelThetaK);
  const coupling = coupleMixedLayer(mixingAglM, dryLayers);
  const wind = transportWind(surfaceAir, mixingAglM);
  let mixedLayerRelativeHumidityPct = levelRelativeHumidityPct;
  if (surfaceAir !== forecast) {
    mixedLayerRelativeHumidityPct = Float64Array.from(levelRelativeHumidityPct);
    mixedLayerRelativeHumidityPct[0] = relativeHumidityPct(surfaceAir.temperatureC[0], surfaceAir.dewpointC[0]);
  }

  const parcelsAndIndices = analyzeParcelsAndIndices(surfaceAir, { virtualTemperature });

  return {
    name: forecast.name,
    validTime: forecast.validTime,
    latitude: forecast.latitude,
    longitude: forecast.longitude,
    elevationM: forecast.elevationM,
    options: { surfaceTemperatureC, virtualTemperature },
    levels: levelReports(forecast, levelRelativeHumidityPct),
    lcl: parcelsAndIndices.lcl,
    layers: levelPairLayers(forecast),
    standardLayers: standardLayers(forecast),
    dryNearAdiabaticLayers: dryLayers,
    mixingHeight: {
      aglM: mixingAglM,
      reachesProfileTop: parcelMixesThroughProfile(surfaceAir.thetaK, parcelThetaK),
      mslM: mixingAglM + forecast.elevationM,
      pressureHpa: pressureAtHeight(forecast.heightAglM, forecast.pressureHpa, mixingAglM) ?? forecast.pressureHpa[count - 1],
      surfaceTemperatureC: surfaceAir.temperatureC[0],
      effectiveAglM: coupling.effectiveAglM,
      coupledLayerIndex: coupling.coupledLayerIndex,
    },
    transportWind: wind,
    ventilationM2s: ventilationM2s(mixingAglM, wind.speedMs),
    mixedLayerMinRelativeHumidityPct: mixedLayerMinRelativeHumidityPct(surfaceAir, mixedLayerRelativeHumidityPct, mixingAglM),
    plumeCloudPossible: mixingAglM >= parcelsAndIndices.parcels.surface.lclHeightAglM,
    haines: parcelsAndIndices.haines,
    cHaines: parcelsAndIndices.cHaines,
    hdw: parcelsAndIndices.hdw,
    hdwInputs: parcelsAndIndices.hdwInputs,
    parcels: parcelsAndIndices.parcels,
    dcapeJkg: parcelsAndIndices.dcapeJkg,
    precipitableWaterMm: parcelsAndIndices.precipitableWaterMm,
    pft: parcelsAndIndices.pft,
  };
}

function levelReports(profile: PreparedProfile, levelRelativeHumidityPct: Float64Array): LevelReport[] {
  const levels: LevelReport[] = new Array(profile.pressureHpa.length);
  for (let i = 0; i < levels.length; i++) {
    const wind = windReportFromComponents(profile.windUMs[i], profile.windVMs[i]);
    levels[i] = {
      pressureHpa: profile.pressureHpa[i],
      heightAglM: profile.heightAglM[i],
      heightMslM: profile.heightMslM[i],
      temperatureC: profile.temperatureC[i],
      dewpointC: profile.dewpointC[i],
      relativeHumidityPct: levelRelativeHumidityPct[i],
      thetaK: profile.thetaK[i],
      windDirDeg: wind.dirDeg,
      windSpeedMs: wind.speedMs,
    };
  }
  return levels;
}

/** Lowest and highest afternoon surface temperature accepted, °C (the profile file's own range). */
const SURFACE_TEMPERATURE_RANGE_C = [-100, 60] as const;

export type AnalyzeInputResult = { ok: true; result: AnalysisResult } | { ok: false; errors: string[] };

/** For callers holding a raw profile: quality control, then the analysis, or the reasons it cannot be done. */
export function analyzeProfileInput(input: ProfileInput, options: AnalyzeOptions = {}): AnalyzeInputResult {
  const surfaceTemperatureC = options.surfaceTemperatureC;
  if (
    surfaceTemperatureC !== undefined &&
    surfaceTemperatureC !== null &&
    !(Number.isFinite(surfaceTemperatureC) && surfaceTemperatureC >= SURFACE_TEMPERATURE_RANGE_C[0] && surfaceTemperatureC <= SURFACE_TEMPERATURE_RANGE_C[1])
  ) {
    return {
      ok: false,
      errors: [`surface temperature ${surfaceTemperatureC} °C: must be a number between ${SURFACE_TEMPERATURE_RANGE_C[0]} and ${SURFACE_TEMPERATURE_RANGE_C[1]} °C`],
    };
  }
  const prepared = prepareProfile(input);
  if (!prepared.ok) return { ok: false, errors: prepared.errors };
  return { ok: true, result: analyzeProfile(prepared.profile, options) };
}
