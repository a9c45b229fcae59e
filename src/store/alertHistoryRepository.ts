/**
 * The record of crossings announced. The crossing key (location, rule, valid local day, direction)
 * is unique, so an event is announced once however many checks or replicas see it; an update is
 * written only when the caller judges the change material and passes the revision it saw.
 */
import { z } from 'zod';
import type { StoreContext } from './storeContext.ts';
import type { AlertHistoryRepository, AlertRecord, Crossing, OutgoingMessage } from './storeTypes.ts';
import { insertOutboxRows, type OutboxRowToInsert } from './insertOutboxRows.ts';
import { toAlertRecord } from './rowMappers.ts';
import { alertDedupeKey, crossingKeyOf } from './storeKeys.ts';
import {
  channelTargetSchema,
  crossingSchema,
  epochMsSchema,
  localDateSchema,
  locationKeySchema,
  parseInput,
  payloadToJson,
  ruleIdSchema,
} from './storeInputSchemas.ts';

const identitySchema = z.object({
  locationKey: locationKeySchema,
  ruleId: ruleIdSchema,
  validLocalDay: localDateSchema,
  direction: z.enum(['up', 'down']),
});
const messageSchema = z.object({ target: channelTargetSchema, payload: z.unknown() });

function toOutboxRows(crossingKey: string, revision: number, messages: OutgoingMessage[], nowMs: number): OutboxRowToInsert[] {
  const checked = parseInput(z.array(messageSchema), messages, 'alert messages');
  return checked.map((message, index) => ({
    dedupeKey: alertDedupeKey(crossingKey, revision, message.target),
    kind: 'alert',
    target: message.target,
    payloadJson: payloadToJson(message.payload, `alert message ${index + 1}`),
    nextAttemptAtMs: nowMs,
  }));
}

export function createAlertHistoryRepository({ db }: StoreContext): AlertHistoryRepository {
  async function findByKey(crossingKey: string): Promise<AlertRecord | null> {
    const row = await db.selectFrom('alert_history').selectAll().where('crossing_key', '=', crossingKey).executeTakeFirst();
    return row === undefined ? null : toAlertRecord(row);
  }

  return {
    async findCrossing(identity) {
      return findByKey(crossingKeyOf(parseInput(identitySchema, identity, 'crossing')));
    },

    async recordCrossingWithOutbox(crossing: Crossing, messages, nowMs) {
      const c = parseInput(crossingSchema, crossing, 'crossing');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const crossingKey = crossingKeyOf(c);
      const rows = toOutboxRows(crossingKey, 0, messages, nowMs);
      return db.transaction().execute(async (trx) => {
        const inserted = await trx
          .insertInto('alert_history')
          .values({
            crossing_key: crossingKey,
            location_key: c.locationKey,
            rule_id: c.ruleId,
            valid_local_day: c.validLocalDay,
            direction: c.direction,
            valid_time: c.validTime,
            value: c.value,
            effective_depth_m: c.effectiveDepthM,
            revision: 0,
            first_announced_at_ms: nowMs,
            last_announced_at_ms: nowMs,
          })
          .onConflict((oc) => oc.column('crossing_key').doNothing())
          .returningAll()
          .executeTakeFirst();
        if (inserted === undefined) {
          const existing = await trx.selectFrom('alert_history').selectAll().where('crossing_key', '=', crossingKey).executeTakeFirstOrThrow();
          return { status: 'duplicate' as const, existing: toAlertRecord(existing) };
        }
        const { insertedIds } = await insertOutboxRows(trx, rows, nowMs);
        return { status: 'recorded' as const, record: toAlertRecord(inserted), outboxIds: insertedIds };
      });
    },

    async recordCrossingUpdate(crossing, expectedRevision, messages, nowMs) {
      const c = parseInput(crossingSchema, crossing, 'crossing');
      const revision = parseInput(z.number().int().nonnegative(), expectedRevision, 'expected revision');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const crossingKey = crossingKeyOf(c);
      const rows = toOutboxRows(crossingKey, revision + 1, messages, nowMs);
      return db.transaction().execute(async (trx) => {
        // Compare-and-set on the revision: of two replicas updating at once, one wins.
        const updated = await trx
          .updateTable('alert_history')
          .set({
            valid_time: c.validTime,
            value: c.value,
            effective_depth_m: c.effectiveDepthM,
            revision: revision + 1,
            last_announced_at_ms: nowMs,
          })
          .where('crossing_key', '=', crossingKey)
          .where('revision', '=', revision)
          .returningAll()
          .executeTakeFirst();
        if (updated === undefined) {
          const current = await trx.selectFrom('alert_history').selectAll().where('crossing_key', '=', crossingKey).executeTakeFirst();
          return { status: 'stale' as const, current: current === undefined ? null : toAlertRecord(current) };
        }
        const { insertedIds } = await insertOutboxRows(trx, rows, nowMs);
        return { status: 'recorded' as const, record: toAlertRecord(updated), outboxIds: insertedIds };
      });
    },

    async queueRecordedCrossing(crossing, messages, nowMs) {
      const c = parseInput(crossingSchema, crossing, 'crossing');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const crossingKey = crossingKeyOf(c);
      return db.transaction().execute(async (trx) => {
        const current = await trx.selectFrom('alert_history').selectAll().where('crossing_key', '=', crossingKey).executeTakeFirst();
        if (current === undefined) return { status: 'stale' as const, current: null };
        const record = toAlertRecord(current);
        // Keyed by the revision that stands: a channel already sent it gets nothing twice.
        const { insertedIds } = await insertOutboxRows(trx, toOutboxRows(crossingKey, record.revision, messages, nowMs), nowMs);
        return { status: 'recorded' as const, record, outboxIds: insertedIds };
      });
    },
  };
}
