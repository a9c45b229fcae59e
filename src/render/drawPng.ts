import { Resvg, type ResvgRenderOptions } from '@resvg/resvg-js';

/** A picture made: its PNG and its size in pixels. */
export interface DrawnPng {
  png: Uint8Array;
  widthPx: number;
  heightPx: number;
}

/** A picture, or why there is none. */
export type PngResult = ({ ok: true } & DrawnPng) | { ok: false; reason: string };

/**
 * Draws one SVG with resvg and encodes it (resvg's own encoder), on the calling thread: the picture
 * thread does this for answers, the answering thread only when that thread could not. Throws what
 * resvg throws. The PNG is copied into an ArrayBuffer of its own, which can be handed over
 * (transferred) whole.
 */
export function drawPng(svg: string, options: ResvgRenderOptions): DrawnPng {
  const rendered = new Resvg(svg, options).render();
  return { png: new Uint8Array(rendered.asPng()), widthPx: rendered.width, heightPx: rendered.height };
}
