import type { LevelInput, ProfileInput } from '../core/profile.ts';
import { isoHour } from './forecastRequestSchema.ts';
import type { OpenMeteoLocationResponse } from './openMeteoResponseSchema.ts';
import { LEVEL_QUANTITIES, levelVariable, SURFACE_VARIABLES, type LevelQuantity } from './openMeteoVariables.ts';
import { toCelsius, toDegrees, toHectopascals, toMetres, toMetresPerSecond } from './providerUnits.ts';
import type { ForecastErrorKind } from './forecastSource.ts';

export interface ProfileConversionSettings {
  pressureLevelsHpa: readonly number[];
  upperLevelBelowPressureHpa: number;
  maxDroppedUpperLevels: number;
  /** Name written into every profile. */
  profileName: string;
  latitude: number;
  longitude: number;
}

export type ProfileConversion =
  | { ok: true; profiles: ProfileInput[]; notes: string[]; providerUnits: Record<string, string> }
  | { ok: false; kind: ForecastErrorKind; cause: string };

/** Rounded dew points (the provider derives them from RH) may sit a little above T; beyond this, refuse. */
const DEWPOINT_EXCESS_TOLERANCE_C = 0.5;

const RANGES: Record<LevelQuantity | 'pressureHpa', [number, number]> = {
  temperatureC: [-100, 60],
  dewpointC: [-130, 60],
  windSpeedMs: [0, 150],
  windDirDeg: [0, 360],
  heightM: [-1000, 40000],
  pressureHpa: [300, 1100],
};

type Converter = (value: number) => number;

/**
 * Turns one validated Open-Meteo answer into hourly profiles. Every way the answer can be wrong is a
 * refusal with the field, the hour and the reason, except one: a single upper level (above the
 * configured pressure) whose values are missing may be dropped, and a level under the ground whose
 * values are missing is dropped (the core would drop it anyway). Each drop becomes a note. Levels
 * under the ground that have values are kept: the core drops them itself.
 */
