/**
 * Parcels (src/core/parcels): CAPE, CIN, LCL, LFC, EL of surface-based and mixed-layer parcels,
 * downdraft CAPE and precipitable water, on invented profiles (test/core/parcelsProfiles.ts).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { DRY_AIR_GAS_CONSTANT_JKGK, GRAVITY_MS2 } from '../../src/core/constants.ts';
import { environmentColumns } from '../../src/core/parcels/environmentColumns.ts';
import { liftParcel } from '../../src/core/parcels/liftParcel.ts';
import { mixedLayerMeans } from '../../src/core/parcels/mixedLayerParcel.ts';
import { precipitableWaterMm } from '../../src/core/parcels/precipitableWater.ts';
import { analyzeParcelsAndIndices } from '../../src/core/parcelsAndIndices.ts';
import { temperatureOnPseudoAdiabatC } from '../../src/core/thermo/pseudoAdiabat.ts';
import { convectiveColumnInput, prepared, profileInputFromColumn, type ColumnPoint } from './parcelsProfiles.ts';

/** A column whose environment is a saturated parcel's own pseudo-adiabat shifted by offsetC(p). */
function shiftedMoistColumn(offsetC: (p: number) => number): ColumnPoint[] {
  const levels: ColumnPoint[] = [];
  for (let p = 950; p >= 200; p -= 50) {
    const parcelC = temperatureOnPseudoAdiabatC(20, 1000, p);
    const t = parcelC + offsetC(p);
    levels.push({ pressureHpa: p, temperatureC: t, dewpointC: t - 20 });
  }
  return levels;
}

describe('CAPE, EL and the buoyancy integral (Doswell and Rasmussen 1994 eq. 1, ln p form)', () => {
  it('a saturated parcel 2 K warmer than its environment above the surface: CAPE = Rd ΔT ln(p1/ptop) + the first triangle', () => {
    const levels = shiftedMoistColumn(() => -2);
    const profile = prepared(profileInputFromColumn({ pressureHpa: 1000, temperatureC: 20, dewpointC: 20 }, levels));
    const parcel = liftParcel(profile, environmentColumns(profile, false), 20, 20);
    const expected = DRY_AIR_GAS_CONSTANT_JKGK * (2 / 2) * Math.log(1000 / 950) + DRY_AIR_GAS_CONSTANT_JKGK * 2 * Math.log(950 / 200);
    expect(parcel.capeJkg).toBeCloseTo(expected, 0);
    expect(Math.abs(parcel.capeJkg / expected - 1)).toBeLessThan(1e-3);
    expect(parcel.lclPressureHpa).toBeCloseTo(1000, 6);
    expect(parcel.lfcPressureHpa).toBeCloseTo(1000, 6);
    expect(parcel.elPressureHpa).toBeNull(); // still buoyant at the top: the EL is above the profile
    expect(parcel.cinJkg).toBe(0);
  });

  it('the EL is where the difference crosses zero, linear in ln p, and CAPE stops there', () => {
    // +2 K up to 400 hPa, then the environment warms to +2 K over the parcel by 300 hPa.
    const offset = (p: number) => (p >= 400 ? -2 : p >= 300 ? -2 + (4 * (400 - p)) / 100 : 2);
    const profile = prepared(profileInputFromColumn({ pressureHpa: 1000, temperatureC: 20, dewpointC: 20 }, shiftedMoistColumn(offset)));
    const parcel = liftParcel(profile, environmentColumns(profile, false), 20, 20);
    // Between 400 (+2) and 350 (0 exactly) the crossing is at 350 hPa.
    expect(parcel.elPressureHpa).toBeCloseTo(350, 3);
    const expected =
      DRY_AIR_GAS_CONSTANT_JKGK * (Math.log(1000 / 950) + 2 * Math.log(950 / 400) + (2 / 2) * Math.log(400 / 350));
    expect(Math.abs(parcel.capeJkg / expected - 1)).toBeLessThan(1e-3);
  });

  it('a parcel colder than its environment everywhere: no LFC, no EL, CAPE 0 and CIN 0 (common practice)', () => {
    const profile = prepared(profileInputFromColumn({ pressureHpa: 1000, temperatureC: 20, dewpointC: 20 }, shiftedMoistColumn(() => 3)));
    const parcel = liftParcel(profile, environmentColumns(profile, true), 20, 20);
    expect(parcel.lfcPressureHpa).toBeNull();
    expect(parcel.elPressureHpa).toBeNull();
    expect(parcel.capeJkg).toBe(0);
    expect(parcel.cinJkg).toBe(0);
  });

  it('CIN is the negative area below the LFC: a 1 K cap between 950 and 800 hPa', () => {
    const offset = (p: number) => (p >= 800 && p <= 950 ? 1 : -1);
    const profile = prepared(profileInputFromColumn({ pressureHpa: 1000, temperatureC: 20, dewpointC: 20 }, shiftedMoistColumn(offset)));
    const parcel = liftParcel(profile, environmentColumns(profile, false), 20, 20);
    // Difference: 0 at 1000, −1 at 950 … 800, +1 at 750: crossing midway in ln p between 800 and 750.
    const crossing = Math.exp((Math.log(800) + Math.log(750)) / 2);
    expect(parcel.lfcPressureHpa).toBeCloseTo(crossing, 3);
    const expectedCin = -DRY_AIR_GAS_CONSTANT_JKGK * (0.5 * Math.log(1000 / 950) + Math.log(950 / 800) + 0.5 * Math.log(800 / crossing));
    expect(Math.abs(parcel.cinJkg / expectedCin - 1)).toBeLessThan(1e-3);
  });

  it('the virtual temperature correction raises CAPE and weakens CIN for a moist parcel (Doswell and Rasmussen 1994)', () => {
    const profile = prepared(convectiveColumnInput(32, 20));
    const withTv = analyzeParcelsAndIndices(profile, { virtualTemperature: true }).parcels.surface;
    const without = analyzeParcelsAndIndices(profile, { virtualTemperature: false }).parcels.surface;
    expect(withTv.capeJkg).toBeGreaterThan(without.capeJkg);
    expect(withTv.cinJkg).toBeGreaterThanOrEqual(without.cinJkg);
    expect(withTv.lclPressureHpa).toBe(without.lclPressureHpa);
  });

  it('the LCL height is interpolated in ln p between the bracketing levels', () => {
    const profile = prepared(convectiveColumnInput());
    const parcel = analyzeParcelsAndIndices(profile, { virtualTemperature: true }).parcels.surface;
    let i = 1;
    while (profile.pressureHpa[i] > parcel.lclPressureHpa) i++;
    const f = Math.log(profile.pressureHpa[i - 1] / parcel.lclPressureHpa) / Math.log(profile.pressureHpa[i - 1] / profile.pressureHpa[i]);
    expect(parcel.lclHeightAglM).toBeCloseTo(profile.heightAglM[i - 1] + f * (profile.heightAglM[i] - profile.heightAglM[i - 1]), 6);
  });
});

