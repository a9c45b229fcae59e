/**
 * Indices (src/core/indices): Haines (1988) tables and variants, C-Haines (Mills and McCaw 2010),
 * Hot-Dry-Windy Index (Srock et al. 2018), pyroCb firepower threshold (Tory and Kepert 2021).
 */
import { describe, expect, it } from 'vitest';
import { continuousHainesFromValues } from '../../src/core/indices/continuousHaines.ts';
import { HAINES_VARIANTS, hainesTermScore, wholeDegreesC } from '../../src/core/indices/hainesCategories.ts';
import { HAINES_LABEL, hainesIndex, hainesVariantForElevation } from '../../src/core/indices/hainesIndex.ts';
import { hotDryWindyIndex } from '../../src/core/indices/hotDryWindyIndex.ts';
import { firepowerThresholdW, pyrocumulonimbusFirepowerThreshold } from '../../src/core/indices/pyrocumulonimbusFirepowerThreshold.ts';
import { environmentColumns } from '../../src/core/parcels/environmentColumns.ts';
import { analyzeParcelsAndIndices } from '../../src/core/parcelsAndIndices.ts';
import { saturationVapourPressureHpa } from '../../src/core/thermo/vapour.ts';
import { convectiveColumnInput, prepared, profileInputFromColumn, type ColumnPoint } from './parcelsProfiles.ts';

const [LOW, MID, HIGH] = HAINES_VARIANTS;
const score = (difference: number, limits: readonly [number, number]) => hainesTermScore(wholeDegreesC(difference), limits);

describe('Haines (1988) category tables, at and around every breakpoint', () => {
  // Differences are rounded to whole degrees (halves upward) before the table is read: X.4 stays, X.5 goes up.
  it('low variant, lapse term A (950–850 hPa): <4 → 1, 4–7 → 2, ≥8 → 3 (the breakpoint 8 °C)', () => {
    expect([3, 3.4, 3.5, 4, 7, 7.4, 7.5, 8, 9].map((d) => score(d, LOW.lapseLimitsC))).toEqual([1, 1, 2, 2, 2, 2, 3, 3, 3]);
  });
  it('mid variant, lapse term A (850–700 hPa): <6 → 1, 6–10 → 2, ≥11 → 3 (the breakpoint 11 °C)', () => {
    expect([5, 5.4, 5.5, 6, 10, 10.4, 10.5, 11, 12].map((d) => score(d, MID.lapseLimitsC))).toEqual([1, 1, 2, 2, 2, 2, 3, 3, 3]);
  });
  it('high variant, lapse term A (700–500 hPa): <18 → 1, 18–21 → 2, ≥22 → 3 (the breakpoint 22 °C)', () => {
    expect([17, 17.4, 17.5, 18, 21, 21.4, 21.5, 22, 23].map((d) => score(d, HIGH.lapseLimitsC))).toEqual([1, 1, 2, 2, 2, 2, 3, 3, 3]);
  });
  it('low variant, moisture term B (Tdd850): <6 → 1, 6–9 → 2, ≥10 → 3', () => {
    expect([5, 5.4, 5.5, 6, 9, 9.4, 9.5, 10].map((d) => score(d, LOW.moistureLimitsC))).toEqual([1, 1, 2, 2, 2, 2, 3, 3]);
  });
  it('mid variant, moisture term B (Tdd850): <6 → 1, 6–12 → 2, ≥13 → 3', () => {
    expect([5, 5.4, 5.5, 6, 12, 12.4, 12.5, 13].map((d) => score(d, MID.moistureLimitsC))).toEqual([1, 1, 2, 2, 2, 2, 3, 3]);
  });
  it('high variant, moisture term B (Tdd700): <15 → 1, 15–20 → 2, ≥21 → 3', () => {
    expect([14, 14.4, 14.5, 15, 20, 20.4, 20.5, 21].map((d) => score(d, HIGH.moistureLimitsC))).toEqual([1, 1, 2, 2, 2, 2, 3, 3]);
  });
  it('rounds arithmetic noise the way a person would (7.4999999999 is 7.5 → 8)', () => {
    expect(wholeDegreesC(7.4999999999)).toBe(8);
    expect(wholeDegreesC(-0.4)).toBe(0);
  });
});

/** A column given by temperatures at pressures (dew point depression per level), heights hypsometric. */
function column(points: Array<[number, number, number]>, elevationM: number): ReturnType<typeof prepared> {
  const [surface, ...rest] = points.map(([p, t, dd]): ColumnPoint => ({ pressureHpa: p, temperatureC: t, dewpointC: t - dd }));
  return prepared(profileInputFromColumn(surface, rest, elevationM));
}

