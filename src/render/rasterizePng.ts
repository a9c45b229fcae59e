import type { ResvgRenderOptions } from '@resvg/resvg-js';
import { chartFontFiles, subsetCovers } from './chartFonts.ts';
import { drawPng, type PngResult } from './drawPng.ts';
import { PngCache } from './pngCache.ts';
import { rasterizeOnPictureThread } from './rasterThread.ts';
import { CHART_FONT_FAMILY } from './svgMarkup.ts';

export type { PngResult } from './drawPng.ts';

interface RenderSettings {
  options: ResvgRenderOptions;
  /** Everything in `options` as text: part of every cache key, so other settings can never hit a stale picture. */
  key: string;
}

/** Decided once per process for each choice of fonts: the subsets, or the full files. */
const settingsByCoverage = new Map<boolean, RenderSettings>();

/**
 * The settings for one SVG: our DejaVu Sans subsets when they hold every character in it,
 * otherwise the full DejaVu files (chartFonts.ts says why); system-font discovery off (it scans
 * every font on the host, per call). With no DejaVu file at all, whatever the system offers (text
 * may look different). The native binding takes fonts only by path, so the files are named, not held.
 */
function renderSettings(svg: string): RenderSettings {
  const covered = subsetCovers(svg);
  const known = settingsByCoverage.get(covered);
  if (known) return known;
  const present = chartFontFiles(covered);
  const font: ResvgRenderOptions['font'] =
    present.length > 0
      ? { loadSystemFonts: false, fontFiles: present, defaultFontFamily: CHART_FONT_FAMILY, sansSerifFamily: CHART_FONT_FAMILY }
      : { loadSystemFonts: true, defaultFontFamily: CHART_FONT_FAMILY };
  // Drawn at the SVG's own size (1 px per unit): the pictures are laid out for it.
  const options: ResvgRenderOptions = { font, background: '#ffffff', shapeRendering: 2, textRendering: 1 };
  const settings = { options, key: JSON.stringify(options) };
  settingsByCoverage.set(covered, settings);
  return settings;
}

/**
 * Shared by every channel and platform in the process. 64 pictures and 24 MB hold a few dozen
 * places' charts and skew-Ts for the current forecast run; a new run makes new SVGs, new keys.
 */
const sharedCache = new PngCache({ maxEntries: 64, maxBytes: 24 * 1024 * 1024 });
let rasterizedCount = 0;

/** Cache keys of recent SVGs. A picture's SVG is drawn once per forecast run and asked for by every channel; hashing its 10-40 kB again for each was a millisecond of every answer. */
const keysBySvg = new Map<string, { options: ResvgRenderOptions; key: string }>();
const MAX_REMEMBERED_KEYS = 32;

/** The render options for `svg` and its picture's cache key. */
function pictureKey(svg: string): { options: ResvgRenderOptions; key: string } {
  let known = keysBySvg.get(svg);
  if (!known) {
    const settings = renderSettings(svg);
    known = { options: settings.options, key: PngCache.keyOf(svg, settings.key) };
    if (keysBySvg.size >= MAX_REMEMBERED_KEYS) keysBySvg.clear();
    keysBySvg.set(svg, known);
  }
  return known;
}

/**
 * Rasterises one of our SVGs, or hands back the same picture made earlier from the same SVG text.
 * Rasterising is the slow part of an answer (tens to hundreds of ms, on the event loop); a failure
 * is a value: the message goes out without its picture (and nothing is cached).
 */
export function rasterizeSvgToPng(svg: string, cache: PngCache = sharedCache): PngResult {
  const { options, key } = pictureKey(svg);
  const cached = cache.get(key);
  if (cached) return { ok: true, ...cached };
  try {
    rasterizedCount += 1;
    const picture = drawPng(svg, options);
    cache.set(key, picture);
    return { ok: true, ...picture };
  } catch (error) {
    return { ok: false, reason: `could not draw the image: ${error instanceof Error ? error.message : String(error)}` };
  }
}

const inFlight = new Map<string, Promise<void>>();

/**
 * Rasterises on the picture thread (rasterThread.ts) and leaves the picture in the cache, so that
 * the synchronous `rasterizeSvgToPng` a message builder calls next finds it there. The slow part
 * of an answer then runs off the event loop, and other channels' answers are not kept waiting
 * behind it. Requests for the same picture share one rendering. Never rejects: a failure is left
 * for the synchronous call to report (it tries once more on this thread).
 */
export function prepareSvgToPng(svg: string, cache: PngCache = sharedCache): Promise<void> {
  const { options, key } = pictureKey(svg);
  if (cache.has(key)) return Promise.resolve();
  const pending = inFlight.get(key);
  if (pending) return pending;
  rasterizedCount += 1;
  const rendering = rasterizeOnPictureThread(svg, options)
    .then((outcome) => {
      if (outcome.ok) cache.set(key, { png: outcome.png, widthPx: outcome.widthPx, heightPx: outcome.heightPx });
    })
    .finally(() => inFlight.delete(key));
  inFlight.set(key, rendering);
  return rendering;
}

/** For the benchmarks: pictures actually rasterised in this process, and answers taken from the shared cache. */
export function rasterizeCacheStats(): { rasterized: number; hits: number; entries: number; bytes: number } {
  return { rasterized: rasterizedCount, hits: sharedCache.stats.hits, entries: sharedCache.size, bytes: sharedCache.bytes };
}

/** Empties the shared cache, so that a benchmark run starts with no finished picture. */
export function resetRasterizeCache(): void {
  sharedCache.clear();
}
