// `npm run build` (and `prepare`, so `npm ci` builds): compiles src/ and adapters/ to dist/ with
// tsc, then writes the stamp that bin/compiledBuild.mjs compares against the sources. Without
// TypeScript installed (npm ci --omit=dev) it says so and leaves the sources to run through tsx.
import { spawnSync } from 'node:child_process';
import { createRequire } from 'node:module';
import { dirname, join } from 'node:path';
import { mkdirSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { BUILD_STAMP, DIST_DIR, PACKAGE_ROOT } from '../bin/compiledBuild.mjs';

const require = createRequire(import.meta.url);
let tscPath;
try {
  tscPath = join(dirname(require.resolve('typescript/package.json')), 'bin', 'tsc');
} catch {
  console.warn('lapsewatch build: TypeScript is not installed; skipping the build (the sources run through tsx).');
  process.exit(0);
}
rmSync(DIST_DIR, { recursive: true, force: true });
const startedAtMs = Date.now();
const result = spawnSync(process.execPath, [tscPath, '-p', 'tsconfig.build.json'], { cwd: PACKAGE_ROOT, stdio: 'inherit' });
if (result.status !== 0) {
  console.error('lapsewatch build: tsc failed; dist/ left without a stamp, so the sources run through tsx.');
  process.exit(result.status ?? 1);
}
mkdirSync(DIST_DIR, { recursive: true });
writeFileSync(BUILD_STAMP, `${JSON.stringify({ builtAt: new Date().toISOString(), tookMs: Date.now() - startedAtMs })}\n`);
// Dated when tsc started: a source saved while it ran makes the build stale, as it should.
const startedAt = new Date(startedAtMs);
utimesSync(BUILD_STAMP, startedAt, startedAt);
