/**
 * Which database a connection URL names. `sqlite:<path>` (also `sqlite://<path>` and
 * `sqlite:///abs/path`) is a file; a relative path is taken from `baseDir` (the data directory).
 * `postgres://` or `postgresql://` is a PostgreSQL server.
 */
import path from 'node:path';
import { StoreError } from './storeError.ts';

export type StoreLocation =
  | { backend: 'sqlite'; filePath: string }
  | { backend: 'postgres'; url: string; displayUrl: string };

export function parseStoreUrl(url: string, baseDir: string = process.cwd()): StoreLocation {
  const trimmed = url.trim();
  if (trimmed.startsWith('sqlite:')) {
    let rest = trimmed.slice('sqlite:'.length);
    if (rest.startsWith('//')) rest = rest.slice(2);
    if (rest === '' || rest === ':memory:') {
      throw new StoreError('invalid-url', `store URL "${url}" names no file; use sqlite:/path/to/lapsewatch.db`);
    }
    return { backend: 'sqlite', filePath: path.resolve(baseDir, rest) };
  }
  if (trimmed.startsWith('postgres://') || trimmed.startsWith('postgresql://')) {
    let parsed: URL;
    try {
      parsed = new URL(trimmed);
    } catch {
      throw new StoreError('invalid-url', `store URL is not a valid PostgreSQL URL: ${redactPassword(trimmed)}`);
    }
    if (parsed.hostname === '') {
      throw new StoreError('invalid-url', `PostgreSQL store URL names no host: ${redactPassword(trimmed)}`);
    }
    return { backend: 'postgres', url: trimmed, displayUrl: redactPassword(trimmed) };
  }
  throw new StoreError(
    'invalid-url',
    `store URL "${redactPassword(trimmed)}" is neither sqlite:<file> nor postgres://user@host:port/database`,
  );
}

/** The URL with any password replaced, so it can go into logs and error messages. */
export function redactPassword(url: string): string {
  return url.replace(/^([a-z]+:\/\/[^:/@]+):[^@]*@/i, '$1:***@');
}
