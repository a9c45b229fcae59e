/**
 * Checks of the thermodynamics (src/core/thermo) against published formulas and values, plus
 * property tests of the LCL and the pseudo-adiabat.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  DRY_ADIABATIC_LAPSE_RATE_C_PER_KM,
  DRY_AIR_GAS_CONSTANT_JKGK,
  DRY_AIR_SPECIFIC_HEAT_JKGK,
  GRAVITY_MS2,
  KAPPA,
} from '../../src/core/constants.ts';
import {
  boltonLclTemperatureK,
  equivalentPotentialTemperatureK,
  liftingCondensationLevel,
  mixingRatioKgKg,
  saturatedEquivalentPotentialTemperatureK,
  saturationVapourPressureHpa,
  temperatureOnDryAdiabatC,
  temperatureOnPseudoAdiabatC,
  wetBulbTemperatureC,
} from '../../src/core/thermo/index.ts';

/**
 * Saturation vapour pressure over water, hPa, by Hyland and Wexler (1983, ASHRAE Trans. 89),
 * the successor of the Wexler (1976) formulation Bolton (1980) fitted his eq. 10 to. Coefficients
 * from memory; they give 6.112 hPa at 0 °C, which the first check confirms.
 */
function hylandWexlerHpa(temperatureC: number): number {
  const t = temperatureC + 273.15;
  const lnPa = -5800.2206 / t + 1.3914993 - 0.048640239 * t + 4.1764768e-5 * t * t - 1.4452093e-8 * t * t * t + 6.5459673 * Math.log(t);
  return Math.exp(lnPa) / 100;
}

describe('saturation vapour pressure (Bolton 1980 eq. 10)', () => {
  it('is 6.112 hPa at 0 °C, Bolton\'s constant, and Hyland–Wexler agrees', () => {
    expect(saturationVapourPressureHpa(0)).toBeCloseTo(6.112, 6);
    expect(hylandWexlerHpa(0)).toBeCloseTo(6.112, 2);
  });

  it('is within 0.1 % of Hyland and Wexler (1983) from −30 to +35 °C, the accuracy Bolton states', () => {
    let worst = 0;
    for (let t = -30; t <= 35; t += 0.5) {
      worst = Math.max(worst, Math.abs(saturationVapourPressureHpa(t) / hylandWexlerHpa(t) - 1));
    }
    expect(worst).toBeLessThan(0.001);
  });

  it('matches the Smithsonian Meteorological Tables values quoted to 3 figures (List 1951, from memory)', () => {
    // es over water: 10 °C 12.27 hPa, 20 °C 23.37 hPa, 30 °C 42.43 hPa (from memory; ±0.1 %).
    expect(saturationVapourPressureHpa(10)).toBeCloseTo(12.27, 1);
    expect(saturationVapourPressureHpa(20)).toBeCloseTo(23.37, 1);
    expect(saturationVapourPressureHpa(30)).toBeCloseTo(42.43, 1);
  });
});

describe('dry adiabatic lapse rate', () => {
  it('g/cp is 9.75 °C/km; the project rounds it to 9.8 (common practice), 0.5 % apart', () => {
    const gOverCpCPerKm = (1000 * GRAVITY_MS2) / DRY_AIR_SPECIFIC_HEAT_JKGK;
    expect(gOverCpCPerKm).toBeCloseTo(9.751, 3);
    expect(DRY_ADIABATIC_LAPSE_RATE_C_PER_KM).toBe(9.8);
    expect(Math.abs(DRY_ADIABATIC_LAPSE_RATE_C_PER_KM - gOverCpCPerKm) / gOverCpCPerKm).toBeLessThan(0.006);
    // κ = Rd/cp (Bolton 1980: 0.2854).
    expect(DRY_AIR_GAS_CONSTANT_JKGK / DRY_AIR_SPECIFIC_HEAT_JKGK).toBeCloseTo(KAPPA, 4);
  });

  it('our dry adiabat, with hypsometric heights, cools at g/cp per km', () => {
    const thetaK = 300;
    let heightM = 0;
    let previousP = 1000;
    for (let p = 990; p >= 500; p -= 10) {
      const meanTK = (temperatureOnDryAdiabatC(thetaK, previousP) + temperatureOnDryAdiabatC(thetaK, p)) / 2 + 273.15;
      heightM += ((DRY_AIR_GAS_CONSTANT_JKGK * meanTK) / GRAVITY_MS2) * Math.log(previousP / p);
      previousP = p;
    }
    const lapseCPerKm = (1000 * (temperatureOnDryAdiabatC(thetaK, 1000) - temperatureOnDryAdiabatC(thetaK, 500))) / heightM;
    expect(lapseCPerKm).toBeCloseTo((1000 * GRAVITY_MS2) / DRY_AIR_SPECIFIC_HEAT_JKGK, 2);
  });
});

