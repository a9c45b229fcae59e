import type { ProfileInput } from '../core/profile.ts';

/** A point to forecast for. Elevation is optional: sources that know the terrain fill it in. */
export interface ForecastLocation {
  latitude: number;
  longitude: number;
  elevationM?: number;
  /** Display name, e.g. a saved place; never used to look data up. */
  name?: string;
}

export interface ForecastWindow {
  /** First valid hour wanted, ISO 8601 instant (rounded down to the hour by the source). */
  startTime: string;
  /** How many hourly profiles, e.g. 48. */
  hours: number;
}

/** Hourly profiles for one location from one model run, already in the project's units. */
export interface ForecastSeries {
  location: ForecastLocation;
  sourceName: string;
  model: string;
  /** Model run (initialisation) time, ISO 8601 instant. */
  runTime: string;
  /** Units as delivered by the provider before conversion, for the record (e.g. { windSpeed: 'km/h' }). */
  providerUnits: Record<string, string>;
  /** True when the data are invented (the demo source); every answer built on it must say so. */
  invented: boolean;
  profiles: ProfileInput[];
  /**
   * What the source did to the provider's data that a reader should know, in plain words (e.g. a
   * level dropped and why, a run time derived rather than read). Absent or empty when nothing.
   */
  notes?: string[];
}

export type ForecastErrorKind =
  | 'timeout'
  | 'network'
  | 'rate-limited'
  | 'server'
  | 'client'
  | 'bad-response'
  | 'no-data'
  | 'bad-profile';

export interface ForecastError {
  kind: ForecastErrorKind;
  /** A sentence a person can act on; names the location and the cause. */
  message: string;
  location: ForecastLocation;
}

export type ForecastResult = { ok: true; series: ForecastSeries } | { ok: false; error: ForecastError };

export interface ForecastSource {
  /** Short name shown in messages, e.g. "open-meteo (gfs_seamless)" or "demo (invented data)". */
  readonly name: string;
  fetchSeries(location: ForecastLocation, window: ForecastWindow): Promise<ForecastResult>;
  /**
   * The newest model run the provider says it serves now, ISO 8601, read from the provider (a run
   * time derived from the update cycle does not count): null when it cannot say. Absent when the
   * source has no such probe. Lets the alert check see a new run before its interval.
   */
  latestRunTime?(): Promise<string | null>;
  /** Several locations at once where the provider allows it; results in the same order. */
  fetchMany(locations: ForecastLocation[], window: ForecastWindow): Promise<ForecastResult[]>;
}