export function openMeteoProfiles(
  response: OpenMeteoLocationResponse,
  validTimesMs: readonly number[],
  settings: ProfileConversionSettings,
): ProfileConversion {
  const hourly = response.hourly;
  const units = response.hourly_units;

  const timeCheck = checkTimes(hourly.time, validTimesMs);
  if (timeCheck) return { ok: false, kind: 'bad-response', cause: timeCheck };

  const expected = new Set<string>(Object.values(SURFACE_VARIABLES));
  for (const pressureHpa of settings.pressureLevelsHpa) for (const quantity of LEVEL_QUANTITIES) expected.add(levelVariable(quantity, pressureHpa));
  const unknownFields = Object.keys(hourly).filter((key) => key !== 'time' && !expected.has(key));
  const renameHint =
    unknownFields.length > 0
      ? `; the answer has fields this source does not know (${unknownFields.slice(0, 3).join(', ')}${unknownFields.length > 3 ? ', ...' : ''}), so the provider may have renamed them`
      : '';

  const missingSurface = Object.values(SURFACE_VARIABLES).filter((name) => !(name in hourly));
  if (missingSurface.length > 0) {
    return {
      ok: false,
      kind: 'bad-response',
      cause: `the answer lacks the surface field${missingSurface.length > 1 ? 's' : ''} ${missingSurface.join(', ')}${renameHint}; a profile without its surface cannot be read`,
    };
  }

  const converters = buildConverters(units, settings.pressureLevelsHpa);
  if (!converters.ok) return { ok: false, kind: 'bad-response', cause: converters.cause };
  const convert = converters.byField;

  // Levels with fields absent from the answer, and which fields.
  const absentFieldsByLevel = new Map<number, string[]>();
  for (const pressureHpa of settings.pressureLevelsHpa) {
    const absent = LEVEL_QUANTITIES.map((quantity) => levelVariable(quantity, pressureHpa)).filter((name) => !(name in hourly));
    if (absent.length > 0) absentFieldsByLevel.set(pressureHpa, absent);
  }

  // A quantity absent at every level is a changed interface, not a gap: refuse it as such.
  for (const quantity of LEVEL_QUANTITIES) {
    const names = settings.pressureLevelsHpa.map((pressureHpa) => levelVariable(quantity, pressureHpa));
    if (names.every((name) => !(name in hourly))) {
      return {
        ok: false,
        kind: 'bad-response',
        cause: `the answer lacks ${names[0]} and the same quantity at every other level${renameHint}; no level can be read without it`,
      };
    }
  }

  const dropCounts = new Map<string, number>();
  const profiles: ProfileInput[] = [];
  const hours = validTimesMs.length;

  for (let hourIndex = 0; hourIndex < hours; hourIndex++) {
    const hourLabel = isoHour(validTimesMs[hourIndex]);
    const surfaceValues: Partial<Record<keyof typeof SURFACE_VARIABLES, number>> = {};
    for (const [key, field] of Object.entries(SURFACE_VARIABLES) as [keyof typeof SURFACE_VARIABLES, string][]) {
      const raw = hourly[field][hourIndex];
      if (raw === null || raw === undefined || !Number.isFinite(raw)) {
        return { ok: false, kind: 'bad-profile', cause: `the answer has no value (${raw === undefined ? 'array too short' : 'null'}) for the surface field ${field} at ${hourLabel}; the hour cannot be read and no series is given rather than a partial one` };
      }
      const value = convert.get(field)!(raw);
      const range = key === 'pressureHpa' ? RANGES.pressureHpa : RANGES[key as LevelQuantity];
      if (value < range[0] || value > range[1]) {
        return { ok: false, kind: 'bad-response', cause: `the surface field ${field} is ${raw} ${units[field]} at ${hourLabel}, outside ${range[0]}..${range[1]}; the answer is not trusted` };
      }
      surfaceValues[key] = value;
    }
    const surfacePressureHpa = surfaceValues.pressureHpa!;
    let surfaceDewpointC = surfaceValues.dewpointC!;
    const surfaceTemperatureC = surfaceValues.temperatureC!;
    if (surfaceDewpointC > surfaceTemperatureC) {
      if (surfaceDewpointC - surfaceTemperatureC > DEWPOINT_EXCESS_TOLERANCE_C) {
        return { ok: false, kind: 'bad-response', cause: `${SURFACE_VARIABLES.dewpointC} ${surfaceDewpointC} °C is above ${SURFACE_VARIABLES.temperatureC} ${surfaceTemperatureC} °C at ${hourLabel}` };
      }
      surfaceDewpointC = surfaceTemperatureC;
    }

    const levels: LevelInput[] = [];
    let droppedUpper = 0;
    for (const pressureHpa of settings.pressureLevelsHpa) {
      const level = readLevel(hourly, convert, pressureHpa, hourIndex, absentFieldsByLevel.get(pressureHpa));
      if (level.ok) {
        const rangeProblem = checkLevelRanges(level.level, pressureHpa, hourLabel);
        if (rangeProblem) return { ok: false, kind: 'bad-response', cause: rangeProblem };
        if (level.level.dewpointC > level.level.temperatureC) {
          if (level.level.dewpointC - level.level.temperatureC > DEWPOINT_EXCESS_TOLERANCE_C) {
            return { ok: false, kind: 'bad-response', cause: `${levelVariable('dewpointC', pressureHpa)} ${level.level.dewpointC} °C is above the temperature ${level.level.temperatureC} °C at ${hourLabel}` };
          }
          level.level.dewpointC = level.level.temperatureC;
        }
        levels.push(level.level);
        continue;
      }
      if (pressureHpa >= surfacePressureHpa) {
        countDrop(dropCounts, `${pressureHpa} hPa level dropped, it lies under the ground and ${level.reason}`);
        continue;
      }
      if (pressureHpa < settings.upperLevelBelowPressureHpa && droppedUpper < settings.maxDroppedUpperLevels) {
        droppedUpper++;
        countDrop(dropCounts, `${pressureHpa} hPa level dropped because ${level.reason}`);
        continue;
      }
      const why =
        pressureHpa >= settings.upperLevelBelowPressureHpa
          ? `levels at ${settings.upperLevelBelowPressureHpa} hPa and below carry the mixing height and the Haines layers and are never dropped`
          : `at most ${settings.maxDroppedUpperLevels} upper level${settings.maxDroppedUpperLevels === 1 ? '' : 's'} may be dropped per hour`;
      return {
        ok: false,
        kind: absentFieldsByLevel.has(pressureHpa) ? 'bad-response' : 'bad-profile',
        cause: `at ${hourLabel} the ${pressureHpa} hPa level is unusable: ${level.reason}${absentFieldsByLevel.has(pressureHpa) ? renameHint : ''}; ${why}`,
      };
    }

    const heightProblem = checkHeightsRise(levels, hourLabel);
    if (heightProblem) return { ok: false, kind: 'bad-response', cause: heightProblem };

    profiles.push({
      name: settings.profileName,
      validTime: hourLabel,
      latitude: settings.latitude,
      longitude: settings.longitude,
      surface: {
        pressureHpa: surfacePressureHpa,
        elevationM: response.elevation,
        temperatureC: surfaceTemperatureC,
        dewpointC: surfaceDewpointC,
        windDirDeg: surfaceValues.windDirDeg!,
        windSpeedMs: surfaceValues.windSpeedMs!,
      },
      levels,
    });
  }

  const notes = [...dropCounts.entries()].map(([note, count]) => `${note} (${count} of ${hours} hour${hours === 1 ? '' : 's'})`);
  return { ok: true, profiles, notes, providerUnits: converters.providerUnits };
}

function checkTimes(times: readonly number[], validTimesMs: readonly number[]): string | null {
  const asked = `${isoHour(validTimesMs[0])} to ${isoHour(validTimesMs[validTimesMs.length - 1])}`;
  if (times.length !== validTimesMs.length) {
    return `the answer has ${times.length} hours but ${validTimesMs.length} were asked (${asked})`;
  }
  for (let index = 0; index < times.length; index++) {
    if (times[index] * 1000 !== validTimesMs[index]) {
      return `hour ${index + 1} of the answer is ${Number.isFinite(times[index]) ? isoHour(times[index] * 1000) : String(times[index])}, not ${isoHour(validTimesMs[index])} as asked (${asked})`;
    }
  }
  return null;
}