describe('LCL against Bolton (1980)', () => {
  it('the iterated LCL temperature is within 0.1 K of Bolton eq. 15 (from T, Td) and eq. 21 (from T, e)', () => {
    for (const p of [1000, 850, 700]) {
      for (let t = -10; t <= 40; t += 5) {
        for (let depression = 1; depression <= 30; depression += 3) {
          const td = t - depression;
          const lcl = liftingCondensationLevel(p, t, td);
          const tk = t + 273.15;
          expect(Math.abs(lcl.temperatureC + 273.15 - boltonLclTemperatureK(t, td))).toBeLessThan(0.1);
          const eq21K = 2840 / (3.5 * Math.log(tk) - Math.log(saturationVapourPressureHpa(td)) - 4.805) + 55;
          expect(Math.abs(lcl.temperatureC + 273.15 - eq21K)).toBeLessThan(0.1);
        }
      }
    }
  });
});

describe('wet-bulb temperature', () => {
  /** Isobaric wet bulb: cp (T − Tw) = L (ws(Tw) − w), solved by bisection (AMS Glossary, "wet-bulb temperature"). */
  function isobaricWetBulbC(p: number, t: number, td: number): number {
    const w = mixingRatioKgKg(td, p);
    let low = td;
    let high = t;
    for (let i = 0; i < 60; i++) {
      const mid = (low + high) / 2;
      const latent = 2.501e6 - 2370 * mid;
      if (1005.7 * (t - mid) - latent * (mixingRatioKgKg(mid, p) - w) > 0) low = mid;
      else high = mid;
    }
    return (low + high) / 2;
  }

  it('is within 0.25 K of the isobaric wet bulb (the adiabatic one is a little colder in warm moist air; measured worst 0.17 K at 35 °C/25 °C)', () => {
    for (const [p, t, td] of [[1000, 30, 10], [1000, 20, 15], [850, 15, -5], [700, 0, -20], [1000, 35, 25]]) {
      expect(Math.abs(wetBulbTemperatureC(p, t, td) - isobaricWetBulbC(p, t, td))).toBeLessThan(0.25);
    }
  });

  it('gives 13.7 °C at 20 °C and 50 % relative humidity at 1013.25 hPa (Stull 2011, J. Appl. Meteor. Climatol. 50, worked example)', () => {
    const td = 9.26; // dew point of 20 °C at 50 % RH (Bolton eq. 10 inverted)
    expect(wetBulbTemperatureC(1013.25, 20, td)).toBeCloseTo(13.7, 0);
    expect(Math.abs(wetBulbTemperatureC(1013.25, 20, td) - 13.7)).toBeLessThan(0.3);
  });
});

describe('property tests (fast-check): LCL and pseudo-adiabat', () => {
  it('the LCL lies at or above the start, colder than the dew point, higher for drier air', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 500, max: 1050, noNaN: true }),
        fc.double({ min: -30, max: 45, noNaN: true }),
        fc.double({ min: 0.1, max: 40, noNaN: true }),
        (p, t, depression) => {
          const lcl = liftingCondensationLevel(p, t, t - depression);
          const wetter = liftingCondensationLevel(p, t, t - depression / 2);
          expect(Number.isFinite(lcl.pressureHpa)).toBe(true);
          expect(lcl.pressureHpa).toBeLessThanOrEqual(p);
          expect(lcl.temperatureC).toBeLessThanOrEqual(t - depression + 1e-9);
          expect(wetter.pressureHpa).toBeGreaterThan(lcl.pressureHpa);
        },
      ),
      { numRuns: 300 },
    );
  });

  it('the pseudo-adiabat cools monotonically upward and conserves Bolton θe within 0.4 K (eq. 43 is good to 0.3 K; measured worst drift 0.35 K, start 30 °C, at 490 hPa)', () => {
    fc.assert(
      fc.property(fc.double({ min: -20, max: 30, noNaN: true }), fc.double({ min: 200, max: 950, noNaN: true }), (t0, pEnd) => {
        const t1 = temperatureOnPseudoAdiabatC(t0, 1000, pEnd);
        const t2 = temperatureOnPseudoAdiabatC(t0, 1000, pEnd - 20);
        expect(t1).toBeLessThan(t0);
        expect(t2).toBeLessThan(t1);
        const thetaE0 = saturatedEquivalentPotentialTemperatureK(t0, 1000);
        expect(Math.abs(saturatedEquivalentPotentialTemperatureK(t1, pEnd) - thetaE0)).toBeLessThan(0.4);
        // Down again: the integration is reversible to a thousandth of a kelvin.
        expect(Math.abs(temperatureOnPseudoAdiabatC(t1, pEnd, 1000) - t0)).toBeLessThan(1e-3);
      }),
      { numRuns: 200 },
    );
  });

  it('θe of unsaturated air equals θ when it holds no vapour, and grows with moisture (Bolton eq. 43)', () => {
    expect(equivalentPotentialTemperatureK(20, -90, 1000)).toBeCloseTo(293.15, 1);
    expect(equivalentPotentialTemperatureK(20, 15, 1000)).toBeGreaterThan(equivalentPotentialTemperatureK(20, 5, 1000));
  });
});
