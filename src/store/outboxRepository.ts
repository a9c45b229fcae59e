/**
 * The outbox: every message the bot speaks first waits here until a sender posts it.
 *
 * Claiming works by lease. A claim stamps `claimed_by` and `claim_expires_at_ms`; while the lease
 * runs nobody else gets the row. A sender that dies simply stops renewing, and after the lease the
 * row is due again for any worker. On PostgreSQL the claim is one statement,
 *   UPDATE outbox SET ... WHERE id IN (SELECT id ... FOR UPDATE SKIP LOCKED) RETURNING *,
 * so concurrent replicas skip each other's rows instead of waiting or double-claiming. On SQLite
 * the same UPDATE without the lock clause is atomic on its own (SQLite has one writer at a time).
 */
import { z } from 'zod';
import type { StoreContext } from './storeContext.ts';
import type { OutboxItem, OutboxRepository, OutboxStats } from './storeTypes.ts';
import { insertOutboxRows } from './insertOutboxRows.ts';
import { toOutboxItem } from './rowMappers.ts';
import { summaryDedupeKey } from './storeKeys.ts';
import {
  channelTargetSchema,
  epochMsSchema,
  idSchema,
  localDateSchema,
  outboxKindSchema,
  parseInput,
  payloadToJson,
} from './storeInputSchemas.ts';

const workerIdSchema = z.string().min(1).max(200);
const leaseMsSchema = z.number().int().positive().max(24 * 3600 * 1000);
const limitSchema = z.number().int().positive().max(10_000);
const errorTextSchema = z.string().transform((s) => s.slice(0, 2000));

const newItemSchema = z.object({
  dedupeKey: z.string().min(1).max(1000),
  kind: outboxKindSchema,
  target: channelTargetSchema,
  payload: z.unknown(),
  nextAttemptAtMs: epochMsSchema.optional(),
});

const summarySchema = z.object({
  target: channelTargetSchema,
  localDate: localDateSchema,
  summaryKey: z.string().min(1).max(300),
  payload: z.unknown(),
  watchIds: z.array(idSchema),
});

function byDueOrder(a: OutboxItem, b: OutboxItem): number {
  return a.nextAttemptAtMs - b.nextAttemptAtMs || a.createdAtMs - b.createdAtMs || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
}

