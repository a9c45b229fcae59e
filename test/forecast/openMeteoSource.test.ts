import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { prepareProfile } from '../../src/core/prepareProfile.ts';
import { DemoSource } from '../../src/forecast/demoSource.ts';
import { DEMO_PLACES } from '../../src/forecast/demoPlaces.ts';
import { OpenMeteoSource } from '../../src/forecast/openMeteoSource.ts';
import type { OpenMeteoConfigInput } from '../../src/forecast/openMeteoConfig.ts';
import { OpenMeteoStandIn } from './openMeteoStandIn.ts';

// All places and data here are invented (the demo scenario), served by a stand-in on 127.0.0.1.
const WINDOW = { startTime: '2026-08-14T06:00:00Z', hours: 48 };
const [bench, lookout, sink] = DEMO_PLACES;
const benchLocation = { latitude: bench.latitude, longitude: bench.longitude, name: bench.name };

let standIn: OpenMeteoStandIn;
beforeAll(async () => {
  standIn = await OpenMeteoStandIn.start();
});
afterAll(async () => {
  await standIn.close();
});
afterEach(() => {
  standIn.faultQueue.length = 0;
  standIn.persistentFaults = [];
  standIn.metadataFails = false;
});

function source(overrides: OpenMeteoConfigInput = {}, nowMs?: () => number): OpenMeteoSource {
  return new OpenMeteoSource({ baseUrl: standIn.baseUrl, timeoutMs: 2000, backoffBaseMs: 10, backoffMaxMs: 50, ...overrides }, { nowMs });
}

