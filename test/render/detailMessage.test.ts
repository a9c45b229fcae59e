import { describe, expect, it } from 'vitest';
import { buildDetailMessage } from '../../src/render/detailMessage.ts';
import { encodeForSlack } from '../../src/render/encodeSlack.ts';
import { mergeLayersByClass } from '../../src/render/layerTable.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { makeAnalysis, makeSeries, TIME_ZONE } from './fixtures.ts';
import { slackProblems } from './platformLimits.ts';

const series = makeSeries();
const hour = { ...series.hours[15], analysis: makeAnalysis() };
const context = { timeZone: TIME_ZONE, invented: true, model: series.model, runTime: series.runTime, sourceName: series.sourceName };

describe('buildDetailMessage (invented 37-level fixture)', () => {
  it('lists the layers (base, top, lapse rate, class) with units, merged by class', () => {
    const message = buildDetailMessage(hour, 'metric', { ...context, images: false });
    expect(message.table?.columns).toEqual(['Base AGL', 'Top AGL', 'Lapse rate', 'Class']);
    const rows = message.table!.rows;
    expect(rows[0][0]).toBe('0 m');
    expect(rows.every((row) => /m$/.test(row[0]) && /m$/.test(row[1]) && /°C\/km$/.test(row[2]))).toBe(true);
    // The invented column: a mixed layer at 9.6 °C/km, a 4 °C/km cap, the dry layer at 9.4 °C/km.
    expect(rows[0][3]).toBe('near dry adiabatic');
    expect(rows.some((row) => row[3] === 'stable' || row[3] === 'conditionally unstable')).toBe(true);
    expect(rows.length).toBeLessThan(hour.analysis.layers.length);
  });

  it('states mixing height, the dry layer, the LCL and the Haines Index with its label', () => {
    const message = buildDetailMessage(hour, 'metric', { ...context, images: false });
    const lines = message.sections[0].lines;
    expect(lines[0]).toBe('Mixing height 2,640 m AGL (surface parcel at 33 °C); it reaches the dry layer, so mixing runs to 4,400 m AGL.');
    expect(lines[1]).toMatch(/^Dry near-dry-adiabatic layer 2,600 m AGL to 4,400 m AGL: 9\.4 °C\/km, RH at most 18%/);
    expect(lines.some((line) => /^LCL [\d,]+ m AGL/.test(line))).toBe(true);
    expect(lines[lines.length - 1]).toBe('Haines Index 5 (high variant; a dryness-and-lapse-rate index, not a stability measure)');
    expect(message.title).toBe('Cinder Flats (invented): layers at Fri 14 Aug 15:00 MDT');
    expect(message.footer).toBe(SAFETY_FOOTER);
  });

  it('carries the skew-T diagram as a PNG and encodes within Slack limits', () => {
    const message = buildDetailMessage(hour, 'us', context);
    expect(message.images[0].fileName).toBe('skew-t.png');
    expect(Array.from(message.images[0].png.slice(0, 4))).toEqual([137, 80, 78, 71]);
    expect(slackProblems(encodeForSlack(message))).toEqual([]);
  });

  it('answers an hour without its full profile with a notice', () => {
    const { analysis: _dropped, ...bare } = hour;
    const message = buildDetailMessage(bare, 'metric', context);
    expect(message.kind).toBe('notice');
    expect(message.sections[0].lines[0]).toMatch(/Run the lookup again/);
  });

  it('merges adjacent layers of one class with a depth-weighted lapse rate', () => {
    const layer = (baseAglM: number, topAglM: number, lapseRateCPerKm: number, cls: 'stable' | 'inversion') => ({
      basePressureHpa: 900 - baseAglM / 10,
      topPressureHpa: 900 - topAglM / 10,
      baseAglM,
      topAglM,
      lapseRateCPerKm,
      moistLapseRateCPerKm: 6,
      ratioToDryAdiabat: lapseRateCPerKm / 9.8,
      class: cls,
    });
    const merged = mergeLayersByClass([layer(0, 100, -2, 'inversion'), layer(100, 400, 3, 'stable'), layer(400, 500, 5, 'stable')]);
    expect(merged).toHaveLength(2);
    expect(merged[1]).toEqual({ baseAglM: 100, topAglM: 500, lapseRateCPerKm: (3 * 300 + 5 * 100) / 400, class: 'stable' });
  });
});
