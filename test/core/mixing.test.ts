import { describe, expect, it } from 'vitest';
import type { DryNearAdiabaticLayer } from '../../src/core/analysisResult.ts';
import { coupleMixedLayer } from '../../src/core/mixing/coupling.ts';
import { mixedLayerMinRelativeHumidityPct } from '../../src/core/mixing/mixedLayerMinRelativeHumidity.ts';
import { mixingHeightAglM, parcelMixesThroughProfile } from '../../src/core/mixing/mixingHeight.ts';
import { transportWind } from '../../src/core/mixing/transportWind.ts';
import { MAX_PLAUSIBLE_SURFACE_TEMPERATURE_C, triggerTemperatureC } from '../../src/core/mixing/triggerTemperature.ts';
import { ventilationM2s } from '../../src/core/mixing/ventilation.ts';
import { windReportFromComponents } from '../../src/core/mixing/windFromComponents.ts';
import { mixingHeightAglM as mixingHeightFromCorePath } from '../../src/core/mixingHeight.ts';
import type { PreparedProfile } from '../../src/core/profile.ts';
import { potentialTemperatureK, temperatureOnDryAdiabatC } from '../../src/core/thermo/potentialTemperature.ts';
import { relativeHumidityPct } from '../../src/core/thermo/vapour.ts';

interface Row {
  pressureHpa: number;
  heightAglM: number;
  thetaK: number;
  dewpointDepressionC?: number;
  windUMs?: number;
  windVMs?: number;
}

/** A hand-built profile given by θ at each level (temperature follows from Poisson's equation). Invented. */
function preparedFromTheta(rows: Row[]): PreparedProfile {
  const temperatureC = Float64Array.from(rows, (row) => temperatureOnDryAdiabatC(row.thetaK, row.pressureHpa));
  return {
    name: 'hand-built (invented)',
    validTime: '2026-01-01T00:00:00Z',
    latitude: null,
    longitude: null,
    elevationM: 0,
    pressureHpa: Float64Array.from(rows, (row) => row.pressureHpa),
    heightAglM: Float64Array.from(rows, (row) => row.heightAglM),
    heightMslM: Float64Array.from(rows, (row) => row.heightAglM),
    temperatureC,
    dewpointC: Float64Array.from(rows, (row, i) => temperatureC[i] - (row.dewpointDepressionC ?? 20)),
    windUMs: Float64Array.from(rows, (row) => row.windUMs ?? 0),
    windVMs: Float64Array.from(rows, (row) => row.windVMs ?? 0),
    thetaK: Float64Array.from(rows, (row) => row.thetaK),
  };
}

// Surface at 1000 hPa, so θ = T + 273.15 there and trigger temperatures read off by hand.
const capped = preparedFromTheta([
  { pressureHpa: 1000, heightAglM: 0, thetaK: 305 },
  { pressureHpa: 975, heightAglM: 220, thetaK: 304 }, // superadiabatic surface layer
  { pressureHpa: 900, heightAglM: 1000, thetaK: 304.5 },
  { pressureHpa: 850, heightAglM: 1500, thetaK: 306.5 }, // capping stable layer
  { pressureHpa: 700, heightAglM: 3000, thetaK: 308 },
]);

describe('mixing height by the parcel method (Holzworth 1964, from memory; DESIGN.md)', () => {
  it('interpolates linearly in height where θ first exceeds the surface parcel: 1000 + 500 × (305 − 304.5)/(306.5 − 304.5) = 1125 m', () => {
    expect(mixingHeightAglM(capped)).toBeCloseTo(1125, 9);
  });

  it('is re-exported from src/core/mixingHeight.ts', () => {
    expect(mixingHeightFromCorePath(capped)).toBe(mixingHeightAglM(capped));
  });

  it('with a warmer afternoon surface (θ 307 K = 33.85 °C at 1000 hPa) mixes to 1500 + 1500 × 0.5/1.5 = 2000 m', () => {
    expect(mixingHeightAglM(capped, 307 - 273.15)).toBeCloseTo(2000, 9);
  });

  it('is 0 when the first level is already warmer in θ than the surface parcel (a surface inversion)', () => {
    const inversion = preparedFromTheta([
      { pressureHpa: 1000, heightAglM: 0, thetaK: 290 },
      { pressureHpa: 975, heightAglM: 220, thetaK: 293 },
      { pressureHpa: 900, heightAglM: 1000, thetaK: 296 },
    ]);
    expect(mixingHeightAglM(inversion)).toBe(0);
    expect(parcelMixesThroughProfile(inversion.thetaK, inversion.thetaK[0])).toBe(false);
  });

  it('is 0 when a given surface temperature is colder than the air above', () => {
    expect(mixingHeightAglM(capped, 20)).toBe(0);
  });

  it('is the profile top, flagged, when no level is warmer in θ', () => {
    expect(mixingHeightAglM(capped, 40)).toBe(3000);
    expect(parcelMixesThroughProfile(capped.thetaK, potentialTemperatureK(40, 1000))).toBe(true);
    expect(parcelMixesThroughProfile(capped.thetaK, capped.thetaK[0])).toBe(false);
  });

  it('does not stop at a level of equal θ: the environment must exceed the parcel', () => {
    const equal = preparedFromTheta([
      { pressureHpa: 1000, heightAglM: 0, thetaK: 300 },
      { pressureHpa: 950, heightAglM: 450, thetaK: 300 },
      { pressureHpa: 900, heightAglM: 900, thetaK: 302 },
    ]);
    expect(mixingHeightAglM(equal)).toBeCloseTo(450, 9);
  });
});

