import { DateTime } from 'luxon';
import { describe, expect, it } from 'vitest';
import type { PreparedProfile, ProfileInput } from '../../src/core/profile.ts';
import { prepareProfile } from '../../src/core/prepareProfile.ts';
import { mixingHeightAglM } from '../../src/core/mixingHeight.ts';
import { dryNearAdiabaticLayers } from '../../src/core/layers/dryNearAdiabaticLayers.ts';
import { mixingRatioKgKg, relativeHumidityPct } from '../../src/core/thermo/vapour.ts';
import { virtualTemperatureK } from '../../src/core/thermo/potentialTemperature.ts';
import { DEMO_PLACES, DEMO_SCENARIO_NAME, findDemoPlace } from '../../src/forecast/demoPlaces.ts';
import { DEMO_PRESSURE_LEVELS_HPA } from '../../src/forecast/demoScenario.ts';
import { DemoSource } from '../../src/forecast/demoSource.ts';
import type { ForecastSeries } from '../../src/forecast/forecastSource.ts';

// The demo's places, incident and weather are invented; these tests hold the invention to physics.
const demo = new DemoSource();

async function seriesFor(latitude: number, longitude: number, startTime: string, hours = 48, elevationM?: number): Promise<ForecastSeries> {
  const result = await demo.fetchSeries({ latitude, longitude, elevationM }, { startTime, hours });
  if (!result.ok) throw new Error(result.error.message);
  return result.series;
}

function prepared(profile: ProfileInput): PreparedProfile {
  const result = prepareProfile(profile);
  if (!result.ok) throw new Error(result.errors.join('; '));
  return result.profile;
}

function levelRelativeHumidity(profile: PreparedProfile): Float64Array {
  return Float64Array.from(profile.temperatureC, (temperatureC, index) => relativeHumidityPct(temperatureC, profile.dewpointC[index]));
}

function localHourOf(validTime: string, zone: string): { date: string; hour: number } {
  const local = DateTime.fromISO(validTime, { zone });
  return { date: local.toISODate()!, hour: local.hour };
}

/** The dry near-dry-adiabatic layer aloft, read at dawn before any mixing (base above the ground). */
function dawnDryLayer(series: ForecastSeries, zone: string, date: string) {
  const dawn = series.profiles.find((profile) => {
    const local = localHourOf(profile.validTime, zone);
    return local.date === date && local.hour === 5;
  })!;
  const profile = prepared(dawn);
  const layers = dryNearAdiabaticLayers(profile, levelRelativeHumidity(profile)).filter((layer) => layer.baseAglM > 0);
  expect(layers.length).toBeGreaterThanOrEqual(1);
  return { layer: layers[0], profile };
}

/**
 * Coupling hour: the first hour whose parcel-method mixing height (DESIGN.md; core mixingHeightAglM)
 * reaches the dawn dry layer's base. Returns local hours of that date that couple.
 */
function couplingHours(series: ForecastSeries, zone: string, date: string, baseAglM: number): number[] {
  return series.profiles
    .filter((profile) => localHourOf(profile.validTime, zone).date === date)
    .filter((profile) => mixingHeightAglM(prepared(profile)) >= baseAglM)
    .map((profile) => localHourOf(profile.validTime, zone).hour);
}

describe('demo source: what it says about itself', () => {
  it('answers with invented data, says so, and dates its invented run at 00 or 12 UTC before the window', async () => {
    const result = await demo.fetchSeries({ latitude: 43.62, longitude: -115.48 }, { startTime: '2026-08-14T06:30:00Z', hours: 48 });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    const { series } = result;
    expect(series.invented).toBe(true);
    expect(series.sourceName).toMatch(/invented/);
    expect(series.model).toBe('demo-scenario');
    expect(series.runTime).toBe('2026-08-14T00:00:00Z');
    expect(series.notes?.join(' ')).toContain(DEMO_SCENARIO_NAME);
    expect(series.location.name).toBe('Kestrel Bench ICP');
    expect(series.profiles).toHaveLength(48);
    expect(series.profiles[0].validTime).toBe('2026-08-14T06:00:00Z');
    expect(series.profiles[47].validTime).toBe('2026-08-16T05:00:00Z');
  });

  it('lists its invented places with a description each, found by name', () => {
    expect(DEMO_PLACES.length).toBeGreaterThanOrEqual(2);
    for (const place of DEMO_PLACES) {
      expect(place.description).toMatch(/invented/i);
      expect(findDemoPlace(`  ${place.name.toUpperCase()} `)).toBe(place);
    }
  });

  it('refuses a bad request with a clear message', async () => {
    const result = await demo.fetchSeries({ latitude: 43, longitude: 200 }, { startTime: '2026-08-14T06:00:00Z', hours: 48 });
    expect(result.ok).toBe(false);
    if (!result.ok) {
      expect(result.error.kind).toBe('client');
      expect(result.error.message).toMatch(/longitude/);
    }
    const badWindow = await demo.fetchSeries({ latitude: 43, longitude: -115 }, { startTime: 'tomorrow', hours: 48 });
    expect(badWindow.ok).toBe(false);
    if (!badWindow.ok) expect(badWindow.error.message).toMatch(/startTime.*e\.g\./);
  });
});

