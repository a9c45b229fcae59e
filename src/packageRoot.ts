import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/**
 * The folder holding Lapsewatch's package.json, found by walking up from this module, so that files
 * shipped beside the code (config/, the Slack manifest) are found the same way from the TypeScript
 * sources (src/) and from the compiled build (dist/src/); with that package.json, read once.
 */
function findPackage(): { root: string; manifest: { name?: string; version: string } } {
  let folder = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    const path = join(folder, 'package.json');
    if (existsSync(path)) {
      const manifest = JSON.parse(readFileSync(path, 'utf8')) as { name?: string; version: string };
      if (manifest.name === 'lapsewatch') return { root: folder, manifest };
    }
    const parent = dirname(folder);
    if (parent === folder) throw new Error(`lapsewatch: no package.json named "lapsewatch" above ${fileURLToPath(import.meta.url)}`);
    folder = parent;
  }
}

const found = findPackage();
export const PACKAGE_ROOT = found.root;

/** A path inside the package, e.g. `packagePath('config', 'rules.yaml')`. */
export function packagePath(...parts: string[]): string {
  return join(PACKAGE_ROOT, ...parts);
}

/** Lapsewatch's version, as its package.json gives it (clients name it to the platforms). */
export const PACKAGE_VERSION: string = found.manifest.version;
