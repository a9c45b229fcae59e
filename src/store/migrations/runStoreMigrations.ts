/**
 * Brings a database up to the newest schema version at start-up. Kysely's Migrator keeps the
 * applied versions in `kysely_migration` and takes a lock row, so two replicas starting together
 * apply each version once. Running it on an up-to-date database does nothing.
 */
import { Migrator, sql, type Kysely } from 'kysely';
import type { StoreBackend } from '../storeTypes.ts';
import { storeMigrationProvider } from './storeMigrations.ts';

export interface MigrationReport {
  /** Versions applied by this run, in order; empty when the schema was already current. */
  applied: string[];
}

export async function runStoreMigrations(db: Kysely<any>, backend: StoreBackend): Promise<MigrationReport> {
  const migrator = await createMigrator(db, backend);
  const { error, results } = await migrator.migrateToLatest();
  if (error !== undefined) {
    const failed = results?.find((r) => r.status === 'Error')?.migrationName ?? 'unknown';
    const cause = error instanceof Error ? error.message : String(error);
    throw new Error(`schema migration ${failed} failed: ${cause}`, { cause: error });
  }
  return { applied: (results ?? []).filter((r) => r.status === 'Success').map((r) => r.migrationName) };
}

/** Versions already applied to this database, oldest first (empty for a brand-new one). */
export async function listAppliedMigrations(db: Kysely<any>, backend: StoreBackend): Promise<string[]> {
  const migrator = await createMigrator(db, backend);
  const all = await migrator.getMigrations();
  return all.filter((m) => m.executedAt !== undefined).map((m) => m.name);
}

/**
 * On PostgreSQL the migration tables are pinned to the connection's current schema: without it,
 * Kysely would take a `kysely_migration` table in any other schema of the database for ours.
 */
async function createMigrator(db: Kysely<any>, backend: StoreBackend): Promise<Migrator> {
  if (backend === 'sqlite') return new Migrator({ db, provider: storeMigrationProvider });
  const { rows } = await sql<{ schema: string | null }>`select current_schema() as schema`.execute(db);
  const schema = rows[0]?.schema ?? null;
  if (schema === null) {
    throw new Error('the connection has no current schema (the search_path names no existing schema)');
  }
  return new Migrator({ db, provider: storeMigrationProvider, migrationTableSchema: schema });
}
