import { describe, expect, it } from 'vitest';
import { parseProfileText } from '../../src/profile/parseProfileText.ts';
import { prepareProfile } from '../../src/core/prepareProfile.ts';
import type { ProfileInput } from '../../src/core/profile.ts';

// Invented profile for tests: an afternoon over an invented valley, not real data.
function invented(): ProfileInput {
  return {
    name: 'test (invented)',
    validTime: '2026-08-14T21:00:00Z',
    latitude: 44.1,
    longitude: -116.2,
    surface: { pressureHpa: 870, elevationM: 1250, temperatureC: 31.5, dewpointC: 2, windDirDeg: 240, windSpeedMs: 4 },
    levels: [
      { pressureHpa: 900, heightM: 950, temperatureC: 33, dewpointC: 2, windDirDeg: 240, windSpeedMs: 4 },
      { pressureHpa: 700, heightM: 3050, temperatureC: 14, dewpointC: -10, windDirDeg: 250, windSpeedMs: 10 },
      { pressureHpa: 850, heightM: 1440, temperatureC: 29.4, dewpointC: 0.5, windDirDeg: 0, windSpeedMs: 6 },
      { pressureHpa: 500, heightM: 5800, temperatureC: -10, dewpointC: -30, windDirDeg: 90, windSpeedMs: 15 },
    ],
  };
}

describe('prepareProfile', () => {
  it('sorts levels, drops the level under the ground and computes heights above ground', () => {
    const result = prepareProfile(invented());
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(Array.from(result.profile.pressureHpa)).toEqual([870, 850, 700, 500]);
    expect(Array.from(result.profile.heightAglM)).toEqual([0, 190, 1800, 4550]);
  });

  it('turns wind direction into components the meteorological way (a north wind blows southward)', () => {
    const result = prepareProfile(invented());
    if (!result.ok) throw new Error(result.errors.join());
    expect(result.profile.windUMs[1]).toBeCloseTo(0, 9);
    expect(result.profile.windVMs[1]).toBeCloseTo(-6, 9);
    expect(result.profile.windUMs[3]).toBeCloseTo(-15, 9); // an east wind blows westward
  });

  it('computes θ by Poisson with κ = 0.2854: 20 °C at 1000 hPa is 293.15 K (definition)', () => {
    const profile = invented();
    profile.surface = { ...profile.surface, pressureHpa: 1000, elevationM: 100, temperatureC: 20 };
    profile.levels = profile.levels.filter((level) => level.pressureHpa < 1000);
    const result = prepareProfile(profile);
    if (!result.ok) throw new Error(result.errors.join());
    expect(result.profile.thetaK[0]).toBeCloseTo(293.15, 9);
  });

  it('names level, field and reason for a dew point above the temperature', () => {
    const profile = invented();
    profile.levels[2] = { ...profile.levels[2], dewpointC: 31 };
    const result = prepareProfile(profile);
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.errors.join()).toMatch(/850 hPa: dewpointC 31 °C is above temperatureC 29.4 °C/);
  });

  it('refuses a height that does not increase as pressure falls', () => {
    const profile = invented();
    profile.levels[1] = { ...profile.levels[1], heightM: 1400 };
    const result = prepareProfile(profile);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.errors.join()).toMatch(/700 hPa: heightM 1400 m is not above/);
  });

  it('refuses a profile with fewer than 3 usable levels once the underground ones are gone', () => {
    const profile = invented();
    profile.levels = profile.levels.filter((level) => level.pressureHpa >= 850);
    const result = prepareProfile(profile);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.errors.join()).toMatch(/only 2 usable level/);
  });

  it('refuses NaN and says which field', () => {
    const profile = invented();
    profile.levels[1] = { ...profile.levels[1], temperatureC: Number.NaN };
    const result = prepareProfile(profile);
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.errors.join()).toMatch(/level 1 \(700 hPa\): temperatureC is NaN/);
  });
});

describe('parseProfileText', () => {
  it('reads the CSV form with the surface on the first row and metadata in comments', () => {
    const csv = [
      '# validTime: 2026-08-14T21:00:00Z',
      'pressureHpa,heightM,temperatureC,dewpointC,windDirDeg,windSpeedMs,latitude,longitude',
      '870,1250,31.5,2.0,240,4,44.1,-116.2',
      '850,1440,29.4,0.5,245,6,,',
      '700,3050,14,-10,250,10,,',
    ].join('\n');
    const parsed = parseProfileText(csv, 'dir/hour-21.csv');
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    expect(parsed.profile.name).toBe('hour-21');
    expect(parsed.profile.latitude).toBe(44.1);
    expect(parsed.profile.surface.elevationM).toBe(1250);
    expect(parsed.profile.levels).toHaveLength(2);
  });

  it('refuses physically impossible values with the field path (Kelvin given for Celsius)', () => {
    const profile = invented();
    profile.levels[0] = { ...profile.levels[0], temperatureC: 290 };
    const parsed = parseProfileText(JSON.stringify(profile), 'k.json');
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.error).toMatch(/k\.json: levels\[0\]\.temperatureC: must be between -100 and 60/);
  });

  it('refuses truncated JSON and a CSV cell that is not a number', () => {
    const truncated = parseProfileText(JSON.stringify(invented()).slice(0, 80), 't.json');
    expect(truncated.ok).toBe(false);
    if (!truncated.ok) expect(truncated.error).toMatch(/not valid JSON/);
    const csv = 'pressureHpa,heightM,temperatureC,dewpointC,windDirDeg,windSpeedMs\n870,1250,warm,2,240,4\n';
    const bad = parseProfileText(csv, 'b.csv');
    expect(bad.ok).toBe(false);
    if (!bad.ok) expect(bad.error).toMatch(/row 1: temperatureC "warm" is not a number/);
  });
});
