/**
 * Opens a pg Pool behind Kysely. A server restart drops the pool's idle connections: the pool
 * reports that through its 'error' event (handled here so the process does not die) and opens
 * fresh connections on the next query. A query sent while the server is down fails with its error;
 * the caller retries it later.
 */
import pg from 'pg';
import { Kysely, PostgresDialect } from 'kysely';
import type { StoreDatabase } from './databaseSchema.ts';

export interface OpenPostgresOptions {
  url: string;
  /** Connections in the pool; default 10. */
  maxConnections?: number;
  /** Called for errors on idle connections (e.g. the server restarted); the pool replaces them. */
  onIdleConnectionError?: (error: Error) => void;
}

// bigint (OID 20) columns hold epoch milliseconds and counts, all far below 2^53: read them as numbers.
const INT8_OID = 20;
const typeParsers = {
  getTypeParser(oid: number, format?: 'text' | 'binary') {
    if (oid === INT8_OID && format !== 'binary') return (value: string) => Number(value);
    return pg.types.getTypeParser(oid, format as 'text');
  },
};

export function openPostgresDatabase(options: OpenPostgresOptions): { db: Kysely<StoreDatabase>; pool: pg.Pool } {
  const pool = new pg.Pool({
    connectionString: options.url,
    max: options.maxConnections ?? 10,
    connectionTimeoutMillis: 10_000,
    idleTimeoutMillis: 30_000,
    types: typeParsers as pg.CustomTypesConfig,
  });
  pool.on('error', (error) => options.onIdleConnectionError?.(error));
  // A server restart also errors connections that are checked out; without a listener that error
  // would crash the process. The query in flight fails (the caller retries) and the pool replaces it.
  pool.on('connect', (client) => client.on('error', (error) => options.onIdleConnectionError?.(error)));
  const db = new Kysely<StoreDatabase>({ dialect: new PostgresDialect({ pool }) });
  return { db, pool };
}
