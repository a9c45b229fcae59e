// Where the compiled build lives and whether it is current. `npm run build` (run by `npm ci`
// through `prepare`) compiles src/ and adapters/ to dist/ and writes the stamp last; a source file
// changed after the stamp makes the build stale, and callers then run the TypeScript through tsx,
// so a stale build is never what runs.
import { existsSync, readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const PACKAGE_ROOT = fileURLToPath(new URL('..', import.meta.url));
export const DIST_DIR = join(PACKAGE_ROOT, 'dist');
export const BUILD_STAMP = join(DIST_DIR, 'build-stamp.json');
/** The folders (and single files) the build compiles; keep in step with tsconfig.build.json. */
export const BUILD_INPUTS = ['src', 'adapters', 'bench/alertCycleBot.ts', 'tsconfig.json', 'tsconfig.build.json'];

function newestMtimeMs(path) {
  const stat = statSync(path, { throwIfNoEntry: false });
  if (!stat) return 0;
  if (!stat.isDirectory()) return stat.mtimeMs;
  let newest = stat.mtimeMs;
  for (const entry of readdirSync(path, { recursive: true })) {
    newest = Math.max(newest, statSync(join(path, String(entry))).mtimeMs);
  }
  return newest;
}

/** True when `root`/dist was built after the last change to any build input under `root`. */
export function compiledBuildIsCurrent(root = PACKAGE_ROOT) {
  const stamp = join(root, 'dist', 'build-stamp.json');
  if (!existsSync(stamp)) return false;
  const builtAtMs = statSync(stamp).mtimeMs;
  return BUILD_INPUTS.every((input) => newestMtimeMs(join(root, input)) <= builtAtMs);
}

/**
 * The file to run for a TypeScript module of the package (path relative to the package root, with
 * its .ts name): the compiled .js when the build is current, else the .ts itself (run it with tsx).
 */
export function runnableModule(relativeTsPath) {
  if (compiledBuildIsCurrent()) return { path: join(DIST_DIR, relativeTsPath.replace(/\.ts$/, '.js')), compiled: true };
  return { path: join(PACKAGE_ROOT, relativeTsPath), compiled: false };
}