describe('demo source: physics of the invented column', () => {
  it('emits only levels above the ground, from the 37-level set 1000..100 hPa, dew point never above temperature', async () => {
    const series = await seriesFor(43.49, -115.66, '2026-08-14T06:00:00Z');
    expect(DEMO_PRESSURE_LEVELS_HPA).toHaveLength(37);
    for (const profile of series.profiles) {
      expect(profile.surface.dewpointC).toBeLessThanOrEqual(profile.surface.temperatureC);
      for (const level of profile.levels) {
        expect(DEMO_PRESSURE_LEVELS_HPA).toContain(level.pressureHpa);
        expect(level.pressureHpa).toBeLessThan(profile.surface.pressureHpa);
        expect(level.heightM).toBeGreaterThan(profile.surface.elevationM);
        expect(level.dewpointC).toBeLessThanOrEqual(level.temperatureC);
      }
      expect(prepareProfile(profile).ok).toBe(true);
    }
  });

  it('has heights that obey the hypsometric equation with the virtual temperature', async () => {
    // Hypsometric equation: Δz = (Rd T̄v / g) ln(p1/p2) (Wallace and Hobbs 2006, eq. 3.29; from memory),
    // Rd = 287.04 J/(kg K) (Bolton 1980), g = 9.80665 m/s². T̄v as the mean of the two levels' Tv,
    // exact for a lapse linear in ln p; the column is finer than that, so allow 0.3 % of the thickness.
    const series = await seriesFor(43.62, -115.48, '2026-08-14T06:00:00Z', 24);
    for (const profile of [series.profiles[0], series.profiles[9], series.profiles[20]]) {
      const levels = profile.levels;
      for (let index = 1; index < levels.length; index++) {
        const lower = levels[index - 1];
        const upper = levels[index];
        const tvK = (level: typeof lower) => virtualTemperatureK(level.temperatureC + 273.15, mixingRatioKgKg(level.dewpointC, level.pressureHpa));
        const expectedThicknessM = ((287.04 * (tvK(lower) + tvK(upper))) / 2 / 9.80665) * Math.log(lower.pressureHpa / upper.pressureHpa);
        expect(Math.abs(upper.heightM - lower.heightM - expectedThicknessM)).toBeLessThanOrEqual(0.003 * expectedThicknessM + 0.2);
      }
    }
  });

  it('has a dry, near-dry-adiabatic residual layer aloft at dawn: 9.3-9.6 °C/km, RH ≤ 25 %, ≥ 1 km deep, base 1.5-2.5 km above ground', async () => {
    for (const place of DEMO_PLACES) {
      const series = await seriesFor(place.latitude, place.longitude, '2026-08-14T06:00:00Z');
      const zone = 'America/Boise';
      const { layer, profile } = dawnDryLayer(series, zone, '2026-08-14');
      expect(layer.baseAglM).toBeGreaterThanOrEqual(1500);
      expect(layer.baseAglM).toBeLessThanOrEqual(2500);
      expect(layer.topAglM - layer.baseAglM).toBeGreaterThanOrEqual(1000);
      expect(layer.meanLapseRateCPerKm).toBeGreaterThanOrEqual(9.3);
      expect(layer.meanLapseRateCPerKm).toBeLessThanOrEqual(9.6);
      // Inside the layer (its end levels may share air with its neighbours) the air is dry.
      const rh = levelRelativeHumidity(profile);
      for (let index = 0; index < profile.heightAglM.length; index++) {
        if (profile.heightAglM[index] > layer.baseAglM && profile.heightAglM[index] < layer.topAglM) expect(rh[index]).toBeLessThanOrEqual(25);
      }
      // Below it, stable air: a surface inversion at dawn (common practice: radiative cooling at night).
      expect(profile.temperatureC[1]).toBeGreaterThan(profile.temperatureC[0]);
    }
  });

  it('heats by day and cools at night, dries from day to day, and has winds that increase with height', async () => {
    const zone = 'America/Boise';
    const series = await seriesFor(43.62, -115.48, '2026-08-14T06:00:00Z');
    const byDay = (date: string) => series.profiles.filter((profile) => localHourOf(profile.validTime, zone).date === date);
    const warmest = (profiles: ProfileInput[]) => profiles.reduce((best, profile) => (profile.surface.temperatureC > best.surface.temperatureC ? profile : best));
    const coolest = (profiles: ProfileInput[]) => profiles.reduce((best, profile) => (profile.surface.temperatureC < best.surface.temperatureC ? profile : best));
    const day0 = byDay('2026-08-14');
    const day1 = byDay('2026-08-15');
    const maxHour = localHourOf(warmest(day0).validTime, zone).hour;
    const minHour = localHourOf(coolest(day1).validTime, zone).hour;
    expect(maxHour).toBeGreaterThanOrEqual(14);
    expect(maxHour).toBeLessThanOrEqual(17);
    expect(minHour).toBeGreaterThanOrEqual(4);
    expect(minHour).toBeLessThanOrEqual(8);
    expect(warmest(day0).surface.temperatureC - coolest(day0).surface.temperatureC).toBeGreaterThan(12);

    const minSurfaceRh = (profiles: ProfileInput[]) => Math.min(...profiles.map((profile) => relativeHumidityPct(profile.surface.temperatureC, profile.surface.dewpointC)));
    expect(minSurfaceRh(day1)).toBeLessThan(minSurfaceRh(day0));
    const dryLayerRh = (date: string) => dawnDryLayer(series, zone, date).layer.maxRelativeHumidityPct;
    expect(dryLayerRh('2026-08-15')).toBeLessThan(dryLayerRh('2026-08-14'));

    // A mixed layer shares one wind through its depth (common practice: momentum is mixed), so by
    // day the low levels may be equal; they never decrease upward, and at dawn they increase.
    for (const profile of series.profiles) {
      const at = (pressureHpa: number) => profile.levels.find((level) => level.pressureHpa === pressureHpa)!.windSpeedMs;
      const dawn = localHourOf(profile.validTime, zone).hour === 5;
      expect(at(700)).toBeGreaterThanOrEqual(at(800));
      expect(at(500)).toBeGreaterThanOrEqual(at(700));
      expect(at(300)).toBeGreaterThan(at(500));
      if (dawn) {
        expect(at(700)).toBeGreaterThan(at(800));
        expect(at(500)).toBeGreaterThan(at(700));
      }
    }
  });
});

