import { existsSync } from 'node:fs';
import { Resvg, type ResvgRenderOptions } from '@resvg/resvg-js';
import { CHART_FONT_FAMILY } from './svgMarkup.ts';

/** Our charts' font, loaded by file path so that the picture does not depend on the host's fonts. */
const FONT_DIR = '/usr/share/fonts/truetype/dejavu';
const FONT_FILES = ['DejaVuSans.ttf', 'DejaVuSans-Bold.ttf'].map((file) => `${FONT_DIR}/${file}`);

export type PngResult = { ok: true; png: Uint8Array; widthPx: number; heightPx: number } | { ok: false; reason: string };

let fontOptions: ResvgRenderOptions['font'] | undefined;

/** DejaVu Sans when its files are there; otherwise whatever the system offers (text may look different). */
function fonts(): ResvgRenderOptions['font'] {
  if (fontOptions) return fontOptions;
  const present = FONT_FILES.filter((file) => existsSync(file));
  fontOptions =
    present.length > 0
      ? { loadSystemFonts: false, fontFiles: present, defaultFontFamily: CHART_FONT_FAMILY, sansSerifFamily: CHART_FONT_FAMILY }
      : { loadSystemFonts: true, defaultFontFamily: CHART_FONT_FAMILY };
  return fontOptions;
}

/** Rasterises one of our SVGs. A failure is a value: the message goes out without its picture. */
export function rasterizeSvgToPng(svg: string): PngResult {
  try {
    const rendered = new Resvg(svg, { font: fonts(), background: '#ffffff', shapeRendering: 2, textRendering: 1 }).render();
    const png = new Uint8Array(rendered.asPng());
    return { ok: true, png, widthPx: rendered.width, heightPx: rendered.height };
  } catch (error) {
    return { ok: false, reason: `could not draw the image: ${error instanceof Error ? error.message : String(error)}` };
  }
}
