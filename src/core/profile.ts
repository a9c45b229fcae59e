/**
 * A vertical profile as it arrives (from a file, a forecast source or the demo): a surface
 * observation and pressure levels. Heights are geopotential metres above mean sea level.
 * This is the shape of the `analyze` contract; `prepareProfile` checks it and turns it into a
 * `PreparedProfile`, the only form the science functions accept.
 */
export interface SurfaceInput {
  pressureHpa: number;
  elevationM: number;
  temperatureC: number;
  dewpointC: number;
  windDirDeg: number;
  windSpeedMs: number;
}

export interface LevelInput {
  pressureHpa: number;
  /** Geopotential height above mean sea level. */
  heightM: number;
  temperatureC: number;
  dewpointC: number;
  windDirDeg: number;
  windSpeedMs: number;
}

export interface ProfileInput {
  name: string;
  /** ISO 8601 instant, e.g. 2026-08-14T21:00:00Z. */
  validTime: string;
  /** Null only for a file profile that does not say where it is (a CSV without coordinates). */
  latitude: number | null;
  longitude: number | null;
  surface: SurfaceInput;
  levels: LevelInput[];
}

/**
 * A checked profile: index 0 is the surface, then every above-ground level in order of
 * decreasing pressure. All arrays have the same length. Winds are kept as components so that
 * layer means are vector means.
 */
export interface PreparedProfile {
  name: string;
  validTime: string;
  latitude: number | null;
  longitude: number | null;
  elevationM: number;
  pressureHpa: Float64Array;
  heightMslM: Float64Array;
  heightAglM: Float64Array;
  temperatureC: Float64Array;
  dewpointC: Float64Array;
  /** Eastward wind component, m/s. */
  windUMs: Float64Array;
  /** Northward wind component, m/s. */
  windVMs: Float64Array;
  thetaK: Float64Array;
}