describe('mixed-layer parcel (lowest 100 hPa, common practice)', () => {
  it('averages θ and w by mass; a well-mixed layer gives back its own θ and w', () => {
    const thetaK = 305;
    const w = 0.008;
    const levels: ColumnPoint[] = [];
    for (let p = 975; p >= 500; p -= 25) {
      const t = thetaK * Math.pow(p / 1000, 0.2854) - 273.15 + (p < 900 ? (900 - p) * 0.01 : 0);
      const e = (w * p) / (0.622 + w);
      const td = Math.min(t, (243.5 * Math.log(e / 6.112)) / (17.67 - Math.log(e / 6.112)));
      levels.push({ pressureHpa: p, temperatureC: t, dewpointC: p >= 900 ? td : t - 20 });
    }
    const e0 = (w * 1000) / (0.622 + w);
    const profile = prepared(profileInputFromColumn({ pressureHpa: 1000, temperatureC: thetaK - 273.15, dewpointC: (243.5 * Math.log(e0 / 6.112)) / (17.67 - Math.log(e0 / 6.112)) }, levels));
    const means = mixedLayerMeans(profile, environmentColumns(profile, true).mixingRatioKgKg);
    expect(means.thetaK).toBeCloseTo(thetaK, 3);
    expect(means.mixingRatioKgKg).toBeCloseTo(w, 6);
    expect(means.topPressureHpa).toBe(900);
    expect(means.startTemperatureC).toBeCloseTo(thetaK - 273.15, 3);
  });
});

describe('downdraft CAPE (Gilmore and Wicker 1998)', () => {
  it('is positive under dry mid levels and grows as they dry further', () => {
    const moist = analyzeParcelsAndIndices(prepared(convectiveColumnInput(32, 18)), { virtualTemperature: true });
    const input = convectiveColumnInput(32, 18);
    input.levels = input.levels.map((l) => (l.pressureHpa < 850 && l.pressureHpa >= 600 ? { ...l, dewpointC: l.temperatureC - 30 } : l));
    const dry = analyzeParcelsAndIndices(prepared(input), { virtualTemperature: true });
    expect(moist.dcapeJkg).toBeGreaterThan(0);
    expect(dry.dcapeJkg).toBeGreaterThan(moist.dcapeJkg);
  });
});

