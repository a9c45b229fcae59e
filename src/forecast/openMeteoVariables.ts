/**
 * Names of the Open-Meteo hourly variables this project reads (open-meteo.com/en/docs: "Hourly
 * Parameter Definition" and "Pressure Level Variables").
 */
export const SURFACE_VARIABLES = {
  temperatureC: 'temperature_2m',
  dewpointC: 'dew_point_2m',
  pressureHpa: 'surface_pressure',
  windSpeedMs: 'wind_speed_10m',
  windDirDeg: 'wind_direction_10m',
} as const;

export type LevelQuantity = 'temperatureC' | 'dewpointC' | 'windSpeedMs' | 'windDirDeg' | 'heightM';

const LEVEL_VARIABLE_PREFIX: Record<LevelQuantity, string> = {
  temperatureC: 'temperature',
  dewpointC: 'dew_point',
  windSpeedMs: 'wind_speed',
  windDirDeg: 'wind_direction',
  heightM: 'geopotential_height',
};

export const LEVEL_QUANTITIES = Object.keys(LEVEL_VARIABLE_PREFIX) as LevelQuantity[];

/** e.g. levelVariable('heightM', 850) === 'geopotential_height_850hPa'. */
export function levelVariable(quantity: LevelQuantity, pressureHpa: number): string {
  return `${LEVEL_VARIABLE_PREFIX[quantity]}_${pressureHpa}hPa`;
}

/** Every hourly variable to request for the given levels, surface first. */
export function hourlyVariableNames(pressureLevelsHpa: readonly number[]): string[] {
  const names: string[] = Object.values(SURFACE_VARIABLES);
  for (const pressureHpa of pressureLevelsHpa) {
    for (const quantity of LEVEL_QUANTITIES) names.push(levelVariable(quantity, pressureHpa));
  }
  return names;
}
