import { existsSync } from 'node:fs';
import { Resvg } from '@resvg/resvg-js';
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { CHART_FONT_COVERAGE, FULL_FONT_FILES, SUBSET_FONT_FILES, subsetCovers } from '../../src/render/chartFonts.ts';
import { drawMixingChartSvg } from '../../src/render/mixingChart.ts';
import { rasterizeSvgToPng } from '../../src/render/rasterizePng.ts';
import { PngCache } from '../../src/render/pngCache.ts';
import { drawSkewTSvg } from '../../src/render/skewTDiagram.ts';
import { escapeXml } from '../../src/render/svgMarkup.ts';
import { makeAnalysis, makeSeries } from './fixtures.ts';

// The reference is resvg drawing with the full DejaVu Sans files of Debian's fonts-dejavu-core
// (which .ci/run installs): the subsets must draw exactly the same pixels wherever they are used.
const drawWith = (svg: string, fontFiles: string[]): Buffer =>
  Buffer.from(new Resvg(svg, { font: { loadSystemFonts: false, fontFiles, defaultFontFamily: 'DejaVu Sans' }, background: '#ffffff' }).render().pixels);

/** Every covered character, 40 to a line, regular and bold. */
function coverageSheet(): string {
  const characters = [...CHART_FONT_COVERAGE];
  const lines: string[] = [];
  for (let at = 0; at < characters.length; at += 40) lines.push(characters.slice(at, at + 40).join(''));
  const rows = lines.flatMap((line, index) => [
    `<text x="4" y="${16 + index * 36}" font-size="13">${escapeXml(line)}</text>`,
    `<text x="4" y="${34 + index * 36}" font-size="13" font-weight="bold">${escapeXml(line)}</text>`,
  ]);
  return `<svg xmlns="http://www.w3.org/2000/svg" width="560" height="${lines.length * 36 + 8}" font-family="DejaVu Sans">${rows.join('')}</svg>`;
}

describe('chart font subsets', () => {
  it('are in the repository, and the full fonts they were cut from are on this machine', () => {
    expect(SUBSET_FONT_FILES.filter((file) => !existsSync(file))).toEqual([]);
    expect(FULL_FONT_FILES.filter((file) => !existsSync(file))).toEqual([]);
  });

  it('draw every covered character, regular and bold, pixel for pixel as the full fonts do', () => {
    const sheet = coverageSheet();
    expect(subsetCovers(sheet)).toBe(true);
    const subset = drawWith(sheet, SUBSET_FONT_FILES);
    expect(subset.equals(drawWith(sheet, FULL_FONT_FILES))).toBe(true);
    // Not a blank page: the sheet has ink in it.
    expect(subset.some((byte) => byte < 128)).toBe(true);
  });

  it('draw our real pictures (invented fixtures) pixel for pixel as the full fonts do', () => {
    const series = makeSeries();
    for (const svg of [drawMixingChartSvg(series, { units: 'us' }), drawSkewTSvg(makeAnalysis(), { units: 'metric', timeZone: 'America/Boise', invented: true })]) {
      expect(subsetCovers(svg)).toBe(true);
      expect(drawWith(svg, SUBSET_FONT_FILES).equals(drawWith(svg, FULL_FONT_FILES))).toBe(true);
    }
  });

  it('are not used for a picture with a character they lack: a place name in Cyrillic is drawn with the full fonts', () => {
    const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="220" height="30" font-family="DejaVu Sans"><text x="4" y="20" font-size="14">Пик Ласточка (invented)</text></svg>`;
    expect(subsetCovers(svg)).toBe(false);
    const made = rasterizeSvgToPng(svg, new PngCache({ maxEntries: 2, maxBytes: 1 << 20 }));
    expect(made.ok).toBe(true);
    if (!made.ok) return;
    const pixels = Buffer.from(PNG.sync.read(Buffer.from(made.png)).data);
    expect(pixels.equals(drawWith(svg, FULL_FONT_FILES))).toBe(true);
    // The subsets would have drawn empty boxes instead of letters.
    expect(pixels.equals(drawWith(svg, SUBSET_FONT_FILES))).toBe(false);
  });

  it('cover ASCII and the signs our labels use, and nothing outside the Basic Multilingual Plane', () => {
    expect(subsetCovers('Dry layer 2,600–4,400 m · 35 °C ≥ 20 km/h → 14:00 MDT')).toBe(true);
    expect(subsetCovers('Smoke 🔥')).toBe(false);
    expect(subsetCovers('漢字')).toBe(false);
  });
});