describe('OpenMeteoSource against the stand-in', () => {
  it('asks for the documented variables, model, units and hours, and reads 48 hourly profiles', async () => {
    const before = standIn.forecastRequests;
    const result = await source().fetchSeries(benchLocation, WINDOW);
    expect(standIn.forecastRequests - before).toBe(1);
    const url = standIn.forecastUrls.at(-1)!;
    expect(url.searchParams.get('models')).toBe('gfs_seamless');
    expect(url.searchParams.get('wind_speed_unit')).toBe('ms');
    expect(url.searchParams.get('timeformat')).toBe('unixtime');
    expect(url.searchParams.get('start_hour')).toBe('2026-08-14T06:00');
    expect(url.searchParams.get('end_hour')).toBe('2026-08-16T05:00');
    const hourly = url.searchParams.get('hourly')!.split(',');
    for (const name of ['temperature_2m', 'dew_point_2m', 'surface_pressure', 'wind_speed_10m', 'wind_direction_10m', 'geopotential_height_850hPa', 'dew_point_700hPa', 'temperature_200hPa']) {
      expect(hourly).toContain(name);
    }
    expect(hourly.some((name) => name.endsWith('_150hPa'))).toBe(false);

    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const { series } = result;
    expect(series.profiles).toHaveLength(48);
    expect(series.model).toBe('gfs_seamless');
    expect(series.sourceName).toBe('open-meteo (gfs_seamless)');
    expect(series.invented).toBe(false);
    expect(series.runTime).toBe('2026-08-14T06:00:00Z');
    expect(series.providerUnits.windSpeed).toBe('m/s');
    expect(series.location.elevationM).toBe(bench.elevationM);
    expect(series.profiles[0].validTime).toBe('2026-08-14T06:00:00Z');
    expect(series.profiles[47].validTime).toBe('2026-08-16T05:00:00Z');
    expect(series.profiles[0].levels.map((level) => level.pressureHpa)).toEqual([1000, 975, 950, 925, 900, 850, 800, 700, 600, 500, 400, 300, 250, 200]);
  });

  it('carries the served values through unchanged (within the provider rounding)', async () => {
    const result = await source().fetchSeries(benchLocation, WINDOW);
    const demo = await new DemoSource().fetchSeries(benchLocation, WINDOW);
    expect(result.ok && demo.ok).toBe(true);
    if (!result.ok || !demo.ok) return;
    for (const hour of [0, 9, 20, 33]) {
      const got = result.series.profiles[hour];
      const want = demo.series.profiles[hour];
      expect(got.surface.temperatureC).toBeCloseTo(want.surface.temperatureC, 0);
      expect(Math.abs(got.surface.pressureHpa - want.surface.pressureHpa)).toBeLessThanOrEqual(0.05);
      const got700 = got.levels.find((level) => level.pressureHpa === 700)!;
      const want700 = want.levels.find((level) => level.pressureHpa === 700)!;
      expect(Math.abs(got700.heightM - want700.heightM)).toBeLessThanOrEqual(0.05);
      expect(Math.abs(got700.windSpeedMs - want700.windSpeedMs)).toBeLessThanOrEqual(0.05);
    }
  });

  it('keeps levels under the ground in the profile, and the core drops them and reads the rest', async () => {
    const result = await source().fetchSeries(benchLocation, WINDOW);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    for (const profile of result.series.profiles) {
      const underground = profile.levels.filter((level) => level.pressureHpa > profile.surface.pressureHpa);
      // The ground at 1450 m lies near 850 hPa: 1000 to 900 hPa are always under it.
      expect(underground.map((level) => level.pressureHpa)).toEqual(expect.arrayContaining([1000, 975, 950, 925, 900]));
      const prepared = prepareProfile(profile);
      expect(prepared.ok).toBe(true);
      if (!prepared.ok) continue;
      // (The core may also leave out a level a few metres above the ground; nothing else goes.)
      expect(prepared.profile.pressureHpa.length).toBeGreaterThanOrEqual(profile.levels.length - underground.length);
      for (let index = 1; index < prepared.profile.pressureHpa.length; index++) {
        expect(prepared.profile.pressureHpa[index]).toBeLessThan(profile.surface.pressureHpa);
      }
    }
  });

  it('sends several locations in one request and returns the answers in order', async () => {
    const before = standIn.forecastRequests;
    const locations = [sink, bench, lookout].map((place) => ({ latitude: place.latitude, longitude: place.longitude, elevationM: place.elevationM, name: place.name }));
    const results = await source().fetchMany(locations, WINDOW);
    expect(standIn.forecastRequests - before).toBe(1);
    expect(standIn.forecastUrls.at(-1)!.searchParams.get('latitude')).toBe(`${sink.latitude},${bench.latitude},${lookout.latitude}`);
    expect(standIn.forecastUrls.at(-1)!.searchParams.get('elevation')).toBe(`${sink.elevationM},${bench.elevationM},${lookout.elevationM}`);
    expect(results.map((result) => (result.ok ? result.series.location.name : result.error.message))).toEqual([sink.name, bench.name, lookout.name]);
    expect(results.map((result) => (result.ok ? result.series.profiles[0].surface.elevationM : NaN))).toEqual([sink.elevationM, bench.elevationM, lookout.elevationM]);
  });

  it('splits a batch by terrain height given or not, and by the per-request limit', async () => {
    const before = standIn.forecastRequests;
    const locations = [
      { latitude: 43.5, longitude: -115.5 },
      { latitude: 43.6, longitude: -115.5, elevationM: 1300 },
      { latitude: 43.7, longitude: -115.5 },
      { latitude: 43.8, longitude: -115.5 },
    ];
    const results = await source({ maxLocationsPerRequest: 2 }).fetchMany(locations, { startTime: WINDOW.startTime, hours: 6 });
    expect(results.every((result) => result.ok)).toBe(true);
    expect(standIn.forecastRequests - before).toBe(2 + 1);
  });

  it('converts km/h winds at the edge when the server sends them', async () => {
    const inMs = await source().fetchSeries(benchLocation, { startTime: WINDOW.startTime, hours: 12 });
    standIn.persistentFaults = [{ kind: 'windsInKmh' }];
    const inKmh = await source().fetchSeries(benchLocation, { startTime: WINDOW.startTime, hours: 12 });
    expect(inMs.ok && inKmh.ok).toBe(true);
    if (!inMs.ok || !inKmh.ok) return;
    expect(inKmh.series.providerUnits.windSpeed).toBe('km/h');
    for (let hour = 0; hour < 12; hour++) {
      // km/h are rounded to 0.1 by the provider: 0.05 km/h is 0.014 m/s.
      expect(Math.abs(inKmh.series.profiles[hour].surface.windSpeedMs - inMs.series.profiles[hour].surface.windSpeedMs)).toBeLessThan(0.06);
      expect(Math.abs(inKmh.series.profiles[hour].levels[8].windSpeedMs - inMs.series.profiles[hour].levels[8].windSpeedMs)).toBeLessThan(0.06);
    }
  });

  it('derives the run time from the update cycle, and says so, when the metadata does not answer', async () => {
    standIn.metadataFails = true;
    const result = await source({}, () => Date.UTC(2026, 7, 14, 13, 20)).fetchSeries(benchLocation, { startTime: WINDOW.startTime, hours: 3 });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    // 13:20Z less 5 h of availability delay is 08:20Z; the 6-hourly run before that is 06Z.
    expect(result.series.runTime).toBe('2026-08-14T06:00:00Z');
    expect(result.series.notes?.join(' ')).toMatch(/derived from the model's update cycle/);
  });

  it('refuses a bad location with a clear message and sends nothing', async () => {
    const before = standIn.forecastRequests;
    const [bad, good] = await source().fetchMany([{ latitude: 123, longitude: -115 }, benchLocation], { startTime: WINDOW.startTime, hours: 2 });
    expect(bad.ok).toBe(false);
    if (!bad.ok) {
      expect(bad.error.kind).toBe('client');
      expect(bad.error.message).toContain('123.000, -115.000');
      expect(bad.error.message).toMatch(/latitude/);
      expect(bad.error.message).toMatch(/e\.g\./);
    }
    expect(good.ok).toBe(true);
    expect(standIn.forecastRequests - before).toBe(1);
  });

  it('refuses a bad config at construction with the key named', () => {
    expect(() => new OpenMeteoSource({ baseUrl: 'not a url' })).toThrow(/baseUrl/);
    expect(() => new OpenMeteoSource({ timeoutMs: -5 })).toThrow(/timeoutMs/);
  });
});
