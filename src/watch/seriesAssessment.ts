import type { AnalysisResult, DryNearAdiabaticLayer, WindReport } from '../core/analysisResult.ts';

/** What the series assessment keeps of each forecast hour. */
export interface HourAssessment {
  validTime: string;
  /** Local wall-clock time at the location, ISO 8601 with offset. */
  localTime: string;
  mixingHeightAglM: number;
  /** True when no level is warmer in θ than the surface parcel: the mixing height is a lower bound. Set by assessSeries. */
  mixingReachesProfileTop?: boolean;
  effectiveMixingHeightAglM: number;
  /**
   * True when the mixed layer reaches a dry near-dry-adiabatic layer aloft this hour (mixing height
   * at or above its base). A dry layer based at the ground is the heated surface layer itself and
   * does not count; a layer aloft that the mixed layer has taken in keeps counting while the
   * mixing lasts (see markCouplingAloft).
   */
  coupled: boolean;
  /** The dry layer aloft the mixed layer reaches, null when not coupled. Set by assessSeries. */
  coupledLayer?: DryNearAdiabaticLayer | null;
  /** Base of the dry layer aloft the mixed layer has to reach (this hour's, or the one it took in), null when none. Set by assessSeries. */
  dryLayerAloftBaseAglM?: number | null;
  dryNearAdiabaticLayers: DryNearAdiabaticLayer[];
  transportWind: WindReport;
  ventilationM2s: number;
  hdw: number;
  /** Continuous Haines total; null where 850 hPa is under the ground (the index reads 850 and 700 hPa). */
  cHaines: number | null;
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

/**
 * A forecast hour whose profile failed quality control: it is reported, never dropped, so that a
 * missing hour cannot read as an all-clear.
 */
export interface HourGap {
  validTime: string;
  /** Local wall-clock time at the location, ISO 8601 with offset. */
  localTime: string;
  /** Why the hour could not be assessed, each reason naming the level and field (from prepareProfile). */
  reasons: string[];
}

export interface DaySummary {
  /** Local date, YYYY-MM-DD. */
  localDate: string;
  peakMixingHeightAglM: number;
  peakMixingHour: string;
  /** Highest effective mixing height (after coupling) of the day. Set by summarizeDays. */
  peakEffectiveMixingHeightAglM?: number;
  peakEffectiveMixingHour?: string;
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
  /** Hours of this local day that were assessed. Set by summarizeDays. */
  assessedHourCount?: number;
  /** Local times of this day's hours that could not be assessed (see SeriesAssessment.gaps). Set by summarizeDays. */
  gapHours?: string[];
}

export interface SeriesAssessment {
  location: { latitude: number; longitude: number; elevationM: number; name?: string };
  timeZone: string;
  sourceName: string;
  model: string;
  runTime: string;
  invented: boolean;
  /** Assessed hours in time order; hours that failed quality control are in `gaps` instead. */
  hours: HourAssessment[];
  /**
   * Hours that could not be assessed, with the reasons, in time order. Always set by assessSeries
   * (empty when every hour passed); optional only so that hand-built series stay valid. A renderer
   * must show these: a missing hour is not an all-clear.
   */
  gaps?: HourGap[];
  days: DaySummary[];
}
