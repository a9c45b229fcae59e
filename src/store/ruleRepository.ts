/** Per-channel rule thresholds and mutes. */
import { z } from 'zod';
import type { StoreContext } from './storeContext.ts';
import { ALL_LOCATIONS, type RuleRepository } from './storeTypes.ts';
import { toMute, toRuleOverride } from './rowMappers.ts';
import { requireChannelRef } from './requireChannelRef.ts';
import { epochMsSchema, idSchema, locationKeySchema, parseInput, ruleIdSchema } from './storeInputSchemas.ts';

const thresholdSchema = z.number().finite();
const hysteresisSchema = z.number().finite().nonnegative().nullable();

export function createRuleRepository({ db }: StoreContext): RuleRepository {
  async function mutesEndingAfter(channelRef: string, afterMs: number) {
    parseInput(idSchema, channelRef, 'channel id');
    parseInput(epochMsSchema, afterMs, 'afterMs');
    const rows = await db
      .selectFrom('mutes')
      .selectAll()
      .where('channel_ref', '=', channelRef)
      .where('until_ms', '>', afterMs)
      .orderBy('rule_id')
      .orderBy('location_key')
      .execute();
    return rows.map(toMute);
  }

  return {
    async setOverride(channelRef, ruleId, thresholdValue, hysteresisValue, nowMs) {
      parseInput(idSchema, channelRef, 'channel id');
      const rule = parseInput(ruleIdSchema, ruleId, 'rule id');
      const threshold = parseInput(thresholdSchema, thresholdValue, `threshold for ${rule}`);
      const hysteresis = parseInput(hysteresisSchema, hysteresisValue, `hysteresis for ${rule}`);
      parseInput(epochMsSchema, nowMs, 'nowMs');
      await requireChannelRef(db, channelRef);
      const row = await db
        .insertInto('rule_overrides')
        .values({ channel_ref: channelRef, rule_id: rule, threshold_value: threshold, hysteresis_value: hysteresis, updated_at_ms: nowMs })
        .onConflict((oc) =>
          oc.columns(['channel_ref', 'rule_id']).doUpdateSet({
            threshold_value: threshold,
            hysteresis_value: hysteresis,
            updated_at_ms: nowMs,
          }),
        )
        .returningAll()
        .executeTakeFirstOrThrow();
      return toRuleOverride(row);
    },

    async clearOverride(channelRef, ruleId) {
      parseInput(idSchema, channelRef, 'channel id');
      const rule = parseInput(ruleIdSchema, ruleId, 'rule id');
      const result = await db
        .deleteFrom('rule_overrides')
        .where('channel_ref', '=', channelRef)
        .where('rule_id', '=', rule)
        .executeTakeFirst();
      return Number(result.numDeletedRows) > 0;
    },

    async listOverrides(channelRef) {
      parseInput(idSchema, channelRef, 'channel id');
      const rows = await db.selectFrom('rule_overrides').selectAll().where('channel_ref', '=', channelRef).orderBy('rule_id').execute();
      return rows.map(toRuleOverride);
    },

    async setMute(channelRef, ruleId, locationKey, untilMs, nowMs) {
      parseInput(idSchema, channelRef, 'channel id');
      const rule = parseInput(ruleIdSchema, ruleId, 'rule id');
      const key = parseInput(locationKeySchema, locationKey, 'location key');
      parseInput(epochMsSchema, untilMs, 'mute end (untilMs)');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      await requireChannelRef(db, channelRef);
      const row = await db
        .insertInto('mutes')
        .values({ channel_ref: channelRef, rule_id: rule, location_key: key, until_ms: untilMs, created_at_ms: nowMs })
        .onConflict((oc) =>
          oc.columns(['channel_ref', 'rule_id', 'location_key']).doUpdateSet({ until_ms: untilMs, created_at_ms: nowMs }),
        )
        .returningAll()
        .executeTakeFirstOrThrow();
      return toMute(row);
    },

    async endMutes(channelRef, ruleId, locationKey, nowMs) {
      parseInput(idSchema, channelRef, 'channel id');
      const rule = parseInput(ruleIdSchema, ruleId, 'rule id');
      const key = locationKey === null ? null : parseInput(locationKeySchema, locationKey, 'location key');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      // Ended, not deleted: the next alert check reads mutes that ended since it last looked and
      // tells the channel what they held back, as it does when a mute runs out.
      let update = db.updateTable('mutes').set({ until_ms: nowMs }).where('channel_ref', '=', channelRef).where('rule_id', '=', rule).where('until_ms', '>', nowMs);
      if (key !== null) update = update.where('location_key', '=', key);
      const rows = await update.returningAll().execute();
      return rows.map(toMute).sort((a, b) => a.locationKey.localeCompare(b.locationKey));
    },

    async listActiveMutes(channelRef, nowMs) {
      return mutesEndingAfter(channelRef, nowMs);
    },

    async listMutesEndingAfter(channelRef, afterMs) {
      return mutesEndingAfter(channelRef, afterMs);
    },

    async isMuted(channelRef, ruleId, locationKey, nowMs) {
      parseInput(idSchema, channelRef, 'channel id');
      const rule = parseInput(ruleIdSchema, ruleId, 'rule id');
      const key = parseInput(locationKeySchema, locationKey, 'location key');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const row = await db
        .selectFrom('mutes')
        .select('rule_id')
        .where('channel_ref', '=', channelRef)
        .where('rule_id', '=', rule)
        .where('location_key', 'in', [key, ALL_LOCATIONS])
        .where('until_ms', '>', nowMs)
        .executeTakeFirst();
      return row !== undefined;
    },
  };
}
