/**
 * A benchmark's helper process and the line protocol between the two, so that stand-ins and load
 * generators run in their own process and their memory and CPU are not counted as the bot's.
 *
 * The child prints one JSON line when it is ready (its ports), then answers each request line on
 * its stdin with one JSON line on its stdout carrying the request's `id`. Its stderr is the
 * parent's. It exits when asked, when its stdin closes (the parent died) or at its own deadline.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createInterface } from 'node:readline';
import { fileURLToPath } from 'node:url';

const REPO_ROOT = fileURLToPath(new URL('..', import.meta.url));

type Json = Record<string, unknown>;

export interface ChildLink {
  readonly pid: number;
  /** The child's first line: what it listens on. */
  readonly hello: Json;
  /** Sends one request and resolves with the child's answer to it. */
  ask<T = Json>(request: Json, timeoutMs: number): Promise<T>;
  /** Asks the child to stop, then ends it by its pid if it has not gone within `timeoutMs`. */
  stop(timeoutMs?: number): Promise<void>;
}

function exited(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((resolve) => child.once('exit', () => resolve()));
}

/** Starts `bench/<script>` under tsx and waits (at most `readyTimeoutMs`) for its ready line. */
export async function startChild(script: string, args: string[], readyTimeoutMs: number): Promise<ChildLink> {
  const child = spawn(process.execPath, ['--import', 'tsx', fileURLToPath(new URL(script, import.meta.url)), ...args], {
    cwd: REPO_ROOT,
    stdio: ['pipe', 'pipe', 'inherit'],
  });
  const waiting = new Map<number, (answer: Json) => void>();
  let onHello: ((hello: Json) => void) | undefined;
  let nextId = 1;
  createInterface({ input: child.stdout! }).on('line', (line) => {
    let parsed: Json;
    try {
      parsed = JSON.parse(line) as Json;
    } catch {
      process.stderr.write(`[${script}] ${line}\n`);
      return;
    }
    if (typeof parsed.id === 'number') {
      waiting.get(parsed.id)?.(parsed);
      waiting.delete(parsed.id);
    } else {
      onHello?.(parsed);
    }
  });
  const gone = exited(child);

  const hello = await new Promise<Json>((resolve, reject) => {
    const timer = setTimeout(() => reject(new Error(`${script} not ready within ${readyTimeoutMs} ms`)), readyTimeoutMs);
    onHello = (line) => {
      clearTimeout(timer);
      resolve(line);
    };
    void gone.then(() => {
      clearTimeout(timer);
      reject(new Error(`${script} exited before it was ready (code ${child.exitCode})`));
    });
  }).catch((error: unknown) => {
    child.kill('SIGKILL');
    throw error;
  });

  return {
    pid: child.pid!,
    hello,
    ask<T>(request: Json, timeoutMs: number): Promise<T> {
      const id = nextId++;
      return new Promise<T>((resolve, reject) => {
        const timer = setTimeout(() => {
          waiting.delete(id);
          reject(new Error(`${script} did not answer ${JSON.stringify(request.cmd)} within ${timeoutMs} ms`));
        }, timeoutMs);
        waiting.set(id, (answer) => {
          clearTimeout(timer);
          if (typeof answer.error === 'string') reject(new Error(`${script}: ${answer.error}`));
          else resolve(answer as unknown as T);
        });
        void gone.then(() => {
          if (!waiting.has(id)) return;
          clearTimeout(timer);
          waiting.delete(id);
          reject(new Error(`${script} exited (code ${child.exitCode}) before answering ${JSON.stringify(request.cmd)}`));
        });
        child.stdin!.write(`${JSON.stringify({ ...request, id })}\n`);
      });
    },
    async stop(timeoutMs = 5_000): Promise<void> {
      if (child.exitCode === null && child.signalCode === null) child.stdin!.end();
      const timer = setTimeout(() => child.kill('SIGKILL'), timeoutMs);
      await gone;
      clearTimeout(timer);
    },
  };
}

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
