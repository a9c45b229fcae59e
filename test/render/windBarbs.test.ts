import { describe, expect, it } from 'vitest';
import { drawSkewTSvg } from '../../src/render/skewTDiagram.ts';
import { DEFAULT_SKEWT_FRAME } from '../../src/render/skewTGeometry.ts';
import { barbParts, KNOTS_PER_METRE_PER_SECOND, windBarbSvg } from '../../src/render/windBarbs.ts';
import { makeAnalysis, TIME_ZONE } from './fixtures.ts';

/** Every line's far end in a barb's SVG (the first line is the staff). */
function lineEnds(svg: string): Array<{ x1: number; y1: number; x2: number; y2: number }> {
  return [...svg.matchAll(/<line x1="([^"]+)" y1="([^"]+)" x2="([^"]+)" y2="([^"]+)"\/>/g)].map((m) => ({ x1: Number(m[1]), y1: Number(m[2]), x2: Number(m[3]), y2: Number(m[4]) }));
}

describe('wind barbs', () => {
  it('uses the international knot: 1 m/s is 1.943844 kt (1 kt = 1852 m per hour, by definition)', () => {
    expect(KNOTS_PER_METRE_PER_SECOND).toBeCloseTo(1.943844, 6);
  });

  // The weather-chart convention (common practice; the cases are ours, the rule from memory):
  // rounded to 5 kt; flag 50, full feather 10, half feather 5; calm under 2.5 kt.
  it.each([
    [0, { calm: true, flags: 0, fullFeathers: 0, halfFeathers: 0, shownKt: 0 }],
    [2.4, { calm: true, flags: 0, fullFeathers: 0, halfFeathers: 0, shownKt: 0 }],
    [3, { calm: false, flags: 0, fullFeathers: 0, halfFeathers: 1, shownKt: 5 }],
    [7.4, { calm: false, flags: 0, fullFeathers: 0, halfFeathers: 1, shownKt: 5 }],
    [7.6, { calm: false, flags: 0, fullFeathers: 1, halfFeathers: 0, shownKt: 10 }],
    [47, { calm: false, flags: 0, fullFeathers: 4, halfFeathers: 1, shownKt: 45 }],
    [50, { calm: false, flags: 1, fullFeathers: 0, halfFeathers: 0, shownKt: 50 }],
    [65, { calm: false, flags: 1, fullFeathers: 1, halfFeathers: 1, shownKt: 65 }],
    [113, { calm: false, flags: 2, fullFeathers: 1, halfFeathers: 1, shownKt: 115 }],
  ])('%s kt is drawn as %o', (speedKt, parts) => {
    expect(barbParts(speedKt)).toEqual(parts);
  });

  it('points the staff toward where the wind blows from, feathers on its clockwise side', () => {
    // From the west: staff to the left (west) of the point; feathers above it (north).
    const west = lineEnds(windBarbSvg(100, 100, 270, 20, '#000'));
    expect(west[0]).toMatchObject({ x1: 100, y1: 100, y2: 100 });
    expect(west[0]!.x2).toBeLessThan(100);
    expect(west).toHaveLength(3); // staff and two full feathers
    for (const feather of west.slice(1)) expect(feather.y2).toBeLessThan(feather.y1);
    // From the north: staff upward; feathers to the right (east).
    const north = lineEnds(windBarbSvg(100, 100, 0, 10, '#000'));
    expect(north[0]!.x2).toBeCloseTo(100, 5);
    expect(north[0]!.y2).toBeLessThan(100);
    expect(north[1]!.x2).toBeGreaterThan(north[1]!.x1);
  });

  it('draws a calm as a circle, and a flag as a filled triangle', () => {
    expect(windBarbSvg(10, 10, 90, 1, '#000')).toMatch(/^<circle class="wind-calm"/);
    const fifty = windBarbSvg(10, 10, 90, 50, '#000');
    expect(fifty.match(/<polygon /g)).toHaveLength(1);
    expect(fifty).toContain('data-kt="50"');
  });

  it('puts a column of barbs on the skew-T, spaced apart and inside the frame', () => {
    const svg = drawSkewTSvg(makeAnalysis(), { units: 'metric', timeZone: TIME_ZONE, invented: true });
    const column = svg.match(/<g id="wind-column">.*?<\/g><\/g>|<g id="wind-column">[^\n]*/)?.[0] ?? '';
    const barbs = [...column.matchAll(/<g class="wind-barb"[^>]*><line x1="([^"]+)" y1="([^"]+)"/g)].map((m) => Number(m[2]));
    expect(barbs.length).toBeGreaterThan(8);
    for (let i = 1; i < barbs.length; i += 1) expect(barbs[i - 1]! - barbs[i]!).toBeGreaterThanOrEqual(24);
    for (const y of barbs) expect(y).toBeGreaterThanOrEqual(DEFAULT_SKEWT_FRAME.topPx + 12);
    expect(svg).toContain('Wind barbs: flag 50 kt, feather 10, half 5');
  });
});
