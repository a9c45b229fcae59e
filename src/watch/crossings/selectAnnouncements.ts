import type { Crossing } from './crossing.ts';
import { isMaterialUpdate } from './isMaterialUpdate.ts';

export interface Announcement {
  crossing: Crossing;
  /** 'new': never announced under this key; 'update': announced before and changed materially. */
  reason: 'new' | 'update';
  /** The version announced before, for an update. */
  previous: Crossing | null;
}

/**
 * Which crossings to post, given the last announced version of each key. Pure; the caller stores
 * what it posts. A crossing whose key was announced and that did not change materially is left out.
 */
export function selectAnnouncements(crossings: readonly Crossing[], announced: ReadonlyMap<string, Crossing>): Announcement[] {
  const chosen: Announcement[] = [];
  for (const crossing of crossings) {
    const previous = announced.get(crossing.key);
    if (!previous) chosen.push({ crossing, reason: 'new', previous: null });
    else if (isMaterialUpdate(previous, crossing)) chosen.push({ crossing, reason: 'update', previous });
  }
  return chosen;
}
