import type Database from 'better-sqlite3';
import type { SqliteDatabase } from 'kysely';
import { keepRecent } from '../keepRecent.ts';

/**
 * The SQLite database as Kysely sees it, with each statement prepared once: Kysely's driver
 * prepares its SQL on every query, and compiling the same few statements again on every command
 * was a measurable part of answering one. Kysely's driver runs one query at a time and we never
 * stream rows (an open iterator would make its statement busy), so a statement can be reused as
 * soon as it has run. Bounded, least recently used goes first.
 */
export function withPreparedStatementCache(database: Database.Database, maxStatements = 256): SqliteDatabase {
  const prepared = new Map<string, Database.Statement>();
  return {
    close: () => {
      prepared.clear();
      database.close();
    },
    prepare(sql) {
      const statement = prepared.get(sql) ?? database.prepare(sql);
      keepRecent(prepared, sql, statement, maxStatements);
      return statement;
    },
  };
}
