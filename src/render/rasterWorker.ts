/**
 * The picture thread: rasterises our SVGs and encodes the PNGs, so that neither runs on the thread
 * that answers every channel (a skew-T took 60-100 ms there). One request at a time, in arrival
 * order. resvg encodes the PNG itself: copying its pixels out to encode them here left megabytes
 * of garbage per picture, which this small heap collected only every few dozen pictures.
 */
import { parentPort } from 'node:worker_threads';
import type { ResvgRenderOptions } from '@resvg/resvg-js';
import { collectGarbage } from '../threads/collectGarbage.ts';
import { drawPng } from './drawPng.ts';
import type { RasterReply, RasterRequest } from './rasterMessages.ts';

/**
 * resvg-js 2.6 keeps each picture's parsed tree and pixels (about 1 MB for a chart) in native
 * memory that it does not report to V8, and frees them only when V8 collects the small JS objects
 * that hold them (thx/resvg-js issue 216). This thread allocates so little JS that V8 never
 * collected: rss grew by about 1.5 MB per picture without bound (46 MB over 30 pictures, measured
 * with a scratch script). So once the pictures in hand have gone out, the thread collects. Native
 * finalisers run on a later turn, which is why the collection runs after the reply, not inside it.
 */
let collectionDue = false;
function collectWhenIdle(): void {
  if (collectionDue) return;
  collectionDue = true;
  setImmediate(() => {
    collectionDue = false;
    collectGarbage();
  });
}

parentPort!.on('message', (request: RasterRequest) => {
  let reply: RasterReply;
  try {
    const drawn = drawPng(request.svg, request.options as ResvgRenderOptions);
    reply = { id: request.id, ok: true, ...drawn };
    parentPort!.postMessage(reply, [drawn.png.buffer as ArrayBuffer]);
  } catch (error) {
    reply = { id: request.id, ok: false, reason: error instanceof Error ? error.message : String(error) };
    parentPort!.postMessage(reply);
  }
  collectWhenIdle();
});