describe('Haines Index of a profile', () => {
  it('variant by terrain elevation: low below 1000 ft, mid to 3000 ft, high above (common practice, from memory)', () => {
    expect(hainesVariantForElevation(304)).toBe('low');
    expect(hainesVariantForElevation(304.8)).toBe('mid');
    expect(hainesVariantForElevation(914.4)).toBe('mid');
    expect(hainesVariantForElevation(915)).toBe('high');
  });

  it('scores all three variants and labels the index a dryness-and-lapse-rate index', () => {
    // T950 − T850 = 8 → A 3; Tdd850 = 10 → B 3 (low 6). T850 − T700 = 11 → 3; mid B 2 (6 total 5).
    // T700 − T500 = 22 → 3; Tdd700 = 21 → 3 (high 6).
    const profile = column([[1000, 30, 12], [950, 24, 11], [850, 16, 10], [700, 5, 21], [500, -17, 25], [300, -45, 25]], 100);
    const haines = hainesIndex(profile);
    expect(haines.label).toBe(HAINES_LABEL);
    expect(haines.label).toMatch(/not a stability measure/);
    expect(haines.variant).toBe('low');
    expect(haines.variantNote).toBeNull();
    expect(haines.low).toMatchObject({ a: 3, b: 3, total: 6, lapseDifferenceC: 8, dewpointDepressionC: 10 });
    expect(haines.mid).toMatchObject({ a: 3, b: 2, total: 5, lapseDifferenceC: 11 });
    expect(haines.high).toMatchObject({ a: 3, b: 3, total: 6, lapseDifferenceC: 22, dewpointDepressionC: 21 });
  });

  it('uses the next higher variant, and says so, when the elevation\'s variant starts under the ground', () => {
    // Elevation 250 m calls for "low", but the surface pressure is 940 hPa: 950 hPa is underground.
    const profile = column([[940, 25, 10], [850, 17, 10], [700, 6, 15], [500, -16, 20], [300, -44, 20]], 250);
    const haines = hainesIndex(profile);
    expect(haines.low).toBeNull();
    expect(haines.variant).toBe('mid');
    expect(haines.variantNote).toMatch(/950 hPa is below the ground/);
  });

  it('says plainly when the lapse term scores 2 or 3 on a layer that is in fact stable', () => {
    // Cold 850–700 hPa layer: 11 °C over about 1.4 km is 7.6 °C/km, under the moist rate there (≈ 7.9 °C/km
    // at −13 °C and 775 hPa), so the layer is stable while A scores 3.
    const profile = column([[1000, -1, 3], [950, -3, 3], [850, -7.5, 3], [700, -18.5, 5], [500, -35, 10], [300, -55, 10]], 600);
    const haines = hainesIndex(profile);
    expect(haines.variant).toBe('mid');
    expect(haines.mid?.a).toBe(3);
    expect(haines.mid?.layerClass).toBe('stable');
    expect(haines.stableLayerNote).toMatch(/^Lapse term scores 3 but the 850–700 hPa layer is stable \(\d+\.\d °C\/km; dry adiabat 9\.8\)\.$/);
    // The same layer in warm air (moist rate ≈ 5 °C/km) is conditionally unstable: no note.
    const warm = hainesIndex(column([[1000, 30, 3], [950, 27, 3], [850, 22, 3], [700, 11, 5], [500, -8, 10], [300, -35, 10]], 600));
    expect(warm.mid?.layerClass).toBe('conditionally-unstable');
    expect(warm.stableLayerNote).toBeNull();
  });
});

describe('Continuous Haines (Mills and McCaw 2010; formula from memory, values worked by hand)', () => {
  it('CA = 0.5 (T850 − T700) − 2 and CB = Tdd850/3 − 1', () => {
    const c = continuousHainesFromValues(13.4, 0, 2.4);
    expect(c.ca).toBeCloseTo(4.7, 10);
    expect(c.cb).toBeCloseTo(11 / 3 - 1, 10);
    expect(c.total).toBeCloseTo(7.3667, 4);
  });
  it('halves CB above 5: Tdd850 = 28.5 gives 8.5 → 6.75; total 12.5 with T850 27.5, T700 12', () => {
    const c = continuousHainesFromValues(27.5, 12, -1);
    expect(c.cb).toBeCloseTo(6.75, 10);
    expect(c.total).toBeCloseTo(12.5, 10);
  });
  it('caps the depression at 30 °C before anything else: Tdd 40 scores as 30 (CB 9 → 7)', () => {
    expect(continuousHainesFromValues(30, 10, -10).cb).toBeCloseTo(7, 10);
    expect(continuousHainesFromValues(30, 10, -10).cb).toBe(continuousHainesFromValues(30, 10, 0).cb);
  });
});

