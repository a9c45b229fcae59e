/**
 * The store's public API: what the router, the scheduler and the outbox sender may ask of it.
 *
 * Conventions
 * - Times are epoch milliseconds (`...AtMs`, `nowMs`); durations are milliseconds (`leaseMs`).
 *   Callers pass `nowMs` so tests and the demo's fast clock decide what "now" is.
 * - Local dates are `YYYY-MM-DD`; local times of day are `HH:MM` (24 h).
 * - Expected refusals (a place name already taken, a duplicate crossing) are returned as values.
 *   Input that breaks the contract (latitude 123, an empty rule id) throws a `StoreError` with
 *   code 'invalid-input' and a message naming the field, and writes nothing.
 * - Every write that touches more than one row runs in one transaction.
 * - SQLite and PostgreSQL behave the same through this API; the only difference is that the
 *   claim queries lock with `FOR UPDATE SKIP LOCKED` on PostgreSQL.
 */
import type { ChannelTarget } from '../delivery/channelPoster.ts';
import type { Platform } from '../router/routerTypes.ts';

export type { ChannelTarget, Platform };

export type UnitSystem = 'metric' | 'us';

// ---------------------------------------------------------------- channels

export interface Channel {
  /** Our own id for the channel; other tables refer to it. */
  id: string;
  platform: Platform;
  teamId: string;
  channelId: string;
  unitSystem: UnitSystem;
  /** Morning summary local time, `HH:MM`; null when summaries are off. */
  summaryLocalTime: string | null;
  /** False once the channel is gone or removed the bot. Channels are never deleted. */
  active: boolean;
  createdAtMs: number;
  updatedAtMs: number;
}

export interface ChannelDefaults {
  unitSystem: UnitSystem;
  summaryLocalTime: string | null;
}

export interface ChannelRepository {
  /**
   * The channel for this target, created with `defaults` the first time it is seen. A channel that
   * was marked inactive and is used again (the bot was invited back) becomes active again; its old
   * watches stay inactive until someone adds them again.
   */
  ensureChannel(target: ChannelTarget, defaults: ChannelDefaults, nowMs: number): Promise<Channel>;
  /** The channel for this target, or null if it was never seen. */
  findChannel(target: ChannelTarget): Promise<Channel | null>;
  getChannelById(id: string): Promise<Channel | null>;
  setUnitSystem(channelRef: string, unitSystem: UnitSystem, nowMs: number): Promise<Channel>;
  /** `HH:MM` local time, or null to turn the morning summary off. */
  setSummaryLocalTime(channelRef: string, localTime: string | null, nowMs: number): Promise<Channel>;
  /**
   * The channel is gone or removed the bot: marks it inactive and all its watches inactive in one
   * transaction (nothing is deleted). Returns how many active watches were switched off, for the log.
   * Unknown target: returns `{ found: false }` and changes nothing.
   */
  markChannelInactive(target: ChannelTarget, nowMs: number): Promise<{ found: boolean; watchesDeactivated: number }>;
  /** Active channels with a morning summary time set. */
  listChannelsWithSummary(): Promise<Channel[]>;
}

// ---------------------------------------------------------------- saved places

export interface SavedPlace {
  id: string;
  channelRef: string;
  /** As the user typed it (trimmed). Unique per channel ignoring case. */
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  elevationM: number | null;
  timeZone: string | null;
  createdAtMs: number;
}

export interface NewSavedPlace {
  name: string;
  latitudeDeg: number;
  longitudeDeg: number;
  elevationM?: number | null;
  timeZone?: string | null;
}

export type SavePlaceResult =
  | { ok: true; place: SavedPlace }
  | { ok: false; reason: 'name-taken'; existing: SavedPlace; message: string };

export interface PlaceRepository {
  /** Saves a new place; a name already used in the channel (any case) is refused, not replaced. */
  savePlace(channelRef: string, place: NewSavedPlace, nowMs: number): Promise<SavePlaceResult>;
  /** Case-insensitive lookup by name. */
  findPlace(channelRef: string, name: string): Promise<SavedPlace | null>;
  /** Places of a channel ordered by name. */
  listPlaces(channelRef: string): Promise<SavedPlace[]>;
  /** Removes a saved place; false when there was none. Watches keep their own copy of the point. */
  removePlace(channelRef: string, name: string): Promise<boolean>;
}

// ---------------------------------------------------------------- watches

