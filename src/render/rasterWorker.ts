/**
 * The picture thread: rasterises our SVGs and encodes the PNGs, so that neither runs on the thread
 * that answers every channel (a skew-T took 60-100 ms there). One request at a time, in arrival
 * order. resvg encodes the PNG itself: copying its pixels out to encode them here left megabytes
 * of garbage per picture, which this small heap collected only every few dozen pictures.
 */
import { parentPort } from 'node:worker_threads';
import { Resvg, type ResvgRenderOptions } from '@resvg/resvg-js';
import type { RasterReply, RasterRequest } from './rasterMessages.ts';

parentPort!.on('message', (request: RasterRequest) => {
  let reply: RasterReply;
  try {
    const rendered = new Resvg(request.svg, request.options as ResvgRenderOptions).render();
    // Copied into an ArrayBuffer of its own, which can be handed over (transferred) whole.
    const png = new Uint8Array(rendered.asPng());
    reply = { id: request.id, ok: true, png, widthPx: rendered.width, heightPx: rendered.height };
    parentPort!.postMessage(reply, [png.buffer as ArrayBuffer]);
  } catch (error) {
    reply = { id: request.id, ok: false, reason: error instanceof Error ? error.message : String(error) };
    parentPort!.postMessage(reply);
  }
});
