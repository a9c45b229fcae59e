/** Watches: which channel follows which point. Switched off, never deleted, so history stays. */
import { z } from 'zod';
import type { StoreContext } from './storeContext.ts';
import type { WatchRepository } from './storeTypes.ts';
import { newId } from './newId.ts';
import { requireChannelRef } from './requireChannelRef.ts';
import { toChannel, toWatch } from './rowMappers.ts';
import { locationKeyOf } from './storeKeys.ts';
import {
  epochMsSchema,
  idSchema,
  localDateSchema,
  locationKeySchema,
  newWatchSchema,
  parseInput,
} from './storeInputSchemas.ts';

export function createWatchRepository({ db }: StoreContext): WatchRepository {
  return {
    async addWatch(channelRef, watch, nowMs) {
      parseInput(idSchema, channelRef, 'channel id');
      const w = parseInput(newWatchSchema, watch, 'watch');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const locationKey = locationKeyOf(w.latitudeDeg, w.longitudeDeg);
      await requireChannelRef(db, channelRef);
      const id = newId();
      return db.transaction().execute(async (trx) => {
        await trx
          .insertInto('watches')
          .values({
            id,
            channel_ref: channelRef,
            location_key: locationKey,
            place_name: w.placeName ?? null,
            latitude_deg: w.latitudeDeg,
            longitude_deg: w.longitudeDeg,
            elevation_m: w.elevationM ?? null,
            time_zone: w.timeZone ?? null,
            created_by: w.createdBy,
            created_at_ms: nowMs,
            active: 1,
            last_alert_check_at_ms: null,
            last_summary_local_date: null,
          })
          .onConflict((oc) => oc.columns(['channel_ref', 'location_key']).doNothing())
          .execute();
        const existing = await trx
          .selectFrom('watches')
          .selectAll()
          .where('channel_ref', '=', channelRef)
          .where('location_key', '=', locationKey)
          .executeTakeFirstOrThrow();
        if (existing.id === id) return { watch: toWatch(existing), created: true };
        // Watching the same point again: switch the old watch back on with the newest label. A watch
        // that was off counts as new again, so its channel is told the warnings that stand (the
        // outbox skips any it was already sent).
        await trx
          .updateTable('watches')
          .set({
            active: 1,
            last_alert_check_at_ms: Number(existing.active) === 1 ? existing.last_alert_check_at_ms : null,
            place_name: w.placeName ?? existing.place_name,
            elevation_m: w.elevationM ?? existing.elevation_m,
            time_zone: w.timeZone ?? existing.time_zone,
          })
          .where('id', '=', existing.id)
          .execute();
        const updated = await trx.selectFrom('watches').selectAll().where('id', '=', existing.id).executeTakeFirstOrThrow();
        return { watch: toWatch(updated), created: false };
      });
    },

    async deactivateWatch(channelRef, locationKey) {
      parseInput(idSchema, channelRef, 'channel id');
      parseInput(locationKeySchema, locationKey, 'location key');
      const result = await db
        .updateTable('watches')
        .set({ active: 0 })
        .where('channel_ref', '=', channelRef)
        .where('location_key', '=', locationKey)
        .where('active', '=', 1)
        .executeTakeFirst();
      return Number(result.numUpdatedRows) > 0;
    },

    async listWatches(channelRef, options) {
      parseInput(idSchema, channelRef, 'channel id');
      let query = db.selectFrom('watches').selectAll().where('channel_ref', '=', channelRef);
      if (options?.includeInactive !== true) query = query.where('active', '=', 1);
      const rows = await query.orderBy('created_at_ms').orderBy('id').execute();
      return rows.map(toWatch);
    },

    async listActiveWatchesWithChannel() {
      const rows = await db
        .selectFrom('watches')
        .innerJoin('channels', 'channels.id', 'watches.channel_ref')
        .selectAll('watches')
        .select([
          'channels.id as c_id',
          'channels.platform as c_platform',
          'channels.team_id as c_team_id',
          'channels.channel_id as c_channel_id',
          'channels.unit_system as c_unit_system',
          'channels.summary_local_time as c_summary_local_time',
          'channels.active as c_active',
          'channels.created_at_ms as c_created_at_ms',
          'channels.updated_at_ms as c_updated_at_ms',
        ])
        .where('watches.active', '=', 1)
        .where('channels.active', '=', 1)
        .orderBy('watches.location_key')
        .orderBy('watches.id')
        .execute();
      return rows.map((row) => ({
        ...toWatch(row),
        channel: toChannel({
          id: row.c_id,
          platform: row.c_platform,
          team_id: row.c_team_id,
          channel_id: row.c_channel_id,
          unit_system: row.c_unit_system,
          summary_local_time: row.c_summary_local_time,
          active: row.c_active,
          created_at_ms: row.c_created_at_ms,
          updated_at_ms: row.c_updated_at_ms,
        }),
      }));
    },

    async markAlertChecked(locationKey, checkedAtMs, watchIds) {
      parseInput(locationKeySchema, locationKey, 'location key');
      parseInput(epochMsSchema, checkedAtMs, 'checkedAtMs');
      const ids = watchIds === undefined ? undefined : parseInput(z.array(idSchema), watchIds, 'watch ids');
      if (ids !== undefined && ids.length === 0) return 0;
      let update = db.updateTable('watches').set({ last_alert_check_at_ms: checkedAtMs }).where('location_key', '=', locationKey).where('active', '=', 1);
      if (ids !== undefined) update = update.where('id', 'in', ids);
      const result = await update.executeTakeFirst();
      return Number(result.numUpdatedRows);
    },

    async markSummarySent(watchIds, localDate) {
      const ids = parseInput(z.array(idSchema), watchIds, 'watch ids');
      const date = parseInput(localDateSchema, localDate, 'summary local date');
      if (ids.length === 0) return 0;
      const result = await db
        .updateTable('watches')
        .set({ last_summary_local_date: date })
        .where('id', 'in', ids)
        .executeTakeFirst();
      return Number(result.numUpdatedRows);
    },
  };
}
