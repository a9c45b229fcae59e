/**
 * A benchmark child's side of the line protocol in childLink.ts, and the memory sampler both sides
 * use. Kept apart from childLink.ts so a compiled child (dist/bench/) loads nothing of the parent's.
 */
import { createInterface } from 'node:readline';

type Json = Record<string, unknown>;

/**
 * The child's side: prints `hello` as its ready line, answers every request with `handle`, and
 * runs `shutdown` then exits when stdin closes or after `lifetimeMs` (a bench never outlives its bound).
 */
export function serveParent(hello: Json, handle: (request: Json) => Promise<Json>, shutdown: () => Promise<void>, lifetimeMs: number): void {
  let stopping = false;
  const stop = async (code: number): Promise<void> => {
    if (stopping) return;
    stopping = true;
    await shutdown().catch((error: unknown) => process.stderr.write(`child shutdown: ${String(error)}\n`));
    process.exit(code);
  };
  setTimeout(() => {
    process.stderr.write(`child ${process.pid}: over its ${lifetimeMs / 1000} s lifetime, stopping\n`);
    void stop(1);
  }, lifetimeMs).unref();
  const lines = createInterface({ input: process.stdin });
  lines.on('line', (line) => {
    const request = JSON.parse(line) as Json;
    handle(request).then(
      (answer) => process.stdout.write(`${JSON.stringify({ ...answer, id: request.id })}\n`),
      (error: unknown) => process.stdout.write(`${JSON.stringify({ id: request.id, error: error instanceof Error ? error.message : String(error) })}\n`),
    );
  });
  lines.on('close', () => void stop(0));
  process.stdout.write(`${JSON.stringify(hello)}\n`);
}

/** Samples this process's rss and heap every `everyMs`, keeping the high-water marks. */
export function memorySampler(everyMs = 25): { peakRssMb(): number; peakHeapUsedMb(): number; reset(): void; stop(): void } {
  let peakRss = 0;
  let peakHeap = 0;
  const sample = (): void => {
    const usage = process.memoryUsage();
    peakRss = Math.max(peakRss, usage.rss);
    peakHeap = Math.max(peakHeap, usage.heapUsed);
  };
  sample();
  const timer = setInterval(sample, everyMs);
  timer.unref();
  return {
    peakRssMb: () => (sample(), peakRss / 2 ** 20),
    peakHeapUsedMb: () => (sample(), peakHeap / 2 ** 20),
    reset: () => {
      peakRss = 0;
      peakHeap = 0;
      sample();
    },
    stop: () => clearInterval(timer),
  };
}
