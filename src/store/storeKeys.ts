/**
 * The stable keys the store deduplicates on. Pure functions, so the scheduler and the sender can
 * build the same keys without asking the store.
 */
import type { ChannelTarget, CrossingIdentity } from './storeTypes.ts';

/** Decimal places a point is rounded to for its key: 1e-4 degree is about 11 m. */
const LOCATION_KEY_DECIMALS = 4;

/**
 * One key per forecast point: the same place watched from many channels is fetched once and
 * alerts are deduplicated across them. `-0` is written as `0` so the key never differs by sign.
 */
export function locationKeyOf(latitudeDeg: number, longitudeDeg: number): string {
  const fmt = (v: number): string => {
    const s = v.toFixed(LOCATION_KEY_DECIMALS);
    return Number(s) === 0 ? (0).toFixed(LOCATION_KEY_DECIMALS) : s;
  };
  return `${fmt(latitudeDeg)},${fmt(longitudeDeg)}`;
}

/** Where a stored channel's messages go: its platform, team and channel ids, and nothing more. */
export function channelTargetOf(channel: ChannelTarget): ChannelTarget {
  return { platform: channel.platform, teamId: channel.teamId, channelId: channel.channelId };
}

export function channelTargetKey(target: ChannelTarget): string {
  return `${target.platform}:${target.teamId}:${target.channelId}`;
}

export function crossingKeyOf(identity: CrossingIdentity): string {
  return `${identity.locationKey}|${identity.ruleId}|${identity.validLocalDay}|${identity.direction}`;
}

export function alertDedupeKey(crossingKey: string, revision: number, target: ChannelTarget): string {
  return `alert|${crossingKey}|r${revision}|${channelTargetKey(target)}`;
}

export function summaryDedupeKey(summaryKey: string, target: ChannelTarget, localDate: string): string {
  return `summary|${summaryKey}|${channelTargetKey(target)}|${localDate}`;
}

/** Place names compare without case or surrounding/multiple spaces. */
export function placeNameKey(name: string): string {
  return name.normalize('NFKC').trim().replace(/\s+/g, ' ').toLowerCase();
}
