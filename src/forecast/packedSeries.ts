import type { LevelInput, ProfileInput, SurfaceInput } from '../core/profile.ts';
import type { ForecastSeries } from './forecastSource.ts';

/**
 * A forecast series held compactly: every number of every profile in one Float64Array (exact, no
 * rounding), the rest as it was. The forecast cache holds one per place until the next model run;
 * as objects, 200 places of 48 hourly profiles take ~55 MB of heap, packed ~15 MB.
 */
export interface PackedSeries {
  header: Omit<ForecastSeries, 'profiles'>;
  /** Per profile: what is not a number. */
  profileLabels: Array<Pick<ProfileInput, 'name' | 'validTime' | 'latitude' | 'longitude'>>;
  /** Per profile: how many pressure levels it has (a level dropped by QC makes them differ). */
  levelCounts: Uint16Array;
  /** Per profile: the surface's fields, then each level's, in the order of the field lists below. */
  numbers: Float64Array;
}

const SURFACE_FIELDS = ['pressureHpa', 'elevationM', 'temperatureC', 'dewpointC', 'windDirDeg', 'windSpeedMs'] as const satisfies ReadonlyArray<keyof SurfaceInput>;
const LEVEL_FIELDS = ['pressureHpa', 'heightM', 'temperatureC', 'dewpointC', 'windDirDeg', 'windSpeedMs'] as const satisfies ReadonlyArray<keyof LevelInput>;

export function packSeries(series: ForecastSeries): PackedSeries {
  const { profiles, ...header } = series;
  const levelCounts = new Uint16Array(profiles.map((profile) => profile.levels.length));
  const total = profiles.reduce((sum, profile) => sum + SURFACE_FIELDS.length + profile.levels.length * LEVEL_FIELDS.length, 0);
  const numbers = new Float64Array(total);
  let at = 0;
  for (const profile of profiles) {
    for (const field of SURFACE_FIELDS) numbers[at++] = profile.surface[field];
    for (const level of profile.levels) {
      for (const field of LEVEL_FIELDS) numbers[at++] = level[field];
    }
  }
  return {
    header,
    profileLabels: profiles.map(({ name, validTime, latitude, longitude }) => ({ name, validTime, latitude, longitude })),
    levelCounts,
    numbers,
  };
}

/** The series again, as fresh objects (callers may not share or change the cache's copy). */
export function unpackSeries(packed: PackedSeries): ForecastSeries {
  const { numbers } = packed;
  let at = 0;
  const profiles: ProfileInput[] = packed.profileLabels.map((label, index) => {
    const surface: SurfaceInput = {
      pressureHpa: numbers[at++]!,
      elevationM: numbers[at++]!,
      temperatureC: numbers[at++]!,
      dewpointC: numbers[at++]!,
      windDirDeg: numbers[at++]!,
      windSpeedMs: numbers[at++]!,
    };
    const levels: LevelInput[] = new Array(packed.levelCounts[index]!);
    for (let level = 0; level < levels.length; level += 1) {
      levels[level] = {
        pressureHpa: numbers[at++]!,
        heightM: numbers[at++]!,
        temperatureC: numbers[at++]!,
        dewpointC: numbers[at++]!,
        windDirDeg: numbers[at++]!,
        windSpeedMs: numbers[at++]!,
      };
    }
    return { ...label, surface, levels };
  });
  return { ...packed.header, profiles };
}