export interface Watch {
  id: string;
  channelRef: string;
  /** `locationKeyOf(latitude, longitude)`: the same point gives the same key in every channel. */
  locationKey: string;
  /** The saved place's name when the watch was made from one; null for a bare lat/lon. */
  placeName: string | null;
  latitudeDeg: number;
  longitudeDeg: number;
  elevationM: number | null;
  timeZone: string | null;
  createdBy: string;
  createdAtMs: number;
  active: boolean;
  lastAlertCheckAtMs: number | null;
  /** Local date (`YYYY-MM-DD`) of the last morning summary sent for this watch. */
  lastSummaryLocalDate: string | null;
}

export interface NewWatch {
  placeName?: string | null;
  latitudeDeg: number;
  longitudeDeg: number;
  elevationM?: number | null;
  timeZone?: string | null;
  createdBy: string;
}

/** A watch with what the scheduler needs of its channel, so one query feeds a whole cycle. */
export interface WatchWithChannel extends Watch {
  channel: Channel;
}

export interface WatchRepository {
  /**
   * Starts watching a point from a channel. One watch per channel and location key: watching the
   * same point again reactivates the old watch (`created: false`) instead of adding a second one.
   */
  addWatch(channelRef: string, watch: NewWatch, nowMs: number): Promise<{ watch: Watch; created: boolean }>;
  /** Marks the watch inactive (never deletes it); false when there was no active watch there. */
  deactivateWatch(channelRef: string, locationKey: string): Promise<boolean>;
  listWatches(channelRef: string, options?: { includeInactive?: boolean }): Promise<Watch[]>;
  /** Every active watch in every active channel, with its channel. */
  listActiveWatchesWithChannel(): Promise<WatchWithChannel[]>;
  /**
   * Records that the alert check ran for a location: the active watches of that point, or only
   * those of `watchIds` (the ones the check saw; a watch added meanwhile stays new).
   */
  markAlertChecked(locationKey: string, checkedAtMs: number, watchIds?: string[]): Promise<number>;
  /** Records the local date of the morning summary sent for these watches. */
  markSummarySent(watchIds: string[], localDate: string): Promise<number>;
}

// ---------------------------------------------------------------- rule overrides and mutes

export interface RuleOverride {
  channelRef: string;
  ruleId: string;
  thresholdValue: number;
  hysteresisValue: number | null;
  updatedAtMs: number;
}

/** A mute of one rule at one location key until a time. Location key `*` mutes it everywhere. */
export interface Mute {
  channelRef: string;
  ruleId: string;
  locationKey: string;
  untilMs: number;
  createdAtMs: number;
}

export const ALL_LOCATIONS = '*';

export interface RuleRepository {
  /** Sets (or replaces) a channel's threshold for a rule. */
  setOverride(channelRef: string, ruleId: string, thresholdValue: number, hysteresisValue: number | null, nowMs: number): Promise<RuleOverride>;
  clearOverride(channelRef: string, ruleId: string): Promise<boolean>;
  listOverrides(channelRef: string): Promise<RuleOverride[]>;
  /** Mutes a rule at a location (or `ALL_LOCATIONS`) until `untilMs`; a second mute replaces the first. */
  setMute(channelRef: string, ruleId: string, locationKey: string, untilMs: number, nowMs: number): Promise<Mute>;
  /**
   * Ends the channel's mutes of a rule now: at one location key, or at every key (with
   * `ALL_LOCATIONS` among them) when `locationKey` is null. Returns the mutes it ended, none when
   * none was in force. Ended mutes stay listed by `listMutesEndingAfter`.
   */
  endMutes(channelRef: string, ruleId: string, locationKey: string | null, nowMs: number): Promise<Mute[]>;
  /** Mutes still in force at `nowMs`. */
  listActiveMutes(channelRef: string, nowMs: number): Promise<Mute[]>;
  /** Mutes that end after `afterMs`: those still in force, and those that ended since then. */
  listMutesEndingAfter(channelRef: string, afterMs: number): Promise<Mute[]>;
  /** True when the rule is muted at this location (or everywhere) at `nowMs`. */
  isMuted(channelRef: string, ruleId: string, locationKey: string, nowMs: number): Promise<boolean>;
}

// ---------------------------------------------------------------- alert history and the outbox

export type CrossingDirection = 'up' | 'down';

/** What identifies one event: the same four values mean the same crossing, announced once. */
export interface CrossingIdentity {
  locationKey: string;
  ruleId: string;
  /** Local date (`YYYY-MM-DD`) of the forecast hour that crosses. */
  validLocalDay: string;
  direction: CrossingDirection;
}