describe('demo source: the afternoon coupling', () => {
  // The crossing the scenario is written to show: the parcel mixing height reaching the dry layer's base.
  it.each(DEMO_PLACES.map((place) => [place.name, place] as const))('at %s the first afternoon couples between 13:00 and 17:00 local, never before noon', async (_name, place) => {
    const zone = 'America/Boise';
    const series = await seriesFor(place.latitude, place.longitude, '2026-08-14T06:00:00Z');
    const { layer } = dawnDryLayer(series, zone, '2026-08-14');
    const hours = couplingHours(series, zone, '2026-08-14', layer.baseAglM);
    expect(hours.length).toBeGreaterThan(0);
    expect(hours[0]).toBeGreaterThanOrEqual(13);
    expect(hours[0]).toBeLessThanOrEqual(17);
    expect(hours.filter((hour) => hour < 12)).toEqual([]);
    // The second day couples too, still not before noon.
    const day1 = couplingHours(series, zone, '2026-08-15', dawnDryLayer(series, zone, '2026-08-15').layer.baseAglM);
    expect(day1.filter((hour) => hour < 12)).toEqual([]);
    expect(day1.length).toBeGreaterThan(0);
  });

  it('builds the same scenario over any point, in that point’s own local time', async () => {
    // Two invented test points in different time zones (Mountain and Pacific), no elevation given.
    for (const [latitude, longitude, zone] of [
      [39.2, -106.9, 'America/Denver'],
      [37.1, -119.6, 'America/Los_Angeles'],
    ] as const) {
      const startLocalMidnight = DateTime.fromISO('2026-08-20T00:00', { zone }).toUTC().toISO()!;
      const result = await demo.fetchSeries({ latitude, longitude }, { startTime: startLocalMidnight, hours: 48 });
      expect(result.ok).toBe(true);
      if (!result.ok) continue;
      expect(result.series.location.elevationM).toBe(1200);
      expect(result.series.notes?.join(' ')).toMatch(/assumes 1200 m/);
      expect(result.series.notes?.join(' ')).toContain(zone);
      const { layer } = dawnDryLayer(result.series, zone, '2026-08-20');
      const hours = couplingHours(result.series, zone, '2026-08-20', layer.baseAglM);
      expect(hours[0]).toBeGreaterThanOrEqual(13);
      expect(hours[0]).toBeLessThanOrEqual(17);
    }
  });

  it('starts the scenario on the next day when the window starts after midday, so the coupling is not lost', async () => {
    const zone = 'America/Boise';
    const start = DateTime.fromISO('2026-08-14T16:00', { zone }).toUTC().toISO()!;
    const series = await seriesFor(43.62, -115.48, start);
    const { layer } = dawnDryLayer(series, zone, '2026-08-15');
    expect(couplingHours(series, zone, '2026-08-14', layer.baseAglM)).toEqual([]);
    const next = couplingHours(series, zone, '2026-08-15', layer.baseAglM);
    expect(next[0]).toBeGreaterThanOrEqual(13);
    expect(next[0]).toBeLessThanOrEqual(17);
  });
});