describe('transport wind: the mean wind vector through the mixed layer (DESIGN.md; common practice)', () => {
  it('is the height-weighted mean of the components (trapezoid rule)', () => {
    // u = 10 m/s from 0 to 100 m, falling linearly to 0 at 1000 m: mean = (10·100 + ½·10·900)/1000 = 5.5 m/s from the west.
    const profile = preparedFromTheta([
      { pressureHpa: 1000, heightAglM: 0, thetaK: 300, windUMs: 10 },
      { pressureHpa: 990, heightAglM: 100, thetaK: 300, windUMs: 10 },
      { pressureHpa: 900, heightAglM: 1000, thetaK: 300, windUMs: 0 },
    ]);
    const wind = transportWind(profile, 1000);
    expect(wind.speedMs).toBeCloseTo(5.5, 10);
    expect(wind.dirDeg).toBeCloseTo(270, 10);
  });

  it('interpolates the wind at a mixing height between levels', () => {
    // v = −20 m/s (from the north) at the surface, 0 at 1000 m; to 500 m the mean is −15 m/s.
    const profile = preparedFromTheta([
      { pressureHpa: 1000, heightAglM: 0, thetaK: 300, windVMs: -20 },
      { pressureHpa: 900, heightAglM: 1000, thetaK: 300, windVMs: 0 },
      { pressureHpa: 800, heightAglM: 2000, thetaK: 301, windVMs: 0 },
    ]);
    const wind = transportWind(profile, 500);
    expect(wind.speedMs).toBeCloseTo(15, 10);
    expect(wind.dirDeg).toBeCloseTo(0, 10);
  });

  it('is a vector mean: opposed winds of equal depth cancel, where a mean of speeds would give 10 m/s', () => {
    const profile = preparedFromTheta([
      { pressureHpa: 1000, heightAglM: 0, thetaK: 300, windUMs: 10 },
      { pressureHpa: 950, heightAglM: 500, thetaK: 300, windUMs: 10 },
      { pressureHpa: 940, heightAglM: 501, thetaK: 300, windUMs: -10 },
      { pressureHpa: 900, heightAglM: 1001, thetaK: 300, windUMs: -10 },
    ]);
    expect(transportWind(profile, 1001).speedMs).toBeCloseTo(0, 10);
  });

  it('is the surface wind when the mixed layer has no depth', () => {
    const profile = preparedFromTheta([
      { pressureHpa: 1000, heightAglM: 0, thetaK: 300, windUMs: 3, windVMs: 4 },
      { pressureHpa: 900, heightAglM: 1000, thetaK: 305, windUMs: 30 },
      { pressureHpa: 800, heightAglM: 2000, thetaK: 310 },
    ]);
    expect(transportWind(profile, 0).speedMs).toBeCloseTo(5, 12);
  });

  it('reports the direction the wind blows from (meteorological convention, common practice)', () => {
    expect(windReportFromComponents(0, -5).dirDeg).toBeCloseTo(0, 10); // from the north
    expect(windReportFromComponents(-5, 0).dirDeg).toBeCloseTo(90, 10); // from the east
    expect(windReportFromComponents(0, 5).dirDeg).toBeCloseTo(180, 10);
    expect(windReportFromComponents(5, 0).dirDeg).toBeCloseTo(270, 10);
    expect(windReportFromComponents(0, 0)).toEqual({ speedMs: 0, dirDeg: 0 });
  });
});

describe('ventilation (DESIGN.md: mixing height × transport wind speed; common practice)', () => {
  it('is the product, m²/s', () => {
    expect(ventilationM2s(1125, 8)).toBe(9000);
  });
});