export interface Crossing extends CrossingIdentity {
  /** Forecast valid time of the crossing, ISO 8601. */
  validTime: string;
  value: number;
  /** Effective mixed depth at the crossing (for coupling rules), metres; null when not relevant. */
  effectiveDepthM: number | null;
}

export interface AlertRecord extends Crossing {
  crossingKey: string;
  /** 0 for the first announcement, +1 for each update the caller judged material. */
  revision: number;
  firstAnnouncedAtMs: number;
  lastAnnouncedAtMs: number;
}

/** One message bound for one channel. `payload` must survive JSON (encode images yourself). */
export interface OutgoingMessage {
  target: ChannelTarget;
  payload: unknown;
}

export type RecordCrossingResult =
  | { status: 'recorded'; record: AlertRecord; outboxIds: string[] }
  /** The crossing key was already recorded: nothing was written. */
  | { status: 'duplicate'; existing: AlertRecord };

export type RecordUpdateResult =
  | { status: 'recorded'; record: AlertRecord; outboxIds: string[] }
  /** Someone else updated (or nobody recorded) this crossing since `expectedRevision`: nothing written. */
  | { status: 'stale'; current: AlertRecord | null };

export interface AlertHistoryRepository {
  findCrossing(identity: CrossingIdentity): Promise<AlertRecord | null>;
  /**
   * First announcement of a crossing: the history row and one outbox row per message, in ONE
   * transaction. Outbox dedupe key: `alert|<crossingKey>|r0|<platform>:<team>:<channel>`.
   * A crossing key already present writes nothing and returns 'duplicate'.
   */
  recordCrossingWithOutbox(crossing: Crossing, messages: OutgoingMessage[], nowMs: number): Promise<RecordCrossingResult>;
  /**
   * A material change to an announced crossing (the caller decides what is material): updates
   * the row to the new valid time/value/depth, bumps the revision and queues the messages, in one
   * transaction, only if the stored revision is still `expectedRevision`.
   */
  recordCrossingUpdate(crossing: Crossing, expectedRevision: number, messages: OutgoingMessage[], nowMs: number): Promise<RecordUpdateResult>;
  /**
   * A crossing already recorded, told to channels that did not hear it when it was announced (they
   * started watching later, or had the rule muted): one outbox row per message at the stored
   * revision, in one transaction; a row whose dedupe key is present (that channel was sent that
   * revision) is skipped. 'stale' when no such crossing is recorded.
   */
  queueRecordedCrossing(crossing: Crossing, messages: OutgoingMessage[], nowMs: number): Promise<RecordUpdateResult>;
}

export type OutboxKind = 'alert' | 'summary' | 'notice';

export interface OutboxItem {
  id: string;
  dedupeKey: string;
  kind: OutboxKind;
  target: ChannelTarget;
  payload: unknown;
  createdAtMs: number;
  /** How many times a sender has claimed it (a claim is an attempt, even if the sender died). */
  attempts: number;
  nextAttemptAtMs: number;
  claimedBy: string | null;
  claimExpiresAtMs: number | null;
  sentAtMs: number | null;
  platformMessageId: string | null;
  lastError: string | null;
  /** Set when the sender gave up (platform refused it, channel gone); such rows are not retried. */
  abandonedAtMs: number | null;
}

export interface NewOutboxItem {
  dedupeKey: string;
  kind: OutboxKind;
  target: ChannelTarget;
  payload: unknown;
  /** Defaults to `nowMs`. */
  nextAttemptAtMs?: number;
}

export interface SummaryToQueue {
  target: ChannelTarget;
  /** Local date the summary is for, `YYYY-MM-DD`. */
  localDate: string;
  /** What the summary covers (e.g. the channel ref); part of the dedupe key. */
  summaryKey: string;
  payload: unknown;
  /** Watches whose `lastSummaryLocalDate` becomes `localDate` in the same transaction. */
  watchIds: string[];
}

export interface OutboxStats {
  /** Rows neither sent nor abandoned. */
  queueDepth: number;
  /** Age of the oldest such row at `nowMs`; null when the queue is empty. */
  oldestUnsentAgeMs: number | null;
  /** The same, counting alerts only. */
  oldestUnsentAlertAgeMs: number | null;
  /** Unsent rows currently held under an unexpired lease. */
  claimed: number;
  abandoned: number;
}

