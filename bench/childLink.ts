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
import { runnableModule } from '../bin/compiledBuild.mjs';
import { BOT_NODE_FLAGS } from '../src/app/botRuntime.ts';

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

/** Node flags from an environment variable when it is set ("" for none), else the defaults. */
export function nodeFlagsFromEnvironment(variable: string, defaults: readonly string[]): readonly string[] {
  const tried = process.env[variable];
  return tried === undefined ? defaults : tried.split(/\s+/).filter(Boolean);
}

/** The bot's node flags as `npm start` sets them; LAPSEWATCH_BENCH_NODE_FLAGS="..." tries others (benchmarks print them). */
export function botNodeFlagsForBench(): readonly string[] {
  return nodeFlagsFromEnvironment('LAPSEWATCH_BENCH_NODE_FLAGS', BOT_NODE_FLAGS);
}

export interface ChildOptions {
  /** Run the compiled build of the script when it is current (as `npm start` runs the bot). */
  preferCompiled?: boolean;
  /** Node flags before the script, e.g. the bot's BOT_NODE_FLAGS. */
  nodeFlags?: readonly string[];
  /** Added to this process's environment, e.g. the bot's BOT_ENVIRONMENT. */
  environment?: Readonly<Record<string, string>>;
}

/**
 * Starts `bench/<script>` (under tsx, or compiled when asked and current) and waits (at most
 * `readyTimeoutMs`) for its ready line.
 */
export async function startChild(script: string, args: string[], readyTimeoutMs: number, options: ChildOptions = {}): Promise<ChildLink> {
  const module = options.preferCompiled ? runnableModule(`bench/${script}`) : { path: fileURLToPath(new URL(script, import.meta.url)), compiled: false };
  const loader = module.compiled ? [] : ['--import', 'tsx'];
  const child = spawn(process.execPath, [...(options.nodeFlags ?? []), ...loader, module.path, ...args], {
    cwd: REPO_ROOT,
    env: { ...process.env, ...options.environment },
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

