/**
 * The two real soundings Debian's libncarg-data ships (/usr/share/ncarg/data/asc), read into plain
 * columns. sounding_ATS.asc: pressure hPa, temperature °C, dew point °C, (unused), height m, wind
 * speed m/s, direction °. sounding_testdata.asc: level, pressure hPa, height m, height m, q g/kg,
 * T °C, Tv °C, θ K, θv K, Td °C, Td K, RH %, …, e hPa, es hPa, density kg/m³.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { ProfileInput } from '../../src/core/profile.ts';
import { NCL_DATA_DIR } from './runNcl.ts';

export interface SoundingColumns {
  name: string;
  pressureHpa: number[];
  heightM: number[];
  temperatureC: number[];
  dewpointC: number[];
  windSpeedMs: number[];
  windDirDeg: number[];
}

function rows(file: string): number[][] {
  return readFileSync(join(NCL_DATA_DIR, file), 'utf8')
    .split('\n')
    .map((line) => line.trim())
    .filter((line) => line.length > 0)
    .map((line) => line.split(/\s+/).map(Number));
}

export function soundingAts(): SoundingColumns {
  const r = rows('sounding_ATS.asc');
  return {
    name: 'sounding_ATS',
    pressureHpa: r.map((x) => x[0]),
    temperatureC: r.map((x) => x[1]),
    dewpointC: r.map((x) => x[2]),
    heightM: r.map((x) => x[4]),
    windSpeedMs: r.map((x) => x[5]),
    windDirDeg: r.map((x) => x[6]),
  };
}

/** sounding_testdata.asc, to 100 hPa (above it the dew points are placeholders near −100 °C). */
export function soundingTestdata(): SoundingColumns {
  const r = rows('sounding_testdata.asc').filter((x) => x[1] >= 100);
  return {
    name: 'sounding_testdata',
    pressureHpa: r.map((x) => x[1]),
    heightM: r.map((x) => x[2]),
    temperatureC: r.map((x) => x[5]),
    dewpointC: r.map((x) => x[9]),
    windSpeedMs: r.map(() => 5),
    windDirDeg: r.map(() => 270),
  };
}

export function soundingProfileInput(s: SoundingColumns): ProfileInput {
  const level = (i: number) => ({
    pressureHpa: s.pressureHpa[i],
    heightM: s.heightM[i],
    temperatureC: s.temperatureC[i],
    dewpointC: s.dewpointC[i],
    windDirDeg: s.windDirDeg[i],
    windSpeedMs: s.windSpeedMs[i],
  });
  const surface = level(0);
  return {
    name: s.name,
    validTime: '2000-01-01T00:00:00Z',
    latitude: null,
    longitude: null,
    surface: { pressureHpa: surface.pressureHpa, elevationM: surface.heightM, temperatureC: surface.temperatureC, dewpointC: surface.dewpointC, windDirDeg: surface.windDirDeg, windSpeedMs: surface.windSpeedMs },
    levels: s.pressureHpa.slice(1).map((_, i) => level(i + 1)),
  };
}
