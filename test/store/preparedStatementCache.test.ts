import Database from 'better-sqlite3';
import { Kysely, SqliteDialect, sql } from 'kysely';
import { describe, expect, it } from 'vitest';
import { withPreparedStatementCache } from '../../src/store/preparedStatementCache.ts';

describe('SQLite statements prepared once', () => {
  it('hands back the same statement for the same SQL, and Kysely still reads and writes through it', async () => {
    const raw = new Database(':memory:');
    const prepared: string[] = [];
    const prepare = raw.prepare.bind(raw);
    raw.prepare = ((text: string) => {
      prepared.push(text);
      return prepare(text);
    }) as typeof raw.prepare;
    const db = new Kysely<{ notes: { id: number; text: string } }>({ dialect: new SqliteDialect({ database: withPreparedStatementCache(raw, 3) }) });
    await sql`create table notes (id integer primary key, text text not null)`.execute(db);
    for (let id = 1; id <= 5; id += 1) await db.insertInto('notes').values({ id, text: `note ${id}` }).execute();
    const read = () => db.selectFrom('notes').select(['id', 'text']).where('id', '>', 3).orderBy('id').execute();
    expect(await read()).toEqual([{ id: 4, text: 'note 4' }, { id: 5, text: 'note 5' }]);
    expect(await read()).toEqual([{ id: 4, text: 'note 4' }, { id: 5, text: 'note 5' }]);
    // create, insert and select: each prepared once however often it ran.
    expect(prepared).toHaveLength(3);
    // A fourth statement with room for three: the least recently used (create) goes, the select stays.
    await db.updateTable('notes').set({ text: 'changed' }).where('id', '=', 5).execute();
    await read();
    expect(prepared).toHaveLength(4);
    await sql`create table if not exists notes (id integer primary key, text text not null)`.execute(db);
    expect(prepared).toHaveLength(5);
    await db.destroy();
    expect(raw.open).toBe(false);
  });
});
