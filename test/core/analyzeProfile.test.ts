import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeProfile, analyzeProfileInput } from '../../src/core/analyzeProfile.ts';
import { mixingHeightAglM } from '../../src/core/mixing/mixingHeight.ts';
import { prepareProfile } from '../../src/core/prepareProfile.ts';
import type { PreparedProfile, ProfileInput } from '../../src/core/profile.ts';
import { parseProfileText } from '../../src/profile/parseProfileText.ts';

const demoPath = new URL('../../config/demo-profile.json', import.meta.url);

function demoInput(): ProfileInput {
  const parsed = parseProfileText(readFileSync(demoPath, 'utf8'), 'demo-profile.json');
  if (!parsed.ok) throw new Error(parsed.error);
  return parsed.profile;
}

function demoPrepared(): PreparedProfile {
  const prepared = prepareProfile(demoInput());
  if (!prepared.ok) throw new Error(prepared.errors.join('; '));
  return prepared.profile;
}

describe('the bundled demo profile (invented)', () => {
  it('says it is invented and has 37 levels from 1000 to 100 hPa', () => {
    const input = demoInput();
    expect(input.name).toMatch(/\(invented\)/);
    expect(input.levels).toHaveLength(37);
    expect(input.levels[0].pressureHpa).toBe(1000);
  });

  it('drops the six levels under its 870 hPa ground and reports the rest from the surface up', () => {
    const result = analyzeProfile(demoPrepared());
    expect(result.levels).toHaveLength(1 + 37 - 6);
    expect(result.levels[0]).toMatchObject({ pressureHpa: 870, heightAglM: 0, heightMslM: 1250 });
    expect(result.levels[1].pressureHpa).toBe(850);
  });

  it('mixes to about 1.9 km under its capping layer and holds a dry near-dry-adiabatic layer aloft with a trigger a few degrees warmer', () => {
    const result = analyzeProfile(demoPrepared());
    expect(result.mixingHeight.aglM).toBeGreaterThan(1800);
    expect(result.mixingHeight.aglM).toBeLessThan(2100);
    expect(result.mixingHeight.reachesProfileTop).toBe(false);
    const aloft = result.dryNearAdiabaticLayers.filter((layer) => layer.baseAglM > result.mixingHeight.aglM);
    expect(aloft).toHaveLength(1);
    expect(aloft[0].triggerTemperatureC).not.toBeNull();
    expect(aloft[0].triggerTemperatureC!).toBeGreaterThan(34);
    expect(aloft[0].triggerTemperatureC!).toBeLessThan(40);
  });
});

describe('analyzeProfile', () => {
  it('gives every key of the result, with the mixing height of mixingHeightAglM', () => {
    const profile = demoPrepared();
    const result = analyzeProfile(profile);
    expect(Object.keys(result).sort()).toEqual(
      [
        'name', 'validTime', 'latitude', 'longitude', 'elevationM', 'options', 'levels', 'lcl', 'layers', 'standardLayers',
        'dryNearAdiabaticLayers', 'mixingHeight', 'transportWind', 'ventilationM2s', 'mixedLayerMinRelativeHumidityPct',
        'plumeCloudPossible', 'haines', 'cHaines', 'hdw', 'hdwInputs', 'parcels', 'dcapeJkg', 'precipitableWaterMm', 'pft',
      ].sort(),
    );
    expect(result.mixingHeight.aglM).toBe(mixingHeightAglM(profile));
    expect(result.mixingHeight.mslM).toBeCloseTo(result.mixingHeight.aglM + 1250, 9);
    expect(result.ventilationM2s).toBeCloseTo(result.mixingHeight.aglM * result.transportWind.speedMs, 6);
    expect(result.plumeCloudPossible).toBe(result.mixingHeight.aglM >= result.parcels.surface.lclHeightAglM);
    expect(result.options).toEqual({ surfaceTemperatureC: null, virtualTemperature: true });
  });

  it('with an afternoon temperature at the trigger, the mixed layer reaches the dry layer aloft and the effective mixing height jumps to its top (DESIGN.md, coupling)', () => {
    const profile = demoPrepared();
    const before = analyzeProfile(profile);
    const index = before.dryNearAdiabaticLayers.findIndex((layer) => layer.baseAglM > before.mixingHeight.aglM);
    const layer = before.dryNearAdiabaticLayers[index];
    expect(before.mixingHeight.coupledLayerIndex === null || before.mixingHeight.coupledLayerIndex < index).toBe(true);

    const after = analyzeProfile(profile, { surfaceTemperatureC: layer.triggerTemperatureC! + 0.05 });
    expect(after.mixingHeight.aglM).toBeGreaterThanOrEqual(layer.baseAglM);
    expect(after.mixingHeight.coupledLayerIndex).toBe(index);
    expect(after.mixingHeight.effectiveAglM).toBeGreaterThanOrEqual(layer.topAglM);
    expect(after.mixingHeight.surfaceTemperatureC).toBeCloseTo(layer.triggerTemperatureC! + 0.05, 12);
  });

  it('an afternoon temperature moves the surface parcel and the mixed layer, not the layers of the profile', () => {
    const profile = demoPrepared();
    const before = analyzeProfile(profile);
    const after = analyzeProfile(profile, { surfaceTemperatureC: 36 });
    expect(after.options.surfaceTemperatureC).toBe(36);
    expect(after.mixingHeight.aglM).toBeGreaterThan(before.mixingHeight.aglM);
    expect(after.parcels.surface.startTemperatureC).toBe(36);
    expect(after.lcl.heightAglM).toBeGreaterThan(before.lcl.heightAglM);
    expect(after.levels).toEqual(before.levels);
    expect(after.layers).toEqual(before.layers);
    expect(after.standardLayers).toEqual(before.standardLayers);
    expect(after.dryNearAdiabaticLayers).toEqual(before.dryNearAdiabaticLayers);
  });

  it('does not change the profile it is given', () => {
    const profile = demoPrepared();
    const copy = structuredClone(profile);
    analyzeProfile(profile, { surfaceTemperatureC: 38, virtualTemperature: false });
    expect(profile).toEqual(copy);
  });
});

describe('analyzeProfileInput', () => {
  it('analyses a good raw profile', () => {
    const outcome = analyzeProfileInput(demoInput(), {});
    expect(outcome.ok).toBe(true);
  });

  it('refuses a dew point above the temperature, naming the level and field, and gives no numbers', () => {
    const input = demoInput();
    input.levels[7].dewpointC = input.levels[7].temperatureC + 3;
    const outcome = analyzeProfileInput(input, {});
    expect(outcome.ok).toBe(false);
    if (outcome.ok) return;
    expect(outcome.errors.join('\n')).toMatch(/825 hPa.*dewpointC/);
    expect('result' in outcome).toBe(false);
  });

  it.each([Number.NaN, 75, -150])('refuses an afternoon surface temperature of %s °C', (surfaceTemperatureC) => {
    const outcome = analyzeProfileInput(demoInput(), { surfaceTemperatureC });
    expect(outcome.ok).toBe(false);
    if (!outcome.ok) expect(outcome.errors[0]).toMatch(/surface temperature/);
  });
});
