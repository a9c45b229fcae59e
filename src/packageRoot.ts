import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

/**
 * The folder holding Lapsewatch's package.json, found by walking up from this module, so that files
 * shipped beside the code (config/, the Slack manifest) are found the same way from the TypeScript
 * sources (src/) and from the compiled build (dist/src/).
 */
function findPackageRoot(): string {
  let folder = dirname(fileURLToPath(import.meta.url));
  for (;;) {
    const manifest = join(folder, 'package.json');
    if (existsSync(manifest) && (JSON.parse(readFileSync(manifest, 'utf8')) as { name?: string }).name === 'lapsewatch') return folder;
    const parent = dirname(folder);
    if (parent === folder) throw new Error(`lapsewatch: no package.json named "lapsewatch" above ${fileURLToPath(import.meta.url)}`);
    folder = parent;
  }
}

export const PACKAGE_ROOT = findPackageRoot();

/** A path inside the package, e.g. `packagePath('config', 'rules.yaml')`. */
export function packagePath(...parts: string[]): string {
  return join(PACKAGE_ROOT, ...parts);
}

/** Lapsewatch's version, as its package.json gives it (clients name it to the platforms). */
export const PACKAGE_VERSION: string = (JSON.parse(readFileSync(join(PACKAGE_ROOT, 'package.json'), 'utf8')) as { version: string }).version;
