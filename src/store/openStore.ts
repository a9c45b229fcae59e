/**
 * The one way in: `openStore({ url })` picks SQLite or PostgreSQL from the URL, opens it, brings
 * the schema up to date and returns the repositories. Anything wrong (bad URL, missing or corrupt
 * file, unreachable server, failed migration) is a `StoreError` here, at start-up, never later as a
 * silently empty store.
 *
 *   const store = await openStore({ url: 'sqlite:data/lapsewatch.db', baseDir: dataDir });
 *   const channel = await store.channels.ensureChannel(target, defaults, Date.now());
 *   ...
 *   await store.close();
 */
import type { Kysely } from 'kysely';
import type { StoreDatabase } from './databaseSchema.ts';
import type { Store, StoreBackend } from './storeTypes.ts';
import { createAlertHistoryRepository } from './alertHistoryRepository.ts';
import { createChannelRepository } from './channelRepository.ts';
import { createJobClaimRepository } from './jobClaimRepository.ts';
import { listAppliedMigrations, runStoreMigrations } from './migrations/runStoreMigrations.ts';
import { openPostgresDatabase } from './openPostgresDatabase.ts';
import { openSqliteDatabase } from './openSqliteDatabase.ts';
import { createOutboxRepository } from './outboxRepository.ts';
import { createPlaceRepository } from './placeRepository.ts';
import { createRuleRepository } from './ruleRepository.ts';
import { StoreError, causeMessage } from './storeError.ts';
import { parseStoreUrl } from './storeUrl.ts';
import { createWatchRepository } from './watchRepository.ts';

export interface OpenStoreOptions {
  /** `sqlite:<file>` or `postgres://user@host:port/database`. */
  url: string;
  /** Where a relative SQLite path is taken from (the data directory); default the working folder. */
  baseDir?: string;
  /**
   * The store must already exist and hold our schema: a missing SQLite file, or a file or database
   * with no applied migrations, is an error instead of a new empty store. Default false.
   */
  expectExisting?: boolean;
  /** PostgreSQL pool size; default 10. */
  maxConnections?: number;
  /** Told about dropped idle PostgreSQL connections (e.g. a server restart); give it your logger. */
  onConnectionError?: (error: Error) => void;
}

export async function openStore(options: OpenStoreOptions): Promise<Store> {
  const location = parseStoreUrl(options.url, options.baseDir);
  const expectExisting = options.expectExisting ?? false;
  let db: Kysely<StoreDatabase>;
  let backend: StoreBackend;
  let displayLocation: string;
  if (location.backend === 'sqlite') {
    db = openSqliteDatabase({ filePath: location.filePath, expectExisting });
    backend = 'sqlite';
    displayLocation = location.filePath;
  } else {
    db = openPostgresDatabase({
      url: location.url,
      maxConnections: options.maxConnections,
      onIdleConnectionError: options.onConnectionError,
    }).db;
    backend = 'postgres';
    displayLocation = location.displayUrl;
  }

  let migrationsApplied: string[];
  try {
    migrationsApplied = await prepareSchema(db, backend, displayLocation, expectExisting);
  } catch (error) {
    await db.destroy().catch(() => undefined);
    throw error;
  }

  const context = { db, backend };
  return {
    backend,
    location: displayLocation,
    migrationsApplied,
    channels: createChannelRepository(context),
    places: createPlaceRepository(context),
    watches: createWatchRepository(context),
    rules: createRuleRepository(context),
    alerts: createAlertHistoryRepository(context),
    outbox: createOutboxRepository(context),
    jobs: createJobClaimRepository(context),
    close: () => db.destroy(),
  };
}

async function prepareSchema(
  db: Kysely<StoreDatabase>,
  backend: StoreBackend,
  displayLocation: string,
  expectExisting: boolean,
): Promise<string[]> {
  const what = backend === 'sqlite' ? `SQLite store ${displayLocation}` : `PostgreSQL store ${displayLocation}`;
  let applied: string[];
  try {
    applied = await listAppliedMigrations(db, backend);
  } catch (error) {
    if (backend === 'postgres') {
      throw new StoreError('unreachable', `cannot reach ${what}: ${causeMessage(error)}`, { cause: error });
    }
    throw new StoreError('corrupt-file', `cannot read ${what}: ${causeMessage(error)}`, { cause: error });
  }
  if (expectExisting && applied.length === 0) {
    throw new StoreError(
      'not-a-store',
      `${what} holds no Lapsewatch data (no schema version applied), and the config says it must already exist ` +
        '(expectExisting). Check the path or URL, or turn expectExisting off to start a new store.',
    );
  }
  try {
    return (await runStoreMigrations(db, backend)).applied;
  } catch (error) {
    throw new StoreError('migration-failed', `${what}: ${causeMessage(error)}`, { cause: error });
  }
}
