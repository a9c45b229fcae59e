import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { analyzeProfile, analyzeProfileInput } from '../../src/core/analyzeProfile.ts';
import { DRY_AIR_GAS_CONSTANT_JKGK, GRAVITY_MS2 } from '../../src/core/constants.ts';
import { mixingHeightAglM } from '../../src/core/mixing/mixingHeight.ts';
import { prepareProfile } from '../../src/core/prepareProfile.ts';
import type { LevelInput, ProfileInput } from '../../src/core/profile.ts';
import { virtualTemperatureK } from '../../src/core/thermo/potentialTemperature.ts';
import { mixingRatioKgKg } from '../../src/core/thermo/vapour.ts';

/**
 * Random but physically consistent profiles (all invented): a surface at a pressure whose
 * elevation follows the US Standard Atmosphere 1976 (barometric formula, from memory), then levels
 * at falling pressure with lapse rates between −8 and 12 °C/km (inversions to superadiabatic layers),
 * dew points at or below the temperature, and heights from the hypsometric equation with the
 * layer's mean virtual temperature (common practice).
 */
interface LayerDraw {
  pressureStepHpa: number;
  lapseRateCPerKm: number;
  dewpointDepressionC: number;
  windDirDeg: number;
  windSpeedMs: number;
}

const windDraw = {
  windDirDeg: fc.double({ min: 0, max: 360, noNaN: true }),
  windSpeedMs: fc.double({ min: 0, max: 45, noNaN: true }),
};

/** Any layer: from an inversion to superadiabatic, from saturated to very dry. */
const anyLayer: fc.Arbitrary<LayerDraw> = fc.record({
  pressureStepHpa: fc.double({ min: 10, max: 75, noNaN: true }),
  lapseRateCPerKm: fc.double({ min: -8, max: 12, noNaN: true }),
  dewpointDepressionC: fc.double({ min: 0, max: 35, noNaN: true }),
  ...windDraw,
});

/** A dry, near-dry-adiabatic layer, so that runs of them build the layers aloft that the bot watches. */
const dryAdiabaticLayer: fc.Arbitrary<LayerDraw> = fc.record({
  pressureStepHpa: fc.double({ min: 20, max: 60, noNaN: true }),
  lapseRateCPerKm: fc.double({ min: 9.05, max: 10.5, noNaN: true }),
  dewpointDepressionC: fc.double({ min: 18, max: 35, noNaN: true }),
  ...windDraw,
});

const layerDraw = fc.oneof({ arbitrary: anyLayer, weight: 2 }, { arbitrary: dryAdiabaticLayer, weight: 1 });

const profileDraw = fc.record({
  surfacePressureHpa: fc.double({ min: 650, max: 1045, noNaN: true }),
  surfaceTemperatureC: fc.double({ min: -30, max: 45, noNaN: true }),
  surfaceDewpointDepressionC: fc.double({ min: 0, max: 40, noNaN: true }),
  surfaceWindSpeedMs: fc.double({ min: 0, max: 20, noNaN: true }),
  layers: fc.array(layerDraw, { minLength: 2, maxLength: 45 }),
});

type ProfileDraw = typeof profileDraw extends fc.Arbitrary<infer Draw> ? Draw : never;

function buildProfile(draw: ProfileDraw): ProfileInput {
  const elevationM = 44330.8 * (1 - Math.pow(draw.surfacePressureHpa / 1013.25, 0.190263));
  const levels: LevelInput[] = [];
  let pressureHpa = draw.surfacePressureHpa;
  let heightM = elevationM;
  let temperatureC = draw.surfaceTemperatureC;
  let dewpointC = temperatureC - draw.surfaceDewpointDepressionC;
  for (const layer of draw.layers) {
    const topPressureHpa = pressureHpa - layer.pressureStepHpa;
    if (topPressureHpa < 100) break;
    let topTemperatureC = temperatureC;
    let thicknessM = 0;
    const topDewpointGuessC = (t: number) => Math.max(-99, t - layer.dewpointDepressionC);
    for (let iteration = 0; iteration < 4; iteration++) {
      const meanVirtualK =
        (virtualTemperatureK(temperatureC + 273.15, mixingRatioKgKg(dewpointC, pressureHpa)) +
          virtualTemperatureK(topTemperatureC + 273.15, mixingRatioKgKg(topDewpointGuessC(topTemperatureC), topPressureHpa))) /
        2;
      thicknessM = ((DRY_AIR_GAS_CONSTANT_JKGK * meanVirtualK) / GRAVITY_MS2) * Math.log(pressureHpa / topPressureHpa);
      topTemperatureC = Math.max(-95, temperatureC - (layer.lapseRateCPerKm * thicknessM) / 1000);
    }
    pressureHpa = topPressureHpa;
    heightM += thicknessM;
    temperatureC = topTemperatureC;
    dewpointC = topDewpointGuessC(temperatureC);
    levels.push({ pressureHpa, heightM, temperatureC, dewpointC, windDirDeg: layer.windDirDeg, windSpeedMs: layer.windSpeedMs });
  }
  return {
    name: 'random profile (invented)',
    validTime: '2026-08-14T21:00:00Z',
    latitude: null,
    longitude: null,
    surface: {
      pressureHpa: draw.surfacePressureHpa,
      elevationM,
      temperatureC: draw.surfaceTemperatureC,
      dewpointC: draw.surfaceTemperatureC - draw.surfaceDewpointDepressionC,
      windDirDeg: 200,
      windSpeedMs: draw.surfaceWindSpeedMs,
    },
    levels,
  };
}

