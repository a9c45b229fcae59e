/**
 * Runs a suite against both backends: SQLite files in a temporary folder, and PostgreSQL at
 * LAPSEWATCH_TEST_PG_URL (start one with `.ci/postgres.sh`). Each PostgreSQL store gets its own
 * schema (through the URL's search_path), so tests and files never see each other's rows.
 *
 * Without LAPSEWATCH_TEST_PG_URL the PostgreSQL half fails when CI is set, and is skipped with a
 * warning otherwise.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import Database from 'better-sqlite3';
import pg from 'pg';
import { afterAll, afterEach, describe, it } from 'vitest';
import { openStore, type OpenStoreOptions } from '../../src/store/openStore.ts';
import type { Store, StoreBackend } from '../../src/store/storeTypes.ts';

export const PG_URL_VARIABLE = 'LAPSEWATCH_TEST_PG_URL';

export interface BackendHarness {
  readonly backend: StoreBackend;
  /** A URL for a brand-new, empty store location. */
  freshUrl(): Promise<string>;
  /** Opens a store at `url`; it is closed after the test. */
  open(url: string, options?: Omit<OpenStoreOptions, 'url'>): Promise<Store>;
  /** A fresh, migrated store, closed after the test. */
  openFresh(): Promise<Store & { url: string }>;
  /** Runs SQL straight against the database behind `url`, outside the store (to plant faults). */
  rawExecute(url: string, sqlText: string): Promise<void>;
  /** Reads rows straight from the database behind `url`. */
  rawQuery<T>(url: string, sqlText: string): Promise<T[]>;
}

export function pgTestUrl(): string | undefined {
  const value = process.env[PG_URL_VARIABLE];
  return value === undefined || value.trim() === '' ? undefined : value.trim();
}

/** Declares the PostgreSQL-only suite, or its failing/skipped stand-in when no server is given. */
export function describePostgres(title: string, body: (baseUrl: string) => void): void {
  const baseUrl = pgTestUrl();
  if (baseUrl !== undefined) {
    describe(`${title} [postgres]`, () => body(baseUrl));
    return;
  }
  if (process.env.CI !== undefined && process.env.CI !== '' && process.env.CI !== 'false') {
    describe(`${title} [postgres]`, () => {
      it('has a PostgreSQL server to test against', () => {
        throw new Error(
          `${PG_URL_VARIABLE} is not set, and CI is: start a server with \`.ci/postgres.sh\` and export the URL it prints.`,
        );
      });
    });
    return;
  }
  console.warn(
    `\n[store tests] WARNING: ${PG_URL_VARIABLE} is not set; skipping "${title}" on PostgreSQL. ` +
      `Start a server with \`.ci/postgres.sh\` and export the URL it prints.\n`,
  );
  describe.skip(`${title} [postgres]`, () => body(''));
}

export function describeEachBackend(title: string, body: (harness: BackendHarness) => void): void {
  describe(`${title} [sqlite]`, () => body(sqliteHarness()));
  describePostgres(title, (baseUrl) => body(postgresHarness(baseUrl)));
}

/** `open` and `openFresh` for a backend: every store they open is closed after its test. */
function storeOpeners(freshUrl: () => Promise<string>): Pick<BackendHarness, 'open' | 'openFresh'> {
  const opened: Store[] = [];
  afterEach(async () => {
    await Promise.all(opened.splice(0).map((s) => s.close().catch(() => undefined)));
  });
  const open: BackendHarness['open'] = async (url, options) => {
    const store = await openStore({ url, ...options });
    opened.push(store);
    return store;
  };
  return {
    open,
    async openFresh() {
      const url = await freshUrl();
      return Object.assign(await open(url), { url });
    },
  };
}

export function sqliteHarness(): BackendHarness {
  let folder: string | undefined;
  let counter = 0;
  afterAll(() => {
    if (folder !== undefined) fs.rmSync(folder, { recursive: true, force: true });
  });
  const filePathOf = (url: string): string => url.slice('sqlite:'.length);
  async function freshUrl(): Promise<string> {
    folder ??= fs.mkdtempSync(path.join(os.tmpdir(), 'lapsewatch-store-'));
    counter += 1;
    return `sqlite:${path.join(folder, `store-${counter}.db`)}`;
  }
  return {
    backend: 'sqlite',
    freshUrl,
    ...storeOpeners(freshUrl),
    async rawExecute(url, sqlText) {
      const db = new Database(filePathOf(url), { fileMustExist: true });
      try {
        db.exec(sqlText);
      } finally {
        db.close();
      }
    },
    async rawQuery<T>(url: string, sqlText: string) {
      const db = new Database(filePathOf(url), { fileMustExist: true, readonly: true });
      try {
        return db.prepare(sqlText).all() as T[];
      } finally {
        db.close();
      }
    },
  };
}

/** URL of `baseUrl` with its search_path set to `schema`. */
export function withSearchPath(baseUrl: string, schema: string): string {
  const separator = baseUrl.includes('?') ? '&' : '?';
  return `${baseUrl}${separator}options=${encodeURIComponent(`-c search_path=${schema}`)}`;
}

export function postgresHarness(baseUrl: string): BackendHarness {
  const schemas: string[] = [];
  afterAll(async () => {
    if (schemas.length === 0) return;
    const client = new pg.Client({ connectionString: baseUrl });
    await client.connect();
    try {
      for (const schema of schemas) await client.query(`DROP SCHEMA IF EXISTS ${schema} CASCADE`);
    } finally {
      await client.end();
    }
  });
  async function withClient<T>(url: string, work: (client: pg.Client) => Promise<T>): Promise<T> {
    const client = new pg.Client({ connectionString: url });
    await client.connect();
    try {
      return await work(client);
    } finally {
      await client.end();
    }
  }
  async function freshUrl(): Promise<string> {
    const schema = `lw_test_${process.pid}_${randomBytes(5).toString('hex')}`;
    await withClient(baseUrl, (client) => client.query(`CREATE SCHEMA ${schema}`));
    schemas.push(schema);
    return withSearchPath(baseUrl, schema);
  }
  return {
    backend: 'postgres',
    freshUrl,
    ...storeOpeners(freshUrl),
    async rawExecute(url, sqlText) {
      await withClient(url, (client) => client.query(sqlText));
    },
    async rawQuery<T>(url: string, sqlText: string) {
      return withClient(url, async (client) => (await client.query(sqlText)).rows as T[]);
    },
  };
}
