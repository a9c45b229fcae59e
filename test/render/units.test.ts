import { describe, expect, it } from 'vitest';
import {
  compassPoint,
  formatHdw,
  formatHeight,
  formatHeightAgl,
  formatLapseRate,
  formatPft,
  formatRelativeHumidity,
  formatTemperature,
  formatVentilation,
  formatWind,
  formatWindSpeed,
  unitSystemSchema,
} from '../../src/render/units.ts';

// Conversion factors are exact definitions: international foot 0.3048 m and international mile
// 1609.344 m (international yard and pound agreement, 1959); knot 1852 m per hour (international
// nautical mile); °F = °C × 9/5 + 32.
describe('unit formatting', () => {
  it('prints heights with their unit, rounded to 10 m or 10 ft', () => {
    expect(formatHeight(2450, 'metric')).toBe('2,450 m');
    expect(formatHeight(2450, 'us')).toBe('8,040 ft'); // 2450 / 0.3048 = 8038.1 ft
    expect(formatHeight(1000 * 0.3048, 'us')).toBe('1,000 ft');
    expect(formatHeightAgl(0, 'metric')).toBe('0 m AGL');
    expect(formatHeight(-3, 'metric')).toBe('0 m'); // never "-0 m"
  });

  it('prints wind in km/h (metric) or mph (US)', () => {
    expect(formatWindSpeed(10, 'metric')).toBe('36 km/h');
    expect(formatWindSpeed(0.44704 * 25, 'us')).toBe('25 mph'); // 1 mph = 0.44704 m/s exactly
    expect(formatWind({ speedMs: 10, dirDeg: 225 }, 'metric')).toBe('SW 36 km/h');
  });

  it('names the 16 compass points, wrapping at north', () => {
    expect(compassPoint(0)).toBe('N');
    expect(compassPoint(359)).toBe('N');
    expect(compassPoint(-90)).toBe('W');
    expect(compassPoint(247.5)).toBe('WSW');
    expect(compassPoint(Number.NaN)).toBe('?');
  });

  it('prints temperature in °C or °F', () => {
    expect(formatTemperature(33, 'metric')).toBe('33 °C');
    expect(formatTemperature(33, 'us')).toBe('91 °F'); // 33 × 9/5 + 32 = 91.4
    expect(formatTemperature(-40, 'us')).toBe('-40 °F');
  });

  it('prints ventilation in m²/s or kt-ft to three significant figures', () => {
    expect(formatVentilation(106_400, 'metric')).toBe('106,000 m²/s');
    // 10,000 m²/s = 10,000 × (3600/1852 kt per m/s) × (1/0.3048 ft per m) = 63,774 kt-ft
    expect(formatVentilation(10_000, 'us')).toBe('63,800 kt-ft');
  });

  it('prints the rest with their units, and n/a for missing numbers', () => {
    expect(formatLapseRate(9.44)).toBe('9.4 °C/km');
    expect(formatRelativeHumidity(8.6)).toBe('9%');
    expect(formatHdw(312.4)).toBe('312');
    expect(formatPft(1.84)).toBe('1.8 GW');
    expect(formatPft(null)).toMatch(/none/);
    expect(formatHeight(Number.NaN, 'metric')).toBe('n/a');
  });

  it('accepts only the two unit systems at the boundary', () => {
    expect(unitSystemSchema.safeParse('us').success).toBe(true);
    expect(unitSystemSchema.safeParse('imperial').success).toBe(false);
  });
});