describe('precipitable water (AMS Glossary: (1/ρw g) ∫ q dp)', () => {
  it('a column of constant q from 1000 to 500 hPa holds q Δp / g', () => {
    const w = 0.01;
    const pressures = new Float64Array([1000, 900, 800, 700, 600, 500]);
    const mixing = new Float64Array(pressures.length).fill(w);
    const q = w / (1 + w);
    expect(precipitableWaterMm(pressures, mixing)).toBeCloseTo((q * 50000) / GRAVITY_MS2, 6);
  });
});

/** Random valid profiles: a surface, then levels with bounded lapse rates and dew point depressions. */
const randomProfile = fc
  .record({
    surfaceT: fc.double({ min: -10, max: 42, noNaN: true }),
    surfaceDepression: fc.double({ min: 0, max: 35, noNaN: true }),
    surfaceP: fc.double({ min: 700, max: 1040, noNaN: true }),
    lapses: fc.array(fc.double({ min: -3, max: 11, noNaN: true }), { minLength: 12, maxLength: 12 }),
    depressions: fc.array(fc.double({ min: 0, max: 40, noNaN: true }), { minLength: 12, maxLength: 12 }),
    speeds: fc.array(fc.double({ min: 0, max: 40, noNaN: true }), { minLength: 12, maxLength: 12 }),
  })
  .map((r) => {
    const levels: ColumnPoint[] = [];
    let t = r.surfaceT;
    let p = r.surfaceP;
    for (let i = 0; i < 12; i++) {
      const nextP = p * 0.88;
      // Lapse per layer of ~1 km (0.88 in p is ~1 km): temperature drops by the drawn lapse rate.
      t -= r.lapses[i];
      levels.push({ pressureHpa: nextP, temperatureC: t, dewpointC: t - r.depressions[i], windSpeedMs: r.speeds[i], windDirDeg: 30 * i });
      p = nextP;
    }
    return profileInputFromColumn({ pressureHpa: r.surfaceP, temperatureC: r.surfaceT, dewpointC: r.surfaceT - r.surfaceDepression }, levels, 300);
  });

function assertNoNaN(value: unknown, path = 'result'): void {
  if (typeof value === 'number') {
    expect(Number.isFinite(value), `${path} is ${value}`).toBe(true);
  } else if (value && typeof value === 'object') {
    for (const [key, inner] of Object.entries(value)) assertNoNaN(inner, `${path}.${key}`);
  }
}

describe('property test (fast-check) over random valid profiles', () => {
  it('CAPE ≥ 0, CIN ≤ 0, the LCL at or above the surface, LFC above the LCL, EL above the LFC, never NaN', () => {
    fc.assert(
      fc.property(randomProfile, fc.boolean(), (input, virtualTemperature) => {
        const profile = prepared(input);
        const result = analyzeParcelsAndIndices(profile, { virtualTemperature });
        assertNoNaN(result);
        for (const parcel of [result.parcels.surface, result.parcels.mixedLayer]) {
          expect(parcel.capeJkg).toBeGreaterThanOrEqual(0);
          expect(parcel.cinJkg).toBeLessThanOrEqual(0);
          expect(parcel.lclPressureHpa).toBeLessThanOrEqual(profile.pressureHpa[0]);
          expect(parcel.lclHeightAglM).toBeGreaterThanOrEqual(0);
          if (parcel.lfcPressureHpa !== null) expect(parcel.lfcPressureHpa).toBeLessThanOrEqual(parcel.lclPressureHpa + 1e-9);
          if (parcel.lfcPressureHpa !== null && parcel.elPressureHpa !== null) expect(parcel.elPressureHpa).toBeLessThan(parcel.lfcPressureHpa);
          if (parcel.lfcPressureHpa === null) expect(parcel.capeJkg).toBe(0);
        }
        expect(result.dcapeJkg).toBeGreaterThanOrEqual(0);
        expect(result.precipitableWaterMm).toBeGreaterThan(0);
        expect(result.hdw).toBeGreaterThanOrEqual(0);
        if (result.pft.gw !== null) expect(result.pft.gw).toBeGreaterThanOrEqual(0);
      }),
      { numRuns: 300 },
    );
  });
});
