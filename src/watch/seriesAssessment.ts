import type { AnalysisResult, DryNearAdiabaticLayer, WindReport } from '../core/analysisResult.ts';

/** What the series assessment keeps of each forecast hour. */
export interface HourAssessment {
  validTime: string;
  /** Local wall-clock time at the location, ISO 8601 with offset. */
  localTime: string;
  mixingHeightAglM: number;
  effectiveMixingHeightAglM: number;
  /** True when the mixed layer reaches a dry near-dry-adiabatic layer this hour. */
  coupled: boolean;
  dryNearAdiabaticLayers: DryNearAdiabaticLayer[];
  transportWind: WindReport;
  ventilationM2s: number;
  hdw: number;
  cHaines: number;
  pftGw: number | null;
  lclHeightAglM: number;
  plumeCloudPossible: boolean;
  mixedLayerMinRelativeHumidityPct: number;
  hainesTotal: number;
  hainesVariant: 'low' | 'mid' | 'high';
  surfaceTemperatureC: number;
  surfaceRelativeHumidityPct: number;
  /** The full analysis, for the detail view; dropped when a series is serialised compactly. */
  analysis?: AnalysisResult;
}

export interface DaySummary {
  /** Local date, YYYY-MM-DD. */
  localDate: string;
  peakMixingHeightAglM: number;
  peakMixingHour: string;
  /** First local hour the mixed layer reaches a dry near-dry-adiabatic layer; null if it does not. */
  couplingHour: string | null;
  driestHour: string;
  minMixedLayerRelativeHumidityPct: number;
  windiestHour: string;
  maxTransportWindMs: number;
  maxHdw: number;
  maxHdwHour: string;
  minPftGw: number | null;
  minPftHour: string | null;
}

export interface SeriesAssessment {
  location: { latitude: number; longitude: number; elevationM: number; name?: string };
  timeZone: string;
  sourceName: string;
  model: string;
  runTime: string;
  invented: boolean;
  hours: HourAssessment[];
  days: DaySummary[];
}