type ConverterBuild =
  | { ok: true; byField: Map<string, Converter>; providerUnits: Record<string, string> }
  | { ok: false; cause: string };

/** One converter per field present, from the unit the answer states; an unknown unit refuses the answer. */
function buildConverters(units: Record<string, string>, pressureLevelsHpa: readonly number[]): ConverterBuild {
  const byField = new Map<string, Converter>();
  const providerUnits: Record<string, string> = {};
  const plan: [string, (unit: string | undefined) => Converter | null, string][] = [
    [SURFACE_VARIABLES.temperatureC, toCelsius, 'temperature'],
    [SURFACE_VARIABLES.dewpointC, toCelsius, 'dewpoint'],
    [SURFACE_VARIABLES.pressureHpa, toHectopascals, 'surfacePressure'],
    [SURFACE_VARIABLES.windSpeedMs, toMetresPerSecond, 'windSpeed'],
    [SURFACE_VARIABLES.windDirDeg, toDegrees, 'windDirection'],
  ];
  const levelPlan: [LevelQuantity, (unit: string | undefined) => Converter | null, string][] = [
    ['temperatureC', toCelsius, 'temperature'],
    ['dewpointC', toCelsius, 'dewpoint'],
    ['windSpeedMs', toMetresPerSecond, 'windSpeed'],
    ['windDirDeg', toDegrees, 'windDirection'],
    ['heightM', toMetres, 'geopotentialHeight'],
  ];
  for (const pressureHpa of pressureLevelsHpa) {
    for (const [quantity, make, label] of levelPlan) plan.push([levelVariable(quantity, pressureHpa), make, label]);
  }
  for (const [field, make, label] of plan) {
    if (!(field in units)) continue; // absent fields are judged by the caller, with the values
    const unit = units[field];
    const converter = make(unit);
    if (!converter) return { ok: false, cause: `the answer gives ${field} in "${unit}", a unit this source does not convert` };
    byField.set(field, converter);
    providerUnits[label] ??= unit;
  }
  return { ok: true, byField, providerUnits };
}

type LevelRead = { ok: true; level: LevelInput } | { ok: false; reason: string };

function readLevel(
  hourly: OpenMeteoLocationResponse['hourly'],
  convert: Map<string, Converter>,
  pressureHpa: number,
  hourIndex: number,
  absentFields: string[] | undefined,
): LevelRead {
  if (absentFields) {
    return { ok: false, reason: `the answer lacks ${absentFields.length === 1 ? 'the field' : 'the fields'} ${absentFields.join(', ')}` };
  }
  const values: Partial<Record<LevelQuantity, number>> = {};
  for (const quantity of LEVEL_QUANTITIES) {
    const field = levelVariable(quantity, pressureHpa);
    const converter = convert.get(field);
    const raw = hourly[field][hourIndex];
    if (!converter) return { ok: false, reason: `the answer states no unit for ${field}` };
    if (raw === null || raw === undefined || !Number.isFinite(raw)) {
      return { ok: false, reason: `${field} has no value (${raw === undefined ? 'array too short' : 'null'})` };
    }
    values[quantity] = converter(raw);
  }
  return {
    ok: true,
    level: {
      pressureHpa,
      heightM: values.heightM!,
      temperatureC: values.temperatureC!,
      dewpointC: values.dewpointC!,
      windDirDeg: values.windDirDeg!,
      windSpeedMs: values.windSpeedMs!,
    },
  };
}

function checkLevelRanges(level: LevelInput, pressureHpa: number, hourLabel: string): string | null {
  const checks: [LevelQuantity, number][] = [
    ['temperatureC', level.temperatureC],
    ['dewpointC', level.dewpointC],
    ['windSpeedMs', level.windSpeedMs],
    ['windDirDeg', level.windDirDeg],
    ['heightM', level.heightM],
  ];
  for (const [quantity, value] of checks) {
    const [min, max] = RANGES[quantity];
    if (value < min || value > max) {
      return `${levelVariable(quantity, pressureHpa)} is ${value} at ${hourLabel}, outside ${min}..${max}; the answer is not trusted`;
    }
  }
  return null;
}

/** Geopotential height must rise as pressure falls; if not, the answer is scrambled. */
function checkHeightsRise(levels: readonly LevelInput[], hourLabel: string): string | null {
  const sorted = [...levels].sort((a, b) => b.pressureHpa - a.pressureHpa);
  for (let index = 1; index < sorted.length; index++) {
    if (sorted[index].heightM <= sorted[index - 1].heightM) {
      return `at ${hourLabel} the ${sorted[index].pressureHpa} hPa level (${sorted[index].heightM} m) is not above the ${sorted[index - 1].pressureHpa} hPa level (${sorted[index - 1].heightM} m); the answer is not trusted`;
    }
  }
  return null;
}

function countDrop(counts: Map<string, number>, note: string): void {
  counts.set(note, (counts.get(note) ?? 0) + 1);
}