describe('Hot-Dry-Windy Index (Srock et al. 2018: max VPD × max wind speed, lowest 500 m)', () => {
  it('takes each maximum on its own, including the interpolated 500 m point and nothing above it', () => {
    const input = profileInputFromColumn(
      { pressureHpa: 1000, temperatureC: 35, dewpointC: 5, windSpeedMs: 3 },
      [
        { pressureHpa: 975, temperatureC: 32, dewpointC: 4, windSpeedMs: 8 },
        { pressureHpa: 950, temperatureC: 30, dewpointC: 3, windSpeedMs: 12 },
        { pressureHpa: 900, temperatureC: 26, dewpointC: 0, windSpeedMs: 30 },
        { pressureHpa: 800, temperatureC: 18, dewpointC: -5, windSpeedMs: 30 },
      ],
      0,
    );
    const profile = prepared(input);
    const hdw = hotDryWindyIndex(profile);
    // VPD is largest at the surface: es(35) − es(5) (Bolton 1980 eq. 10).
    const vpdHpa = saturationVapourPressureHpa(35) - saturationVapourPressureHpa(5);
    expect(hdw.maxVapourPressureDeficitHpa).toBeCloseTo(vpdHpa, 10);
    // Wind is largest at the 500 m point, between 950 hPa (12 m/s) and 900 hPa (30 m/s), linear in height.
    const z950 = profile.heightAglM[2];
    const z900 = profile.heightAglM[3];
    expect(z950).toBeLessThan(500);
    expect(z900).toBeGreaterThan(500);
    const speed500 = 12 + ((500 - z950) / (z900 - z950)) * 18;
    expect(hdw.maxWindSpeedMs).toBeCloseTo(speed500, 6);
    expect(hdw.hdw).toBeCloseTo(vpdHpa * speed500, 6);
  });
});

describe('Pyrocumulonimbus Firepower Threshold (Tory and Kepert 2021)', () => {
  it('the closed form (their eqs. 25–28) by hand: zfc 2.5 km, pfc 750 hPa, psfc 1000, θfc 310 K, U 10 m/s, Δθ 2 K', () => {
    const zb = 2500 / (1 + 0.4 * 0.3197);
    const pcPa = 100 * (1000 + ((750 - 1000) * zb) / 2500);
    const expected = (Math.PI / 0.2854) * (pcPa / 310) * (0.4 * zb) ** 2 * 10 * 2;
    expect(firepowerThresholdW(2500, 750, 1000, 310, 10, 2)).toBeCloseTo(expected, 0);
    // Their simple approximation PFT ≈ 0.3 zfc² U Δθ (GW, zfc in km; from memory): within 20 %.
    const simpleGw = 0.3 * 2.5 ** 2 * 10 * 2;
    expect(Math.abs(expected / 1e9 / simpleGw - 1)).toBeLessThan(0.2);
  });

  it('reports its inputs; is proportional to the mixed-layer wind; a moister mixed layer needs less fire', () => {
    const base = prepared(convectiveColumnInput(32, 16));
    const pft = analyzeParcelsAndIndices(base, { virtualTemperature: true }).pft;
    expect(pft.gw).not.toBeNull();
    expect(pft.freeConvectionHeightAglM).toBeGreaterThan(0);
    expect(pft.freeConvectionPressureHpa).toBeLessThan(base.pressureHpa[0]);
    expect(pft.thetaExcessK).toBeGreaterThan(0);
    expect(pft.meanWindMs).toBeGreaterThan(1);
    expect(pft.mixedLayerMixingRatioGkg).toBeGreaterThan(0);

    const windier = convectiveColumnInput(32, 16);
    windier.surface.windSpeedMs *= 2;
    windier.levels = windier.levels.map((l) => ({ ...l, windSpeedMs: l.windSpeedMs * 2 }));
    const pftWindier = pyrocumulonimbusFirepowerThreshold(prepared(windier), environmentColumns(prepared(windier), true).mixingRatioKgKg);
    expect((pftWindier.gw as number) / (pft.gw as number)).toBeCloseTo(2, 6);

    const moister = analyzeParcelsAndIndices(prepared(convectiveColumnInput(32, 22)), { virtualTemperature: true }).pft;
    expect(moister.gw as number).toBeLessThan(pft.gw as number);
  });

  it('is null with null inputs when no plume within the profile frees itself (a deep warm layer aloft)', () => {
    const input = profileInputFromColumn(
      { pressureHpa: 1000, temperatureC: 20, dewpointC: 10 },
      [950, 900, 850, 800, 700, 600, 500].map((p) => ({ pressureHpa: p, temperatureC: 20 + (1000 - p) * 0.01, dewpointC: -20 })),
    );
    const pft = analyzeParcelsAndIndices(prepared(input), { virtualTemperature: true }).pft;
    expect(pft.gw).toBeNull();
    expect(pft.freeConvectionHeightAglM).toBeNull();
    expect(pft.thetaExcessK).toBeNull();
  });
});