describe('mixed-layer minimum relative humidity', () => {
  it('includes the value at the mixing height, interpolated in height', () => {
    const profile = preparedFromTheta([
      { pressureHpa: 1000, heightAglM: 0, thetaK: 305, dewpointDepressionC: 10 },
      { pressureHpa: 950, heightAglM: 450, thetaK: 304.8, dewpointDepressionC: 20 },
      { pressureHpa: 900, heightAglM: 900, thetaK: 306, dewpointDepressionC: 40 },
    ]);
    const humidity = Float64Array.from(profile.temperatureC, (t, i) => relativeHumidityPct(t, profile.dewpointC[i]));
    const mixingM = mixingHeightAglM(profile);
    const fraction = (mixingM - 450) / 450;
    const temperatureC = profile.temperatureC[1] + fraction * (profile.temperatureC[2] - profile.temperatureC[1]);
    const dewpointC = profile.dewpointC[1] + fraction * (profile.dewpointC[2] - profile.dewpointC[1]);
    expect(mixedLayerMinRelativeHumidityPct(profile, humidity, mixingM)).toBeCloseTo(relativeHumidityPct(temperatureC, dewpointC), 10);
    expect(mixedLayerMinRelativeHumidityPct(profile, humidity, 0)).toBeCloseTo(humidity[0], 12);
  });
});

describe('trigger temperature: the surface temperature at which the mixed layer reaches a layer base', () => {
  // Base at level 3 (1500 m). Highest θ from level 1 to the base is 306.5 K; at 1000 hPa that is 33.35 °C.
  it('is the temperature of the highest θ between the surface and the base, by hand', () => {
    expect(triggerTemperatureC(capped, 3)).toBeCloseTo(306.5 - 273.15, 10);
  });

  it('mixes to the base at the trigger temperature and not below it', () => {
    const triggerC = triggerTemperatureC(capped, 3)!;
    expect(mixingHeightAglM(capped, triggerC)).toBeGreaterThanOrEqual(1500);
    expect(mixingHeightAglM(capped, triggerC - 0.01)).toBeLessThan(1500);
  });

  it('is the profile surface temperature for a layer that starts at the ground', () => {
    expect(triggerTemperatureC(capped, 0)).toBe(capped.temperatureC[0]);
  });

  it('is null when only an implausible surface temperature would do', () => {
    const hotAloft = preparedFromTheta([
      { pressureHpa: 1000, heightAglM: 0, thetaK: 300 },
      { pressureHpa: 900, heightAglM: 1000, thetaK: 340 },
      { pressureHpa: 800, heightAglM: 2000, thetaK: 341 },
    ]);
    expect(273.15 + MAX_PLAUSIBLE_SURFACE_TEMPERATURE_C).toBeLessThan(340);
    expect(triggerTemperatureC(hotAloft, 1)).toBeNull();
  });
});

describe('coupling (DESIGN.md): reaching a dry layer makes its top the effective mixing height', () => {
  const layer = (baseAglM: number, topAglM: number): DryNearAdiabaticLayer => ({
    baseAglM,
    topAglM,
    basePressureHpa: 0,
    topPressureHpa: 0,
    meanLapseRateCPerKm: 9.5,
    maxRelativeHumidityPct: 20,
    triggerTemperatureC: null,
  });
  const layers = [layer(1000, 2000), layer(2000, 3000), layer(3500, 4000)];

  it('below the first base nothing is reached', () => {
    expect(coupleMixedLayer(999, layers)).toEqual({ effectiveAglM: 999, coupledLayerIndex: null });
  });

  it('at a base exactly, the layer is reached, and its top touching the next base carries on', () => {
    expect(coupleMixedLayer(1000, layers)).toEqual({ effectiveAglM: 3000, coupledLayerIndex: 1 });
  });

  it('a mixing height above a layer top keeps the higher value', () => {
    expect(coupleMixedLayer(3200, layers)).toEqual({ effectiveAglM: 3200, coupledLayerIndex: 1 });
    expect(coupleMixedLayer(3600, layers)).toEqual({ effectiveAglM: 4000, coupledLayerIndex: 2 });
  });

  it('a dry layer from the ground up is the mixed layer itself, not air aloft: it is never "reached"', () => {
    expect(coupleMixedLayer(800, [layer(0, 800)])).toEqual({ effectiveAglM: 800, coupledLayerIndex: null });
    expect(coupleMixedLayer(800, [layer(0, 800), layer(1500, 3000)])).toEqual({ effectiveAglM: 800, coupledLayerIndex: null });
    expect(coupleMixedLayer(1600, [layer(0, 800), layer(1500, 3000)])).toEqual({ effectiveAglM: 3000, coupledLayerIndex: 1 });
  });

  it('with no dry layers the effective height is the mixing height', () => {
    expect(coupleMixedLayer(1234, [])).toEqual({ effectiveAglM: 1234, coupledLayerIndex: null });
  });
});
