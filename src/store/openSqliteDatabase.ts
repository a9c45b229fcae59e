/**
 * Opens the embedded SQLite store file, refusing anything that would quietly become an empty store.
 *
 * - Missing file: created with its folder on first start, unless `expectExisting` is set, when it
 *   is an error ('missing-file'): a deployment that should have data must not start blank.
 * - Path that cannot be opened (a folder, no permission): 'unreadable-file' naming the path and cause.
 * - Not a database, or damaged pages: 'corrupt-file' with SQLite's own words. Checked at open with
 *   the header bytes and `PRAGMA quick_check`, so the failure shows at start-up, not on first use.
 * - `expectExisting` and a file with no applied migrations: 'not-a-store' (checked by openStore).
 */
import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { Kysely, SqliteDialect } from 'kysely';
import type { StoreDatabase } from './databaseSchema.ts';
import { withPreparedStatementCache } from './preparedStatementCache.ts';
import { StoreError, causeMessage } from './storeError.ts';

const SQLITE_HEADER = 'SQLite format 3\u0000';

export interface OpenSqliteOptions {
  filePath: string;
  expectExisting: boolean;
}

export function openSqliteDatabase({ filePath, expectExisting }: OpenSqliteOptions): Kysely<StoreDatabase> {
  const existed = checkFileBeforeOpen(filePath, expectExisting);
  let database: Database.Database;
  try {
    database = new Database(filePath, { fileMustExist: existed });
  } catch (error) {
    throw new StoreError('unreadable-file', `cannot open SQLite store ${filePath}: ${causeMessage(error)}`, { cause: error });
  }
  try {
    verifyIntegrity(database, filePath);
    // WAL lets readers run beside the writer; FULL sync keeps a committed alert through power loss.
    database.pragma('journal_mode = WAL');
    database.pragma('synchronous = FULL');
    database.pragma('foreign_keys = ON');
    database.pragma('busy_timeout = 5000');
  } catch (error) {
    database.close();
    if (error instanceof StoreError) throw error;
    throw new StoreError('corrupt-file', `SQLite store ${filePath} is damaged or not a database: ${causeMessage(error)}`, {
      cause: error,
    });
  }
  return new Kysely<StoreDatabase>({ dialect: new SqliteDialect({ database: withPreparedStatementCache(database) }) });
}

/** Returns whether the file existed; creates the folder for a new one. */
function checkFileBeforeOpen(filePath: string, expectExisting: boolean): boolean {
  let stat: fs.Stats;
  try {
    stat = fs.statSync(filePath);
  } catch (error) {
    if ((error as NodeJS.ErrnoException).code !== 'ENOENT') {
      throw new StoreError('unreadable-file', `cannot read SQLite store ${filePath}: ${causeMessage(error)}`, { cause: error });
    }
    if (expectExisting) {
      throw new StoreError(
        'missing-file',
        `SQLite store ${filePath} does not exist, and the config says it must (expectExisting). ` +
          'Restore the file, fix the path, or turn expectExisting off to start a new empty store.',
      );
    }
    try {
      fs.mkdirSync(path.dirname(filePath), { recursive: true });
    } catch (mkdirError) {
      throw new StoreError(
        'unreadable-file',
        `cannot create the folder for SQLite store ${filePath}: ${causeMessage(mkdirError)}`,
        { cause: mkdirError },
      );
    }
    return false;
  }
  if (!stat.isFile()) {
    throw new StoreError('unreadable-file', `SQLite store ${filePath} is not a regular file (it is a folder or device)`);
  }
  try {
    fs.accessSync(filePath, fs.constants.R_OK | fs.constants.W_OK);
  } catch (error) {
    throw new StoreError('unreadable-file', `cannot read and write SQLite store ${filePath}: ${causeMessage(error)}`, {
      cause: error,
    });
  }
  if (stat.size > 0) checkHeader(filePath);
  return true;
}

function checkHeader(filePath: string): void {
  const header = Buffer.alloc(16);
  const fd = fs.openSync(filePath, 'r');
  let bytesRead: number;
  try {
    bytesRead = fs.readSync(fd, header, 0, 16, 0);
  } finally {
    fs.closeSync(fd);
  }
  if (bytesRead < 16 || header.toString('latin1') !== SQLITE_HEADER) {
    throw new StoreError(
      'corrupt-file',
      `SQLite store ${filePath} is not a SQLite database (its first bytes are not the SQLite header). ` +
        'Restore it from a backup or point the store URL at the right file.',
    );
  }
}

function verifyIntegrity(database: Database.Database, filePath: string): void {
  const rows = database.pragma('quick_check') as Array<{ quick_check: string }>;
  const problems = rows.map((r) => r.quick_check).filter((m) => m !== 'ok');
  if (problems.length > 0) {
    throw new StoreError(
      'corrupt-file',
      `SQLite store ${filePath} failed its integrity check: ${problems.slice(0, 3).join('; ')}`,
    );
  }
}
