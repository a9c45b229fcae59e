/**
 * Writes outbox rows inside a caller's transaction, skipping dedupe keys already present.
 * Shared by the alert history (crossing + messages in one transaction) and the outbox itself.
 */
import type { Kysely, Transaction } from 'kysely';
import type { StoreDatabase } from './databaseSchema.ts';
import type { ChannelTarget, OutboxKind } from './storeTypes.ts';
import { newId } from './newId.ts';

export interface OutboxRowToInsert {
  dedupeKey: string;
  kind: OutboxKind;
  target: ChannelTarget;
  payloadJson: string;
  nextAttemptAtMs: number;
}

// Rows per INSERT: keeps well under SQLite's and PostgreSQL's limits on bound parameters.
const ROWS_PER_STATEMENT = 200;

export async function insertOutboxRows(
  trx: Transaction<StoreDatabase> | Kysely<StoreDatabase>,
  rows: OutboxRowToInsert[],
  nowMs: number,
): Promise<{ insertedIds: string[]; duplicateKeys: string[] }> {
  // duplicateKeys: each key of which at least one row was not written, listed once.
  const insertedIds: string[] = [];
  const duplicateKeys = new Set<string>();
  // A key repeated within the batch is a duplicate of its first occurrence.
  const unique = new Map<string, OutboxRowToInsert>();
  for (const row of rows) {
    if (unique.has(row.dedupeKey)) duplicateKeys.add(row.dedupeKey);
    else unique.set(row.dedupeKey, row);
  }
  const toWrite = [...unique.values()];
  const insertedKeys = new Set<string>();
  for (let start = 0; start < toWrite.length; start += ROWS_PER_STATEMENT) {
    const chunk = toWrite.slice(start, start + ROWS_PER_STATEMENT);
    const inserted = await trx
      .insertInto('outbox')
      .values(
        chunk.map((row) => ({
          id: newId(),
          dedupe_key: row.dedupeKey,
          kind: row.kind,
          platform: row.target.platform,
          team_id: row.target.teamId,
          channel_id: row.target.channelId,
          payload_json: row.payloadJson,
          created_at_ms: nowMs,
          next_attempt_at_ms: row.nextAttemptAtMs,
          claimed_by: null,
          claim_expires_at_ms: null,
          sent_at_ms: null,
          platform_message_id: null,
          last_error: null,
          abandoned_at_ms: null,
        })),
      )
      .onConflict((oc) => oc.column('dedupe_key').doNothing())
      .returning(['id', 'dedupe_key'])
      .execute();
    for (const row of inserted) {
      insertedIds.push(row.id);
      insertedKeys.add(row.dedupe_key);
    }
  }
  for (const key of unique.keys()) if (!insertedKeys.has(key)) duplicateKeys.add(key);
  return { insertedIds, duplicateKeys: [...duplicateKeys] };
}