export function createOutboxRepository({ db, backend }: StoreContext): OutboxRepository {
  return {
    async enqueue(items, nowMs) {
      const checked = parseInput(z.array(newItemSchema), items, 'outbox items');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const rows = checked.map((item, index) => ({
        dedupeKey: item.dedupeKey,
        kind: item.kind,
        target: item.target,
        payloadJson: payloadToJson(item.payload, `outbox item ${index + 1}`),
        nextAttemptAtMs: item.nextAttemptAtMs ?? nowMs,
      }));
      return db.transaction().execute((trx) => insertOutboxRows(trx, rows, nowMs));
    },

    async enqueueSummary(summary, nowMs) {
      const s = parseInput(summarySchema, summary, 'morning summary');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const row = {
        dedupeKey: summaryDedupeKey(s.summaryKey, s.target, s.localDate),
        kind: 'summary' as const,
        target: s.target,
        payloadJson: payloadToJson(s.payload, 'morning summary'),
        nextAttemptAtMs: nowMs,
      };
      return db.transaction().execute(async (trx) => {
        const { insertedIds } = await insertOutboxRows(trx, [row], nowMs);
        if (insertedIds.length === 0) return { queued: false, outboxId: null };
        if (s.watchIds.length > 0) {
          await trx.updateTable('watches').set({ last_summary_local_date: s.localDate }).where('id', 'in', s.watchIds).execute();
        }
        return { queued: true, outboxId: insertedIds[0] ?? null };
      });
    },

    async claimDueOutbox(workerId, limit, leaseMs, nowMs) {
      const worker = parseInput(workerIdSchema, workerId, 'worker id');
      const max = parseInput(limitSchema, limit, 'claim limit');
      const lease = parseInput(leaseMsSchema, leaseMs, 'lease (ms)');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const due = db
        .selectFrom('outbox')
        .select('id')
        .where('sent_at_ms', 'is', null)
        .where('abandoned_at_ms', 'is', null)
        .where('next_attempt_at_ms', '<=', nowMs)
        .where((eb) => eb.or([eb('claimed_by', 'is', null), eb('claim_expires_at_ms', '<=', nowMs)]))
        .orderBy('next_attempt_at_ms')
        .orderBy('created_at_ms')
        .orderBy('id')
        .limit(max);
      const lockedDue = backend === 'postgres' ? due.forUpdate().skipLocked() : due;
      const rows = await db
        .updateTable('outbox')
        .set((eb) => ({
          claimed_by: worker,
          claim_expires_at_ms: nowMs + lease,
          attempts: eb('attempts', '+', 1),
        }))
        .where('id', 'in', lockedDue)
        .returningAll()
        .execute();
      // RETURNING order is not defined; hand rows over oldest due first.
      return rows.map(toOutboxItem).sort(byDueOrder);
    },

    async renewClaim(id, workerId, leaseMs, nowMs) {
      parseInput(idSchema, id, 'outbox id');
      const worker = parseInput(workerIdSchema, workerId, 'worker id');
      const lease = parseInput(leaseMsSchema, leaseMs, 'lease (ms)');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const result = await db
        .updateTable('outbox')
        .set({ claim_expires_at_ms: nowMs + lease })
        .where('id', '=', id)
        .where('claimed_by', '=', worker)
        .where('sent_at_ms', 'is', null)
        .where('abandoned_at_ms', 'is', null)
        .executeTakeFirst();
      return Number(result.numUpdatedRows) === 1;
    },

    async markSent(id, workerId, platformMessageId, nowMs) {
      parseInput(idSchema, id, 'outbox id');
      parseInput(workerIdSchema, workerId, 'worker id');
      const messageId = parseInput(z.string().max(500).nullable(), platformMessageId, 'platform message id');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      // Any worker may record the post: it happened, whoever holds the lease now.
      const result = await db
        .updateTable('outbox')
        .set({ sent_at_ms: nowMs, platform_message_id: messageId, claimed_by: null, claim_expires_at_ms: null, last_error: null })
        .where('id', '=', id)
        .where('sent_at_ms', 'is', null)
        .executeTakeFirst();
      return Number(result.numUpdatedRows) === 1;
    },

    async markFailed(id, workerId, retryAtMs, error) {
      parseInput(idSchema, id, 'outbox id');
      const worker = parseInput(workerIdSchema, workerId, 'worker id');
      parseInput(epochMsSchema, retryAtMs, 'retry time (retryAtMs)');
      const text = parseInput(errorTextSchema, error, 'error text');
      const result = await db
        .updateTable('outbox')
        .set({ next_attempt_at_ms: retryAtMs, last_error: text, claimed_by: null, claim_expires_at_ms: null })
        .where('id', '=', id)
        .where('claimed_by', '=', worker)
        .where('sent_at_ms', 'is', null)
        .executeTakeFirst();
      return Number(result.numUpdatedRows) === 1;
    },

    async markAbandoned(id, workerId, error, nowMs) {
      parseInput(idSchema, id, 'outbox id');
      const worker = parseInput(workerIdSchema, workerId, 'worker id');
      const text = parseInput(errorTextSchema, error, 'error text');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const result = await db
        .updateTable('outbox')
        .set({ abandoned_at_ms: nowMs, last_error: text, claimed_by: null, claim_expires_at_ms: null })
        .where('id', '=', id)
        .where('claimed_by', '=', worker)
        .where('sent_at_ms', 'is', null)
        .executeTakeFirst();
      return Number(result.numUpdatedRows) === 1;
    },

    async releaseClaim(id, workerId) {
      parseInput(idSchema, id, 'outbox id');
      const worker = parseInput(workerIdSchema, workerId, 'worker id');
      const result = await db
        .updateTable('outbox')
        .set({ claimed_by: null, claim_expires_at_ms: null })
        .where('id', '=', id)
        .where('claimed_by', '=', worker)
        .where('sent_at_ms', 'is', null)
        .executeTakeFirst();
      return Number(result.numUpdatedRows) === 1;
    },

    async getItem(id) {
      parseInput(idSchema, id, 'outbox id');
      const row = await db.selectFrom('outbox').selectAll().where('id', '=', id).executeTakeFirst();
      return row === undefined ? null : toOutboxItem(row);
    },

    async stats(nowMs): Promise<OutboxStats> {
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const unsent = db.selectFrom('outbox').where('sent_at_ms', 'is', null).where('abandoned_at_ms', 'is', null);
      const all = await unsent
        .select((eb) => [eb.fn.countAll().as('depth'), eb.fn.min('created_at_ms').as('oldest')])
        .executeTakeFirstOrThrow();
      const alerts = await unsent
        .where('kind', '=', 'alert')
        .select((eb) => eb.fn.min('created_at_ms').as('oldest'))
        .executeTakeFirstOrThrow();
      const claimed = await unsent
        .where('claimed_by', 'is not', null)
        .where('claim_expires_at_ms', '>', nowMs)
        .select((eb) => eb.fn.countAll().as('n'))
        .executeTakeFirstOrThrow();
      const abandoned = await db
        .selectFrom('outbox')
        .where('abandoned_at_ms', 'is not', null)
        .select((eb) => eb.fn.countAll().as('n'))
        .executeTakeFirstOrThrow();
      const age = (oldest: unknown): number | null => (oldest === null || oldest === undefined ? null : Math.max(0, nowMs - Number(oldest)));
      return {
        queueDepth: Number(all.depth),
        oldestUnsentAgeMs: age(all.oldest),
        oldestUnsentAlertAgeMs: age(alerts.oldest),
        claimed: Number(claimed.n),
        abandoned: Number(abandoned.n),
      };
    },

    async pruneFinished(beforeMs) {
      parseInput(epochMsSchema, beforeMs, 'beforeMs');
      const result = await db
        .deleteFrom('outbox')
        .where((eb) => eb.or([eb('sent_at_ms', '<', beforeMs), eb('abandoned_at_ms', '<', beforeMs)]))
        .executeTakeFirst();
      return Number(result.numDeletedRows);
    },
  };
}