/** Paths of every number in a value that is not finite (NaN or ±Infinity would break the JSON contract). */
function nonFiniteNumbers(value: unknown, path = 'result'): string[] {
  if (typeof value === 'number') return Number.isFinite(value) ? [] : [`${path} = ${value}`];
  if (Array.isArray(value)) return value.flatMap((item, index) => nonFiniteNumbers(item, `${path}[${index}]`));
  if (value !== null && typeof value === 'object') {
    return Object.entries(value).flatMap(([key, item]) => nonFiniteNumbers(item, `${path}.${key}`));
  }
  return [];
}

const usable = profileDraw.map(buildProfile).filter((profile) => profile.levels.length >= 2);

describe('property: every valid random profile gives a sane analysis', () => {
  it('CAPE ≥ 0, CIN ≤ 0 (Doswell and Rasmussen 1994 define CAPE and CIN as the positive and negative buoyant energy), LCL at or above the ground, mixing height inside the profile, no NaN', () => {
    fc.assert(
      fc.property(usable, fc.boolean(), (input, virtualTemperature) => {
        const analysed = analyzeProfileInput(input, { virtualTemperature });
        if (!analysed.ok) throw new Error(`a valid generated profile was refused: ${analysed.errors.join('; ')}`);
        const result = analysed.result;
        const topAglM = result.levels[result.levels.length - 1].heightAglM;
        expect(nonFiniteNumbers(result)).toEqual([]);
        for (const parcel of [result.parcels.surface, result.parcels.mixedLayer]) {
          expect(parcel.capeJkg).toBeGreaterThanOrEqual(0);
          expect(parcel.cinJkg).toBeLessThanOrEqual(0);
        }
        expect(result.lcl.heightAglM).toBeGreaterThanOrEqual(0);
        expect(result.lcl.pressureHpa).toBeLessThanOrEqual(input.surface.pressureHpa);
        expect(result.mixingHeight.aglM).toBeGreaterThanOrEqual(0);
        expect(result.mixingHeight.aglM).toBeLessThanOrEqual(topAglM);
        expect(result.mixingHeight.effectiveAglM).toBeGreaterThanOrEqual(result.mixingHeight.aglM);
        expect(result.mixingHeight.effectiveAglM).toBeLessThanOrEqual(topAglM);
        expect(result.layers).toHaveLength(result.levels.length - 1);
        for (const layer of result.dryNearAdiabaticLayers) {
          expect(layer.topAglM - layer.baseAglM).toBeGreaterThanOrEqual(500);
          expect(layer.meanLapseRateCPerKm).toBeGreaterThanOrEqual(9.0);
          expect(layer.maxRelativeHumidityPct).toBeLessThanOrEqual(40);
        }
      }),
      { numRuns: 300 },
    );
  });

  it('a warmer surface never lowers the mixing height, and at each trigger temperature the mixed layer reaches the layer base', () => {
    fc.assert(
      fc.property(usable, fc.double({ min: 0, max: 15, noNaN: true }), (input, warmingC) => {
        const prepared = prepareProfile(input);
        if (!prepared.ok) throw new Error(prepared.errors.join('; '));
        const profile = prepared.profile;
        const surfaceTemperatureC = profile.temperatureC[0];
        expect(mixingHeightAglM(profile, surfaceTemperatureC + warmingC)).toBeGreaterThanOrEqual(mixingHeightAglM(profile, surfaceTemperatureC));
        for (const layer of analyzeProfile(profile).dryNearAdiabaticLayers) {
          if (layer.triggerTemperatureC === null || layer.baseAglM === 0) continue;
          // 1e-9 °C absorbs the round trip θ → T → θ in floating point.
          expect(mixingHeightAglM(profile, layer.triggerTemperatureC + 1e-9)).toBeGreaterThanOrEqual(layer.baseAglM);
          expect(mixingHeightAglM(profile, layer.triggerTemperatureC - 0.01)).toBeLessThan(layer.baseAglM);
        }
      }),
      { numRuns: 300 },
    );
  });
});
