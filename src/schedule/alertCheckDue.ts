/**
 * Which watched places need an alert check now, and the job key that lets exactly one replica do
 * each. Pure: the caller passes the watches (grouped by location key), now, and what it knows of
 * model runs.
 *
 * A place is due when a watch of it was never checked (a new watch is checked at the next tick,
 * also when other channels' watches of the place were checked before),
 * when the interval has passed since its oldest check, or when the source reports a model run
 * newer than the one its last check used. The job key names the state being superseded, so all
 * replicas that read the same state compete for the same key and the winner's `markAlertChecked`
 * moves everyone on to a new key.
 */
import { createHash } from 'node:crypto';
import type { WatchWithChannel } from '../store/storeTypes.ts';

export const DEFAULT_ALERT_CHECK_INTERVAL_MS = 30 * 60_000;

export type AlertCheckReason = 'never-checked' | 'interval' | 'new-model-run';

export interface DueAlertCheck {
  locationKey: string;
  watches: WatchWithChannel[];
  reason: AlertCheckReason;
  jobKey: string;
}

export function groupWatchesByLocation(watches: readonly WatchWithChannel[]): Map<string, WatchWithChannel[]> {
  const groups = new Map<string, WatchWithChannel[]>();
  for (const watch of watches) {
    if (!watch.active || !watch.channel.active) continue;
    const group = groups.get(watch.locationKey);
    if (group) group.push(watch);
    else groups.set(watch.locationKey, [watch]);
  }
  return groups;
}

/** The oldest check among a place's watches; null when any was never checked. */
export function oldestCheckAtMs(watches: readonly WatchWithChannel[]): number | null {
  let oldest = Number.POSITIVE_INFINITY;
  for (const watch of watches) {
    if (watch.lastAlertCheckAtMs === null) return null;
    oldest = Math.min(oldest, watch.lastAlertCheckAtMs);
  }
  return Number.isFinite(oldest) ? oldest : null;
}

/**
 * Names the watches not yet checked; the key adds the interval's number. A key of "never checked"
 * alone was the same for every watch added later: the first check completed it, and a second
 * channel's watch of the same place met that finished job for ever, so the place was never checked
 * again for anyone. With the watches named, a new one is checked at the next tick; with the
 * interval, a watch switched off and on again is too, at the latest one interval later.
 */
function neverCheckedDigest(watches: readonly WatchWithChannel[]): string {
  const ids = watches.filter((watch) => watch.lastAlertCheckAtMs === null).map((watch) => watch.id).sort();
  return createHash('sha256').update(ids.join(',')).digest('hex').slice(0, 24);
}

export interface AlertCheckDueInput {
  nowMs: number;
  groups: Map<string, WatchWithChannel[]>;
  intervalMs?: number;
  /** Run time (ISO) each place's last check used, as this process remembers it. */
  lastSeenRunTime: ReadonlyMap<string, string>;
  /** The newest run time the source reports, or null when it does not say. */
  latestRunTime: string | null;
  /** Places to leave alone until a time (their forecast fetch failed). */
  retryNotBeforeMs?: ReadonlyMap<string, number>;
}

export function dueAlertChecks(input: AlertCheckDueInput): DueAlertCheck[] {
  const intervalMs = input.intervalMs ?? DEFAULT_ALERT_CHECK_INTERVAL_MS;
  const due: DueAlertCheck[] = [];
  for (const [locationKey, watches] of input.groups) {
    const notBefore = input.retryNotBeforeMs?.get(locationKey);
    if (notBefore !== undefined && input.nowMs < notBefore) continue;
    const oldest = oldestCheckAtMs(watches);
    const seenRun = input.lastSeenRunTime.get(locationKey);
    const newRun =
      input.latestRunTime !== null && seenRun !== undefined && Date.parse(input.latestRunTime) > Date.parse(seenRun);
    let reason: AlertCheckReason | null = null;
    if (oldest === null) reason = 'never-checked';
    else if (newRun) reason = 'new-model-run';
    else if (input.nowMs - oldest >= intervalMs) reason = 'interval';
    if (reason === null) continue;
    const state = reason === 'new-model-run' ? `run:${input.latestRunTime}` : oldest === null ? `new:${neverCheckedDigest(watches)}:${Math.floor(input.nowMs / intervalMs)}` : `after:${oldest}`;
    due.push({ locationKey, watches, reason, jobKey: `alert-check|${locationKey}|${state}` });
  }
  return due;
}
