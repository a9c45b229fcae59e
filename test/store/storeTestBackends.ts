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

function trackStores(): { track(store: Store): Store } {
  const open: Store[] = [];
  afterEach(async () => {
    await Promise.all(open.splice(0).map((s) => s.close().catch(() => undefined)));
  });
  return { track: (store) => (open.push(store), store) };
}

export function sqliteHarness(): BackendHarness {
  let folder: string | undefined;
  let counter = 0;
  const stores = trackStores();
  afterAll(() => {
    if (folder !== undefined) fs.rmSync(folder, { recursive: true, force: true });
  });
  const filePathOf = (url: string): string => url.slice('sqlite:'.length);
  const harness: BackendHarness = {
    backend: 'sqlite',
    async freshUrl() {
      folder ??= fs.mkdtempSync(path.join(os.tmpdir(), 'lapsewatch-store-'));
      counter += 1;
      return `sqlite:${path.join(folder, `store-${counter}.db`)}`;
    },
    async open(url, options) {
      return stores.track(await openStore({ url, ...options }));
    },
    async openFresh() {
      const url = await harness.freshUrl();
      return Object.assign(await harness.open(url), { url });
    },
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
  return harness;
}

/** URL of `baseUrl` with its search_path set to `schema`. */
export function withSearchPath(baseUrl: string, schema: string): string {
  const separator = baseUrl.includes('?') ? '&' : '?';
  return `${baseUrl}${separator}options=${encodeURIComponent(`-c search_path=${schema}`)}`;
}

export function postgresHarness(baseUrl: string): BackendHarness {
  const schemas: string[] = [];
  const stores = trackStores();
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
  const harness: BackendHarness = {
    backend: 'postgres',
    async freshUrl() {
      const schema = `lw_test_${process.pid}_${randomBytes(5).toString('hex')}`;
      await withClient(baseUrl, (client) => client.query(`CREATE SCHEMA ${schema}`));
      schemas.push(schema);
      return withSearchPath(baseUrl, schema);
    },
    async open(url, options) {
      return stores.track(await openStore({ url, ...options }));
    },
    async openFresh() {
      const url = await harness.freshUrl();
      return Object.assign(await harness.open(url), { url });
    },
    async rawExecute(url, sqlText) {
      await withClient(url, (client) => client.query(sqlText));
    },
    async rawQuery<T>(url: string, sqlText: string) {
      return withClient(url, async (client) => (await client.query(sqlText)).rows as T[]);
    },
  };
  return harness;
}
