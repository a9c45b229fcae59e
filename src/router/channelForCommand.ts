import type { Channel, ChannelDefaults, ChannelTarget, Store } from '../store/storeTypes.ts';

export interface ChannelForCommand {
  channel: Channel;
  /**
   * When the channel had been marked inactive (the platform refused the bot's posts there, and its
   * watches were switched off), the time it was; null otherwise. This command made it active again.
   */
  inactiveSinceMs: number | null;
}

/**
 * The channel a command acts for. A command that changes something saves the channel first
 * (created on first contact, made active again if the bot was removed and invited back). A
 * question writes nothing: a channel never seen before is answered with the defaults and stays
 * unsaved, so the first burst of lookups from new channels is not a burst of synchronous disk
 * writes on the thread that answers everyone. A channel that was inactive is made active again by
 * any command, and the caller is told so.
 */
export async function channelForCommand(store: Store, target: ChannelTarget, defaults: ChannelDefaults, nowMs: number, writes: boolean): Promise<ChannelForCommand> {
  const known = await store.channels.findChannel(target);
  if (known !== null && known.active) return { channel: known, inactiveSinceMs: null };
  if (known === null && !writes) return { channel: unsavedChannel(target, defaults, nowMs), inactiveSinceMs: null };
  const channel = await store.channels.ensureChannel(target, defaults, nowMs);
  return { channel, inactiveSinceMs: known === null ? null : known.updatedAtMs };
}

/**
 * A channel with no row yet. Its id matches no stored row, so reads by it (saved places,
 * watches, overrides) find nothing, which is the truth for a channel never seen before.
 */
function unsavedChannel(target: ChannelTarget, defaults: ChannelDefaults, nowMs: number): Channel {
  return {
    id: `unsaved:${target.platform}:${target.teamId}:${target.channelId}`,
    ...target,
    unitSystem: defaults.unitSystem,
    summaryLocalTime: defaults.summaryLocalTime,
    active: true,
    createdAtMs: nowMs,
    updatedAtMs: nowMs,
  };
}
