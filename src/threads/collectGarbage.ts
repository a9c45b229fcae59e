import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';

let collect: (() => void) | null = null;

/**
 * A full garbage collection of the calling thread's heap: for the picture thread
 * (src/render/rasterWorker.ts says why), and for benchmarks that measure the heap kept alive. V8
 * hands out its `gc` function only to contexts made after --expose-gc is set; the flag is set here,
 * at the first call, and the function taken from a fresh context, so the process need not start
 * with the flag and no other code sees a `gc` global.
 */
export function collectGarbage(): void {
  if (!collect) {
    setFlagsFromString('--expose-gc');
    collect = runInNewContext('gc') as () => void;
  }
  collect();
}
