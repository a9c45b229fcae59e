/**
 * The full read of one profile: what `analyzeProfile` returns and `lapsewatch analyze --json`
 * prints. Every number names its unit. Absent quantities are null, never NaN.
 */
export type LayerClass =
  | 'inversion'
  | 'isothermal'
  | 'stable'
  | 'conditionally-unstable'
  | 'near-dry-adiabatic'
  | 'absolutely-unstable';

export interface LevelReport {
  pressureHpa: number;
  heightAglM: number;
  heightMslM: number;
  temperatureC: number;
  dewpointC: number;
  relativeHumidityPct: number;
  thetaK: number;
  windDirDeg: number;
  windSpeedMs: number;
}

export interface LayerReport {
  basePressureHpa: number;
  topPressureHpa: number;
  baseAglM: number;
  topAglM: number;
  lapseRateCPerKm: number;
  /** Pseudo-adiabatic lapse rate at the layer's mean temperature and pressure. */
  moistLapseRateCPerKm: number;
  /** lapseRateCPerKm divided by the dry adiabatic lapse rate (9.8 °C/km). */
  ratioToDryAdiabat: number;
  class: LayerClass;
}

export interface StandardLayerReport extends LayerReport {
  /** 'sfc-1km', '1-3km', '3-6km', '950-850hPa', '850-700hPa', '700-500hPa'. */
  name: string;
}

export interface DryNearAdiabaticLayer {
  baseAglM: number;
  topAglM: number;
  basePressureHpa: number;
  topPressureHpa: number;
  meanLapseRateCPerKm: number;
  maxRelativeHumidityPct: number;
  /** Surface temperature at which the mixed layer reaches this layer's base; null if never within the profile. */
  triggerTemperatureC: number | null;
}

export interface MixingReport {
  /** Parcel-method mixing height above ground. */
  aglM: number;
  /** True when no level is warmer in θ than the surface parcel: aglM is the profile top, a lower bound. Always set by analyzeProfile. */
  reachesProfileTop?: boolean;
  mslM: number;
  pressureHpa: number;
  /** Surface temperature used for the parcel (profile's own or the given afternoon value). */
  surfaceTemperatureC: number;
  /** Mixing height after coupling: the top of the highest dry near-dry-adiabatic layer reached, else aglM. */
  effectiveAglM: number;
  /** Index into dryNearAdiabaticLayers of the layer reached, null when none is. */
  coupledLayerIndex: number | null;
}

export interface WindReport {
  speedMs: number;
  /** Direction the wind blows from, degrees true. */
  dirDeg: number;
}

export interface HainesScore {
  a: number;
  b: number;
  total: number;
  /** Whole-degree temperature difference across the variant's layer, °C. */
  lapseDifferenceC: number;
  /** Whole-degree dew point depression at the variant's moisture level, °C. */
  dewpointDepressionC: number;
  /** Class of the variant's layer by its real lapse rate, to set against the index. */
  layerClass: LayerClass;
}

export interface HainesReport {
  /** The variant for this point by its terrain elevation (or the next higher when its lower level is underground). */
  variant: 'low' | 'mid' | 'high';
  /** Plain words when the variant differs from the elevation rule's choice. */
  variantNote: string | null;
  low: HainesScore | null;
  mid: HainesScore | null;
  high: HainesScore | null;
  /** Always "dryness-and-lapse-rate index (not a stability measure)". */
  label: string;
  /** Plain note when the chosen variant's lapse term scores 2 or 3 on a layer that is stable. */
  stableLayerNote: string | null;
}

export interface ContinuousHainesReport {
  /** Stability term CA. */
  ca: number;
  /** Moisture term CB. */
  cb: number;
  total: number;
}

export interface ParcelReport {
  startPressureHpa: number;
  startTemperatureC: number;
  startDewpointC: number;
  capeJkg: number;
  cinJkg: number;
  lclPressureHpa: number;
  lclHeightAglM: number;
  lfcPressureHpa: number | null;
  elPressureHpa: number | null;
}

export interface PyrocumulonimbusFirepowerReport {
  /** Firepower threshold, GW; null when no pyroCb is possible within the profile. */
  gw: number | null;
  /** Inputs, reported as the method asks. */
  freeConvectionHeightAglM: number | null;
  freeConvectionPressureHpa: number | null;
  thetaExcessK: number | null;
  meanWindMs: number | null;
  mixedLayerThetaK: number;
  mixedLayerMixingRatioGkg: number;
}

export interface AnalysisResult {
  name: string;
  validTime: string;
  latitude: number | null;
  longitude: number | null;
  elevationM: number;
  options: { surfaceTemperatureC: number | null; virtualTemperature: boolean };
  levels: LevelReport[];
  lcl: { pressureHpa: number; temperatureC: number; heightAglM: number };
  layers: LayerReport[];
  standardLayers: StandardLayerReport[];
  dryNearAdiabaticLayers: DryNearAdiabaticLayer[];
  mixingHeight: MixingReport;
  transportWind: WindReport;
  ventilationM2s: number;
  mixedLayerMinRelativeHumidityPct: number;
  /** Mixing height at or above the surface parcel's LCL: a plume may build cloud. */
  plumeCloudPossible: boolean;
  haines: HainesReport;
  /** Null where 850 hPa is under the ground (the index reads 850 and 700 hPa). */
  cHaines: ContinuousHainesReport | null;
  /** Hot-Dry-Windy Index, hPa·m/s. */
  hdw: number;
  hdwInputs: { maxVapourPressureDeficitHpa: number; maxWindSpeedMs: number };
  parcels: { surface: ParcelReport; mixedLayer: ParcelReport };
  dcapeJkg: number;
  precipitableWaterMm: number;
  pft: PyrocumulonimbusFirepowerReport;
}
