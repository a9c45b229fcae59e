// The compiled build is run only while it is current, and `npm start` runs with the bot's V8 flags.
import { mkdirSync, mkdtempSync, readFileSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { compiledBuildIsCurrent, PACKAGE_ROOT } from '../../bin/compiledBuild.mjs';
import { BOT_ENVIRONMENT, BOT_NODE_FLAGS } from '../../src/app/botRuntime.ts';

const folders: string[] = [];
afterEach(() => {
  for (const folder of folders.splice(0)) rmSync(folder, { recursive: true, force: true });
});

/** A package-shaped folder: a source in src/ and in adapters/, and a build stamp, all dated. */
function packageFolder(sourceAtS: number, stampAtS: number | null): { root: string; source: string } {
  const root = mkdtempSync(join(tmpdir(), 'lapsewatch-build-'));
  folders.push(root);
  for (const folder of ['src/core', 'adapters/slack', 'bench', 'dist']) mkdirSync(join(root, folder), { recursive: true });
  const source = join(root, 'src/core/constants.ts');
  for (const file of [source, join(root, 'adapters/slack/a.ts'), join(root, 'bench/alertCycleBot.ts'), join(root, 'tsconfig.json'), join(root, 'tsconfig.build.json')]) {
    writeFileSync(file, '// x\n');
    utimesSync(file, sourceAtS, sourceAtS);
  }
  for (const folder of ['src', 'src/core', 'adapters', 'adapters/slack', 'bench']) utimesSync(join(root, folder), sourceAtS, sourceAtS);
  if (stampAtS !== null) {
    writeFileSync(join(root, 'dist/build-stamp.json'), '{}\n');
    utimesSync(join(root, 'dist/build-stamp.json'), stampAtS, stampAtS);
  }
  return { root, source };
}

describe('compiledBuildIsCurrent', () => {
  it('is current when the stamp is newer than every source', () => {
    expect(compiledBuildIsCurrent(packageFolder(1_000_000, 1_000_100).root)).toBe(true);
  });

  it('is stale when any source changed after the stamp, however deep', () => {
    const { root, source } = packageFolder(1_000_000, 1_000_100);
    utimesSync(source, 1_000_200, 1_000_200);
    expect(compiledBuildIsCurrent(root)).toBe(false);
  });

  it('is stale without a stamp (a failed or missing build)', () => {
    expect(compiledBuildIsCurrent(packageFolder(1_000_000, null).root)).toBe(false);
  });
});

describe('npm start', () => {
  it("runs node with the bot's environment and V8 flags", () => {
    const start = (JSON.parse(readFileSync(join(PACKAGE_ROOT, 'package.json'), 'utf8')) as { scripts: Record<string, string> }).scripts.start!;
    const words = start.split(/\s+/);
    const environment = Object.entries(BOT_ENVIRONMENT).map(([name, value]) => `${name}=${value}`);
    expect(words.slice(0, environment.length + 1 + BOT_NODE_FLAGS.length)).toEqual([...environment, 'node', ...BOT_NODE_FLAGS]);
  });
});
