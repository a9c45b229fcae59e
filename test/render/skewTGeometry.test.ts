import { describe, expect, it } from 'vitest';
import {
  DEFAULT_SKEWT_FRAME,
  dryAdiabatTemperatureC,
  moistAdiabatPath,
  xOfTemperature,
  yOfPressure,
} from '../../src/render/skewTGeometry.ts';

const frame = DEFAULT_SKEWT_FRAME;

describe('skew-T geometry', () => {
  it('puts 1050 hPa at the bottom and 200 hPa at the top, linear in ln p', () => {
    expect(yOfPressure(frame, 1050)).toBeCloseTo(frame.topPx + frame.heightPx, 6);
    expect(yOfPressure(frame, 200)).toBeCloseTo(frame.topPx, 6);
    // Equal pressure ratios are equal distances on a log-p axis (common practice).
    const a = yOfPressure(frame, 1000) - yOfPressure(frame, 500);
    const b = yOfPressure(frame, 500) - yOfPressure(frame, 250);
    expect(a).toBeCloseTo(b, 6);
  });

  it('skews isotherms 45°: one pixel right for each pixel up', () => {
    const dx = xOfTemperature(frame, 0, 500) - xOfTemperature(frame, 0, 1000);
    const dy = yOfPressure(frame, 1000) - yOfPressure(frame, 500);
    expect(dx).toBeCloseTo(dy, 6);
  });

  it('follows Poisson\u2019s equation on a dry adiabat (T = θ (p/1000)^(Rd/cp), Rd/cp = 0.2857)', () => {
    expect(dryAdiabatTemperatureC(300, 1000)).toBeCloseTo(26.85, 2);
    // 300 K × 0.5^0.2857 = 246.1 K
    expect(dryAdiabatTemperatureC(300, 500) + 273.15).toBeCloseTo(246.1, 1);
  });

  it('cools a saturated parcel more slowly than a dry one, and about like a dry one where it is cold', () => {
    const moist = moistAdiabatPath(20, 1000, 500);
    const end = moist[moist.length - 1];
    expect(end.pressureHpa).toBeCloseTo(500, 6);
    const dryEnd = dryAdiabatTemperatureC(293.15, 500);
    expect(end.temperatureC).toBeGreaterThan(dryEnd + 15);
    // From memory, the 20 °C pseudo-adiabat is near −7 °C at 500 hPa; a visual guide, so a wide band.
    expect(end.temperatureC).toBeGreaterThan(-12);
    expect(end.temperatureC).toBeLessThan(-3);
    const cold = moistAdiabatPath(-30, 500, 300);
    const coldDry = dryAdiabatTemperatureC((-30 + 273.15) * (1000 / 500) ** 0.2857, 300);
    expect(Math.abs(cold[cold.length - 1].temperatureC - coldDry)).toBeLessThan(3);
  });
});
