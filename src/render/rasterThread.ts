/**
 * The answering thread's side of the picture thread (rasterWorker.ts). The thread starts with the
 * first picture, so a process that draws none (the alert scheduler, a store command) never holds
 * it, and ends after a quiet spell to give its memory back. It keeps the process alive only while
 * a picture is being drawn. If it fails, every picture it owed is reported as not made, and the
 * next request starts a new thread.
 */
import type { Worker } from 'node:worker_threads';
import { startModuleWorker } from '../threads/moduleWorker.ts';
import type { PngResult } from './drawPng.ts';
import type { RasterReply } from './rasterMessages.ts';

/** How long the thread stays after its last picture (an incident channel asks in bursts). */
const IDLE_MS = 5 * 60_000;

let worker: Worker | null = null;
let nextId = 1;
const owed = new Map<number, (outcome: PngResult) => void>();
let idleTimer: NodeJS.Timeout | null = null;

function settleAll(reason: string): void {
  const waiting = [...owed.values()];
  owed.clear();
  for (const resolve of waiting) resolve({ ok: false, reason });
}

function pictureThread(): Worker {
  if (worker) return worker;
  const started = startModuleWorker(import.meta.url, 'rasterWorker');
  started.on('message', (reply: RasterReply) => {
    const resolve = owed.get(reply.id);
    owed.delete(reply.id);
    if (owed.size === 0) started.unref();
    resolve?.(reply.ok ? { ok: true, png: reply.png, widthPx: reply.widthPx, heightPx: reply.heightPx } : { ok: false, reason: reply.reason });
  });
  const forget = (reason: string) => {
    if (worker === started) worker = null;
    settleAll(reason);
  };
  started.on('error', (error) => forget(`the picture thread failed: ${error.message}`));
  started.on('exit', (code) => forget(`the picture thread ended (exit code ${code})`));
  worker = started;
  return started;
}

function restartIdleTimer(): void {
  if (idleTimer) clearTimeout(idleTimer);
  idleTimer = setTimeout(() => {
    idleTimer = null;
    if (owed.size === 0) void stopPictureThread();
  }, IDLE_MS);
  idleTimer.unref();
}

/** Rasterises `svg` with resvg `options` on the picture thread; resolves (never rejects) with the PNG or why there is none. */
export function rasterizeOnPictureThread(svg: string, options: unknown): Promise<PngResult> {
  const thread = pictureThread();
  const id = nextId++;
  const outcome = new Promise<PngResult>((resolve) => owed.set(id, resolve));
  thread.ref();
  thread.postMessage({ id, svg, options });
  restartIdleTimer();
  return outcome;
}

/** Ends the picture thread now (tests, shutdown); the next picture starts a new one. */
export async function stopPictureThread(): Promise<void> {
  const current = worker;
  worker = null;
  if (current) await current.terminate();
}