export interface OutboxRepository {
  /** Queues messages; a dedupe key already present is skipped. One transaction for the batch. */
  enqueue(items: NewOutboxItem[], nowMs: number): Promise<{ insertedIds: string[]; duplicateKeys: string[] }>;
  /**
   * Queues a morning summary (dedupe key `summary|<summaryKey>|<platform>:<team>:<channel>|<date>`)
   * and marks its watches as summarised for that date, in one transaction. A duplicate key writes
   * nothing and returns `{ queued: false }`.
   */
  enqueueSummary(summary: SummaryToQueue, nowMs: number): Promise<{ queued: boolean; outboxId: string | null }>;
  /**
   * Claims up to `limit` rows that are due (`nextAttemptAtMs <= nowMs`), unsent, not abandoned, and
   * unclaimed or with an expired lease; sets `claimedBy = workerId`, lease until `nowMs + leaseMs`,
   * and counts an attempt. Oldest due first. Two workers never receive the same row while its lease
   * runs (PostgreSQL: `FOR UPDATE SKIP LOCKED`). A worker that dies leaves the row to be claimed
   * again once the lease expires.
   */
  claimDueOutbox(workerId: string, limit: number, leaseMs: number, nowMs: number): Promise<OutboxItem[]>;
  /** Extends a lease this worker holds; false when the worker no longer holds it. */
  renewClaim(id: string, workerId: string, leaseMs: number, nowMs: number): Promise<boolean>;
  /**
   * Marks a row sent. Accepted from any worker while the row is unsent (it was posted, whoever
   * holds the lease now); false when it was already sent or does not exist.
   */
  markSent(id: string, workerId: string, platformMessageId: string | null, nowMs: number): Promise<boolean>;
  /** The attempt failed and may be retried at `retryAtMs`; releases the claim. Only the holder may. */
  markFailed(id: string, workerId: string, retryAtMs: number, error: string): Promise<boolean>;
  /** The sender gives up on this row for good (refused, channel gone); releases the claim. */
  markAbandoned(id: string, workerId: string, error: string, nowMs: number): Promise<boolean>;
  /** Gives a claimed row back untouched (e.g. on shutdown) so any worker may take it now. */
  releaseClaim(id: string, workerId: string): Promise<boolean>;
  getItem(id: string): Promise<OutboxItem | null>;
  stats(nowMs: number): Promise<OutboxStats>;
  /** Deletes rows sent or abandoned before `beforeMs`; returns how many. */
  pruneFinished(beforeMs: number): Promise<number>;
}

// ---------------------------------------------------------------- scheduled job claims

export type JobClaimResult =
  /** This worker holds the job until the lease expires; do it, then `completeJob`. */
  | { status: 'claimed'; claimExpiresAtMs: number }
  /** Another worker holds an unexpired lease. */
  | { status: 'busy'; claimedBy: string; claimExpiresAtMs: number }
  /** The job was already done. */
  | { status: 'done'; doneAtMs: number };

/**
 * Exactly-one-replica scheduling. A job key names one unit of work, e.g.
 * `summary|<channelRef>|2031-07-14` or `alert-check|<locationKey>|<slot ISO time>`.
 */
export interface JobClaimRepository {
  claimJob(jobKey: string, workerId: string, leaseMs: number, nowMs: number): Promise<JobClaimResult>;
  /** Marks the job done; only the holder may. A done job is never claimed again. */
  completeJob(jobKey: string, workerId: string, nowMs: number): Promise<boolean>;
  /** Gives the job back unfinished so another worker may claim it at once. */
  releaseJob(jobKey: string, workerId: string): Promise<boolean>;
  /** Deletes records of jobs finished before `beforeMs`. */
  pruneDone(beforeMs: number): Promise<number>;
}

// ---------------------------------------------------------------- the store

export type StoreBackend = 'sqlite' | 'postgres';

export interface Store {
  readonly backend: StoreBackend;
  /** The SQLite file path, or the PostgreSQL URL without its password: safe to log. */
  readonly location: string;
  /** Migration versions applied when this store opened (empty when already current). */
  readonly migrationsApplied: string[];
  readonly channels: ChannelRepository;
  readonly places: PlaceRepository;
  readonly watches: WatchRepository;
  readonly rules: RuleRepository;
  readonly alerts: AlertHistoryRepository;
  readonly outbox: OutboxRepository;
  readonly jobs: JobClaimRepository;
  /** Closes the SQLite file or the PostgreSQL pool. */
  close(): Promise<void>;
}
