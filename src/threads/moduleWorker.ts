import { Worker } from 'node:worker_threads';

/**
 * Starts the worker module `name` that sits beside the calling module (`callerUrl` is its
 * import.meta.url): the .ts file through tsx when the caller runs from the sources (a worker does
 * not inherit the loader tsx registered from code), the compiled .js file when it runs from dist/.
 * The worker reads `workerData` as given.
 */
export function startModuleWorker(callerUrl: string, name: string, workerData: Record<string, unknown> = {}): Worker {
  const fromSources = callerUrl.endsWith('.ts');
  const entry = new URL(`./${name}${fromSources ? '.ts' : '.js'}`, callerUrl);
  return fromSources
    ? new Worker(new URL('./workerBootstrap.mjs', import.meta.url), { workerData: { ...workerData, entry: entry.href } })
    : new Worker(entry, { workerData });
}
