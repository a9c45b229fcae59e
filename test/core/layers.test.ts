import { describe, expect, it } from 'vitest';
import type { PreparedProfile } from '../../src/core/profile.ts';
import { classifyLapseRate } from '../../src/core/layers/classifyLayer.ts';
import { dryNearAdiabaticLayers } from '../../src/core/layers/dryNearAdiabaticLayers.ts';
import { layerReport } from '../../src/core/layers/layerReport.ts';
import { levelPairLayers } from '../../src/core/layers/levelPairLayers.ts';
import { standardLayers } from '../../src/core/layers/standardLayers.ts';
import { potentialTemperatureK } from '../../src/core/thermo/potentialTemperature.ts';
import { pseudoAdiabaticLapseRateCPerKm } from '../../src/core/thermo/pseudoAdiabat.ts';
import { relativeHumidityPct } from '../../src/core/thermo/vapour.ts';

/** Rows of [pressureHpa, heightAglM, temperatureC, dewpointC]; the first is the surface. Hand-built, invented. */
function preparedFrom(rows: ReadonlyArray<readonly [number, number, number, number]>): PreparedProfile {
  const column = (pick: (row: readonly [number, number, number, number]) => number) => Float64Array.from(rows, pick);
  return {
    name: 'hand-built (invented)',
    validTime: '2026-01-01T00:00:00Z',
    latitude: null,
    longitude: null,
    elevationM: 500,
    pressureHpa: column((row) => row[0]),
    heightAglM: column((row) => row[1]),
    heightMslM: column((row) => row[1] + 500),
    temperatureC: column((row) => row[2]),
    dewpointC: column((row) => row[3]),
    windUMs: new Float64Array(rows.length),
    windVMs: new Float64Array(rows.length),
    thetaK: column((row) => potentialTemperatureK(row[2], row[0])),
  };
}

function humidityOf(profile: PreparedProfile): Float64Array {
  return Float64Array.from(profile.temperatureC, (temperatureC, i) => relativeHumidityPct(temperatureC, profile.dewpointC[i]));
}

describe('classifyLapseRate: the bands of DESIGN.md (project definitions)', () => {
  // Γm = 6 °C/km here, a typical mid-troposphere moist rate (common practice).
  const cases: Array<[number, string]> = [
    [-0.01, 'inversion'],
    [0, 'isothermal'],
    [0.49, 'isothermal'],
    [0.5, 'stable'],
    [5.99, 'stable'],
    [6, 'conditionally-unstable'],
    [8.99, 'conditionally-unstable'],
    [9.0, 'near-dry-adiabatic'],
    [9.8, 'near-dry-adiabatic'],
    [9.81, 'absolutely-unstable'],
  ];
  it.each(cases)('Γ = %s °C/km with Γm = 6 is %s', (lapseRateCPerKm, expected) => {
    expect(classifyLapseRate(lapseRateCPerKm, 6)).toBe(expected);
  });

  it('in very cold air, where Γm exceeds 9.0, a layer of 9.2 °C/km is near-dry-adiabatic (project choice, documented in classifyLayer.ts)', () => {
    expect(classifyLapseRate(9.2, 9.5)).toBe('near-dry-adiabatic');
    expect(classifyLapseRate(8.9, 9.5)).toBe('stable');
  });
});

describe('layerReport', () => {
  it('an exactly dry-adiabatic layer (9.8 °C/km, g/cp as the trade rounds it: common practice) is near-dry-adiabatic with ratio 1', () => {
    const layer = layerReport(900, 800, 0, 1000, 25, 15.2);
    expect(layer.lapseRateCPerKm).toBeCloseTo(9.8, 10);
    expect(layer.ratioToDryAdiabat).toBeCloseTo(1, 10);
    expect(layer.class).toBe('near-dry-adiabatic');
  });

  it('a layer warming 2 °C over 500 m is an inversion of −4 °C/km', () => {
    const layer = layerReport(900, 850, 0, 500, 10, 12);
    expect(layer.lapseRateCPerKm).toBeCloseTo(-4, 10);
    expect(layer.class).toBe('inversion');
  });

  it('takes Γm at the mean temperature and the ln-p middle of the layer', () => {
    const layer = layerReport(1000, 900, 0, 900, 20, 15);
    expect(layer.moistLapseRateCPerKm).toBeCloseTo(pseudoAdiabaticLapseRateCPerKm(17.5, Math.sqrt(1000 * 900)), 12);
  });

  it('the same 5 °C/km is conditionally unstable in warm air and stable in cold air (Γm is larger in cold air: AMS Glossary, "pseudoadiabatic lapse rate")', () => {
    expect(layerReport(1000, 950, 0, 450, 25, 22.75).class).toBe('conditionally-unstable');
    expect(layerReport(500, 450, 5000, 5900, -30, -34.5).class).toBe('stable');
  });
});

describe('levelPairLayers', () => {
  it('gives one layer per adjacent pair with its bounds and lapse rate', () => {
    const profile = preparedFrom([
      [900, 0, 20, 0],
      [880, 200, 22, 0],
      [800, 1000, 14, -10],
    ]);
    const layers = levelPairLayers(profile);
    expect(layers).toHaveLength(2);
    expect(layers[0]).toMatchObject({ basePressureHpa: 900, topPressureHpa: 880, baseAglM: 0, topAglM: 200, class: 'inversion' });
    expect(layers[0].lapseRateCPerKm).toBeCloseTo(-10, 10);
    expect(layers[1].lapseRateCPerKm).toBeCloseTo(10, 10);
    expect(layers[1].class).toBe('absolutely-unstable');
  });
});

