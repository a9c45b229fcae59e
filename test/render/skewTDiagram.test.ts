import { describe, expect, it } from 'vitest';
import { drawSkewTPng, drawSkewTSvg, SKEWT_HEIGHT_PX, SKEWT_WIDTH_PX } from '../../src/render/skewTDiagram.ts';
import { DEFAULT_SKEWT_FRAME, yOfPressure } from '../../src/render/skewTGeometry.ts';
import { makeAnalysis, TIME_ZONE } from './fixtures.ts';
import { pngInfo } from './pngInfo.ts';

const attribute = (svg: string, id: string, name: string): number => {
  const element = svg.match(new RegExp(`<[^>]*id="${id}"[^>]*>`))?.[0] ?? '';
  return Number(element.match(new RegExp(` ${name}="([^"]+)"`))?.[1]);
};

describe('skew-T diagram (invented 37-level fixture)', () => {
  const analysis = makeAnalysis();
  const svg = drawSkewTSvg(analysis, { units: 'metric', timeZone: TIME_ZONE, invented: true });

  it('draws the traces, guide lines, shading, mixing height and legend', () => {
    expect(svg).toContain('id="temperature-trace"');
    expect(svg).toContain('id="dewpoint-trace"');
    expect(svg).toContain('id="parcel-path"');
    expect(svg).toContain('id="legend"');
    expect(svg.match(/class="isotherm"/g)?.length).toBeGreaterThan(8);
    expect(svg.match(/class="dry-adiabat"/g)?.length).toBeGreaterThan(8);
    expect(svg.match(/class="moist-adiabat"/g)?.length).toBeGreaterThan(8);
    expect(svg).toContain('Mixing height 2,640 m AGL');
    expect(svg).toContain('Mixing reaches the dry layer: effective 4,400 m AGL');
    expect(svg).toContain('INVENTED DEMO DATA');
    expect(svg).toContain('Fri 14 Aug 15:00 MDT');
  });

  it('puts the mixing height line and the dry layer at their pressures', () => {
    const yMix = attribute(svg, 'mixing-height-line', 'y1');
    expect(yMix).toBeCloseTo(yOfPressure(DEFAULT_SKEWT_FRAME, analysis.mixingHeight.pressureHpa), 0);
    const layer = analysis.dryNearAdiabaticLayers[0];
    const yTop = attribute(svg, 'dry-layer-0', 'y');
    const height = attribute(svg, 'dry-layer-0', 'height');
    expect(yTop).toBeCloseTo(yOfPressure(DEFAULT_SKEWT_FRAME, layer.topPressureHpa), 0);
    expect(yTop + height).toBeCloseTo(yOfPressure(DEFAULT_SKEWT_FRAME, layer.basePressureHpa), 0);
  });

  it('labels isotherms in °F and heights in thousands of feet for US units', () => {
    const us = drawSkewTSvg(analysis, { units: 'us', timeZone: TIME_ZONE, invented: false });
    expect(us).toContain('Temperature (°F)');
    expect(us).toContain('>9k<');
    expect(us).toContain('Mixing height 8,660 ft AGL');
    expect(us).not.toContain('INVENTED');
  });

  it('escapes a place name so it cannot break the SVG', () => {
    const odd = drawSkewTSvg({ ...analysis, name: 'Fork <A> & "B"' }, { units: 'metric', invented: true });
    expect(odd).toContain('Fork &lt;A&gt; &amp; &quot;B&quot;');
    expect(drawSkewTPng({ ...analysis, name: 'Fork <A> & "B"' }, { units: 'metric', invented: true }).ok).toBe(true);
  });

  it('rasterises a 37-level profile to a PNG of the stated size (time printed, not asserted)', () => {
    expect(analysis.levels).toHaveLength(37);
    const started = performance.now();
    const result = drawSkewTPng(analysis, { units: 'metric', timeZone: TIME_ZONE, invented: true });
    const elapsedMs = performance.now() - started;
    console.log(`skew-T, 37 levels: SVG + PNG in ${elapsedMs.toFixed(1)} ms`);
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(pngInfo(result.png)).toEqual({ signatureOk: true, widthPx: SKEWT_WIDTH_PX, heightPx: SKEWT_HEIGHT_PX });
    expect(result.png.length).toBeGreaterThan(20_000);
    expect(result.png.length).toBeLessThan(1_000_000);
  });

  it('still draws a profile with missing dew points and no dry layer', () => {
    const bare = makeAnalysis({ coupled: false });
    const broken = {
      ...bare,
      dryNearAdiabaticLayers: [],
      mixingHeight: { ...bare.mixingHeight, coupledLayerIndex: null },
      levels: bare.levels.map((level, index) => (index > 20 ? { ...level, dewpointC: Number.NaN } : level)),
    };
    const out = drawSkewTSvg(broken, { units: 'metric', invented: true });
    expect(out).not.toContain('NaN');
    expect(out).not.toContain('dry-layer-0');
  });
});
