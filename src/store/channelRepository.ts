/** Channels: created on first contact, settings changed in place, never deleted. */
import { z } from 'zod';
import type { StoreContext } from './storeContext.ts';
import type { Channel, ChannelRepository, ChannelTarget, UnitSystem } from './storeTypes.ts';
import { newId } from './newId.ts';
import { toChannel } from './rowMappers.ts';
import { StoreError } from './storeError.ts';
import {
  channelTargetSchema,
  epochMsSchema,
  idSchema,
  localTimeSchema,
  parseInput,
  unitSystemSchema,
} from './storeInputSchemas.ts';

const defaultsSchema = z.object({ unitSystem: unitSystemSchema, summaryLocalTime: localTimeSchema.nullable() });

export function createChannelRepository({ db }: StoreContext): ChannelRepository {
  async function findChannel(target: ChannelTarget): Promise<Channel | null> {
    const t = parseInput(channelTargetSchema, target, 'channel target');
    const row = await db
      .selectFrom('channels')
      .selectAll()
      .where('platform', '=', t.platform)
      .where('team_id', '=', t.teamId)
      .where('channel_id', '=', t.channelId)
      .executeTakeFirst();
    return row === undefined ? null : toChannel(row);
  }

  async function requireChannel(channelRef: string): Promise<Channel> {
    const row = await db.selectFrom('channels').selectAll().where('id', '=', channelRef).executeTakeFirst();
    if (row === undefined) throw new StoreError('invalid-input', `no channel with id ${channelRef}`);
    return toChannel(row);
  }

  return {
    findChannel,

    async ensureChannel(target, defaults, nowMs) {
      const t = parseInput(channelTargetSchema, target, 'channel target');
      const d = parseInput(defaultsSchema, defaults, 'channel defaults');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      // Nearly every command comes from a channel already saved and active: one read, no write.
      const known = await findChannel(t);
      if (known !== null && known.active) return known;
      // Insert-or-nothing, then read: safe when two replicas see a new channel at once.
      await db
        .insertInto('channels')
        .values({
          id: newId(),
          platform: t.platform,
          team_id: t.teamId,
          channel_id: t.channelId,
          unit_system: d.unitSystem,
          summary_local_time: d.summaryLocalTime,
          active: 1,
          created_at_ms: nowMs,
          updated_at_ms: nowMs,
        })
        .onConflict((oc) => oc.columns(['platform', 'team_id', 'channel_id']).doNothing())
        .execute();
      await db
        .updateTable('channels')
        .set({ active: 1, updated_at_ms: nowMs })
        .where('platform', '=', t.platform)
        .where('team_id', '=', t.teamId)
        .where('channel_id', '=', t.channelId)
        .where('active', '=', 0)
        .execute();
      const channel = await findChannel(t);
      if (channel === null) throw new Error(`channel ${t.platform}:${t.channelId} vanished right after it was saved`);
      return channel;
    },

    async getChannelById(id) {
      parseInput(idSchema, id, 'channel id');
      const row = await db.selectFrom('channels').selectAll().where('id', '=', id).executeTakeFirst();
      return row === undefined ? null : toChannel(row);
    },

    async setUnitSystem(channelRef, unitSystem: UnitSystem, nowMs) {
      const units = parseInput(unitSystemSchema, unitSystem, 'unit system');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      await requireChannel(channelRef);
      await db.updateTable('channels').set({ unit_system: units, updated_at_ms: nowMs }).where('id', '=', channelRef).execute();
      return requireChannel(channelRef);
    },

    async setSummaryLocalTime(channelRef, localTime, nowMs) {
      const time = parseInput(localTimeSchema.nullable(), localTime, 'morning summary time');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      await requireChannel(channelRef);
      await db
        .updateTable('channels')
        .set({ summary_local_time: time, updated_at_ms: nowMs })
        .where('id', '=', channelRef)
        .execute();
      return requireChannel(channelRef);
    },

    async markChannelInactive(target, nowMs) {
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const channel = await findChannel(target);
      if (channel === null) return { found: false, watchesDeactivated: 0 };
      return db.transaction().execute(async (trx) => {
        await trx.updateTable('channels').set({ active: 0, updated_at_ms: nowMs }).where('id', '=', channel.id).execute();
        const result = await trx
          .updateTable('watches')
          .set({ active: 0 })
          .where('channel_ref', '=', channel.id)
          .where('active', '=', 1)
          .executeTakeFirst();
        return { found: true, watchesDeactivated: Number(result.numUpdatedRows) };
      });
    },

    async listChannelsWithSummary() {
      const rows = await db
        .selectFrom('channels')
        .selectAll()
        .where('active', '=', 1)
        .where('summary_local_time', 'is not', null)
        .orderBy('id')
        .execute();
      return rows.map(toChannel);
    },
  };
}