describe('standardLayers', () => {
  const profile = preparedFrom([
    [900, 0, 30, 5],
    [850, 480, 25.2, 2],
    [800, 980, 20.2, 0],
    [700, 2000, 12, -5],
    [500, 4500, -8, -20],
    [400, 6100, -20, -30],
  ]);
  const byName = new Map(standardLayers(profile).map((layer) => [layer.name, layer]));

  it('interpolates temperature linearly in height at 1 km (20.2 → 12 over 980–2000 m)', () => {
    const temperatureAt1kmC = 20.2 + ((1000 - 980) / (2000 - 980)) * (12 - 20.2);
    expect(byName.get('sfc-1km')!.lapseRateCPerKm).toBeCloseTo(30 - temperatureAt1kmC, 10);
    expect(byName.get('sfc-1km')!.baseAglM).toBe(0);
    expect(byName.get('sfc-1km')!.topAglM).toBe(1000);
  });

  it('reads 850–700 and 700–500 hPa at their levels, and leaves out 950–850 hPa, which is under this ground (900 hPa)', () => {
    expect(byName.get('850-700hPa')!.lapseRateCPerKm).toBeCloseTo((1000 * (25.2 - 12)) / (2000 - 480), 10);
    expect(byName.get('700-500hPa')!.lapseRateCPerKm).toBeCloseTo(8, 10);
    expect(byName.has('950-850hPa')).toBe(false);
  });

  it('keeps 3–6 km (the top reaches 6100 m) and each layer carries a class and a ratio to 9.8', () => {
    const layer = byName.get('3-6km')!;
    expect(layer.ratioToDryAdiabat).toBeCloseTo(layer.lapseRateCPerKm / 9.8, 12);
    expect(typeof layer.class).toBe('string');
  });

  it('leaves out 3–6 km when the profile ends below 6 km', () => {
    const shallow = preparedFrom([
      [900, 0, 30, 5],
      [800, 980, 20.2, 0],
      [600, 3100, 2, -15],
    ]);
    expect(standardLayers(shallow).map((layer) => layer.name)).toEqual(['sfc-1km', '1-3km', '850-700hPa']);
  });
});

describe('dryNearAdiabaticLayers (DESIGN.md: Γ ≥ 9.0, RH ≤ 40 % at both ends, merged, at least 500 m deep)', () => {
  /** A stable moist base, then a 9.5 °C/km dry layer of the given depth in two pairs, then a stable top. */
  function profileWithDryLayer(depthM: number): PreparedProfile {
    const baseM = 1000;
    const baseTemperatureC = 15;
    const halfM = depthM / 2;
    return preparedFrom([
      [900, 0, 20, 15],
      [800, baseM, baseTemperatureC, -5],
      [780, baseM + halfM, baseTemperatureC - 9.5 * (halfM / 1000), -10],
      [760, baseM + depthM, baseTemperatureC - 9.5 * (depthM / 1000), -12],
      [700, baseM + depthM + 800, baseTemperatureC - 9.5 * (depthM / 1000) - 2, -25],
    ]);
  }

  it('keeps a 600 m layer, merged from two pairs, with its mean lapse rate and largest RH', () => {
    const profile = profileWithDryLayer(600);
    const humidity = humidityOf(profile);
    const layers = dryNearAdiabaticLayers(profile, humidity);
    expect(layers).toHaveLength(1);
    expect(layers[0].baseAglM).toBe(1000);
    expect(layers[0].topAglM).toBe(1600);
    expect(layers[0].basePressureHpa).toBe(800);
    expect(layers[0].topPressureHpa).toBe(760);
    expect(layers[0].meanLapseRateCPerKm).toBeCloseTo(9.5, 10);
    expect(layers[0].maxRelativeHumidityPct).toBeCloseTo(Math.max(humidity[1], humidity[2], humidity[3]), 12);
    expect(layers[0].maxRelativeHumidityPct).toBeLessThanOrEqual(40);
  });

  it('drops a 400 m layer', () => {
    const profile = profileWithDryLayer(400);
    expect(dryNearAdiabaticLayers(profile, humidityOf(profile))).toEqual([]);
  });

  it('drops the same 600 m layer when one end is moister than 40 %', () => {
    const profile = profileWithDryLayer(600);
    profile.dewpointC[2] = profile.temperatureC[2] - 5; // about 70 %: breaks the run in two 300 m halves
    expect(dryNearAdiabaticLayers(profile, humidityOf(profile))).toEqual([]);
  });

  it('does not take a pair of 8.9 °C/km', () => {
    const profile = preparedFrom([
      [900, 0, 20, -10],
      [850, 600, 20 - 8.9 * 0.6, -15],
      [800, 1200, 20 - 8.9 * 1.2, -20],
    ]);
    expect(dryNearAdiabaticLayers(profile, humidityOf(profile))).toEqual([]);
  });
});
