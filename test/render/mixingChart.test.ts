import { describe, expect, it } from 'vitest';
import {
  drawMixingChartPng,
  drawMixingChartSvg,
  MIXING_CHART_HEIGHT_PX,
  MIXING_CHART_WIDTH_PX,
  mixingChartX,
} from '../../src/render/mixingChart.ts';
import { makeSeries } from './fixtures.ts';
import { pngInfo } from './pngInfo.ts';

const markerX = (svg: string): number => Number(svg.match(/id="coupling-marker" x1="([^"]+)"/)?.[1]);

describe('48-hour mixing chart (invented fixture series)', () => {
  it('marks the coupling hour at its x', () => {
    const series = makeSeries();
    const svg = drawMixingChartSvg(series, { units: 'metric' });
    const firstCoupled = series.hours.findIndex((hour) => hour.coupled);
    expect(firstCoupled).toBe(12);
    expect(markerX(svg)).toBeCloseTo(mixingChartX(12, 48), 0);
    expect(svg).toContain('Reaches dry layer Fri 12:00 MDT');
  });

  it('moves the marker when coupling comes later', () => {
    const series = makeSeries();
    const hours = series.hours.map((hour, index) => (index < 14 ? { ...hour, coupled: false } : hour));
    expect(markerX(drawMixingChartSvg({ ...series, hours }, { units: 'metric' }))).toBeCloseTo(mixingChartX(14, 48), 0);
  });

  it('says so when the mixed layer never reaches the dry layer', () => {
    const svg = drawMixingChartSvg(makeSeries({ coupling: false }), { units: 'metric' });
    expect(svg).not.toContain('coupling-marker');
    expect(svg).toContain('Mixing stays below any dry layer for all 48 h');
  });

  it('draws the dry layer for every hour that has one, with local-time labels', () => {
    const svg = drawMixingChartSvg(makeSeries(), { units: 'metric' });
    expect(svg.match(/class="dry-layer-slot"/g)).toHaveLength(48);
    expect(svg).toContain('Fri 14 Aug');
    expect(svg).toContain('Sat 15 Aug');
    expect(svg).toContain('Height AGL (m)');
    expect(svg).toContain('Invented demo data');
  });

  it('uses feet for US units', () => {
    const svg = drawMixingChartSvg(makeSeries(), { units: 'us' });
    expect(svg).toContain('Height AGL (ft)');
    expect(svg).toContain('>15,000<');
  });

  it('rasterises to a small PNG (time printed, not asserted)', () => {
    const started = performance.now();
    const result = drawMixingChartPng(makeSeries(), { units: 'metric' });
    console.log(`48-hour mixing chart: SVG + PNG in ${(performance.now() - started).toFixed(1)} ms`);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(pngInfo(result.png)).toEqual({ signatureOk: true, widthPx: MIXING_CHART_WIDTH_PX, heightPx: MIXING_CHART_HEIGHT_PX });
    expect(result.png.length).toBeLessThan(200_000);
  });
});
