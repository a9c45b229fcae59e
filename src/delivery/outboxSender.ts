/**
 * The outbox sender: claims due rows, posts each through its platform's ChannelPoster with the
 * row's dedupe key as the idempotency key, and records the outcome.
 *
 *   ok            → markSent
 *   rate-limited  → markFailed, retry at Retry-After (+ a little jitter); the channel is paused
 *                   until then so the rest of the batch does not hammer it
 *   retryable     → markFailed, retry after exponential backoff with full jitter (cap 5 min)
 *   channel-gone  → markAbandoned, channels.markChannelInactive, one log line naming the channel
 *                   and how many watches were switched off
 *   rejected      → markAbandoned with the platform's reason
 *
 * Too-long messages are the poster's job (it shortens and keeps the footer); the sender never sees
 * a "too long" refusal.
 *
 * THE DUPLICATE WINDOW. A post and its `markSent` are two systems and cannot be one transaction.
 * If the process dies after the platform accepted a post and before `markSent` committed, the row
 * is still unsent; its lease expires (`leaseMs`, default 30 s) and a sender posts it again.
 * - Discord: the idempotency key goes out as the message nonce with enforce_nonce, and Discord
 *   answers a repeated nonce from the same sender with the message it already created, within its
 *   nonce window of a few minutes. A re-post within `DISCORD_NONCE_WINDOW_MS` after the first post
 *   (lease 30 s + one poll) is therefore not shown twice. Only a restart that leaves the row
 *   unclaimed for longer than that window (every replica down for minutes exactly then) can show it
 *   twice.
 * - Slack: chat.postMessage takes no client-side key. Every row is posted at least once, and posted
 *   twice only when the process dies between Slack's 200 and the `markSent` commit. A `markSent`
 *   that fails while the process lives (database down) is kept in memory and retried, so a store
 *   outage alone does not cause a repeat.
 * Nothing else posts twice: a row is claimed under a lease by one worker at a time (SKIP LOCKED on
 * PostgreSQL), and a worker that has lost its lease does not post.
 */
import type { Logger } from 'pino';
import type { ChannelPoster, PostOutcome } from './channelPoster.ts';
import type { LapsewatchMetrics } from '../observability/lapsewatchMetrics.ts';
import type { OutboxItem, Platform, Store } from '../store/storeTypes.ts';
import { channelTargetKey } from '../store/storeKeys.ts';
import { ConcurrencyLimit } from './concurrencyLimit.ts';
import { payloadToMessage } from './outboxPayload.ts';
import { DEFAULT_BACKOFF, backoffDelayMs, rateLimitDelayMs, type BackoffPolicy } from './retryDelay.ts';

/** Discord's nonce de-duplication holds for "a few minutes"; we count on two. */
export const DISCORD_NONCE_WINDOW_MS = 2 * 60_000;

export const DEFAULT_LEASE_MS = 30_000;

export interface OutboxSenderOptions {
  store: Pick<Store, 'outbox' | 'channels'>;
  posters: ChannelPoster[];
  workerId: string;
  logger: Logger;
  metrics?: LapsewatchMetrics;
  /** Epoch ms; the scheduler's clock in the demo, Date.now otherwise. */
  nowMs?: () => number;
  /** Lease on a claimed row; another worker may take it after this. Keep it well under the nonce window. */
  leaseMs?: number;
  /** Rows claimed per pass. */
  batchSize?: number;
  /** Posts in flight at once, per platform. */
  concurrencyPerPlatform?: number;
  backoff?: BackoffPolicy;
  random?: () => number;
  /** Sleep between passes when nothing was due (real milliseconds). */
  idlePollMs?: number;
  /** A row for a platform with no poster here waits this long for a replica that has one. */
  noPosterRetryMs?: number;
}

export interface SendPassReport {
  claimed: number;
  sent: number;
  rateLimited: number;
  retried: number;
  abandoned: number;
  channelsGone: number;
  /** Rows skipped because this worker's lease ran out before it could post. */
  leaseLost: number;
  /** Rows posted whose markSent found them already marked by another worker (a duplicate post). */
  alreadyMarked: number;
  storeErrors: number;
}

export interface OutboxSender {
  /** One pass: retry pending marks, claim a batch, post it. Throws only if the claim itself fails. */
  sendOnce(): Promise<SendPassReport>;
  /** Runs passes until `stop`; store failures are logged and retried with a pause. */
  start(): void;
  /** Ends the loop after the pass in flight; claimed rows not yet posted are released. */
  stop(): Promise<void>;
  /** Starts the next pass now instead of after the idle sleep (e.g. right after an enqueue). */
  wake(): void;
  /** Posted rows whose markSent has not committed yet (kept and retried). */
  readonly pendingMarkCount: number;
}

function emptyReport(): SendPassReport {
  return { claimed: 0, sent: 0, rateLimited: 0, retried: 0, abandoned: 0, channelsGone: 0, leaseLost: 0, alreadyMarked: 0, storeErrors: 0 };
}

function errorText(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}

export function createOutboxSender(options: OutboxSenderOptions): OutboxSender {
  const { store, workerId, logger } = options;
  const nowMs = options.nowMs ?? Date.now;
  const leaseMs = options.leaseMs ?? DEFAULT_LEASE_MS;
  const batchSize = options.batchSize ?? 25;
  const random = options.random ?? Math.random;
  const backoff = options.backoff ?? DEFAULT_BACKOFF;
  const idlePollMs = options.idlePollMs ?? 1_000;
  const noPosterRetryMs = options.noPosterRetryMs ?? 60_000;
  const posters = new Map<Platform, ChannelPoster>(options.posters.map((p) => [p.platform, p]));
  const limits = new Map<Platform, ConcurrencyLimit>(
    options.posters.map((p) => [p.platform, new ConcurrencyLimit(options.concurrencyPerPlatform ?? 4)]),
  );
  /** Posted, not yet marked: retried at the start of every pass. */
  const pendingMarks = new Map<string, { platformMessageId: string | null; platform: Platform; kind: string }>();
  /** A channel that answered 429 is left alone until this time. */
  const pausedUntilMs = new Map<string, number>();
  let running = false;
  let stopping = false;
  let loopDone: Promise<void> | null = null;
  let wakeUp: (() => void) | null = null;

  async function flushPendingMarks(report: SendPassReport): Promise<void> {
    for (const [id, mark] of [...pendingMarks]) {
      try {
        const marked = await store.outbox.markSent(id, workerId, mark.platformMessageId, nowMs());
        pendingMarks.delete(id);
        if (marked) report.sent += 1;
        else report.alreadyMarked += 1;
        options.metrics?.postsSent.inc({ platform: mark.platform, kind: mark.kind });
      } catch {
        report.storeErrors += 1;
        return; // still down: try again next pass
      }
    }
  }

  async function recordOutcome(item: OutboxItem, outcome: PostOutcome, report: SendPassReport): Promise<void> {
    const platform = item.target.platform;
    const targetKey = channelTargetKey(item.target);
    const log = { outboxId: item.id, kind: item.kind, channel: targetKey, attempts: item.attempts };
    if (outcome.ok) {
      pendingMarks.set(item.id, { platformMessageId: outcome.platformMessageId, platform, kind: item.kind });
      try {
        const marked = await store.outbox.markSent(item.id, workerId, outcome.platformMessageId, nowMs());
        pendingMarks.delete(item.id);
        options.metrics?.postsSent.inc({ platform, kind: item.kind });
        if (marked) {
          report.sent += 1;
          logger.debug(log, 'posted');
        } else {
          report.alreadyMarked += 1;
          logger.warn(log, 'posted a row another worker had already marked sent');
        }
      } catch (error) {
        report.storeErrors += 1;
        logger.warn({ ...log, err: errorText(error) }, 'posted but could not mark sent yet; will retry the mark');
      }
      return;
    }
    options.metrics?.postErrors.inc({ platform, kind: outcome.kind });
    switch (outcome.kind) {
      case 'rate-limited': {
        const retryAtMs = nowMs() + rateLimitDelayMs(outcome.retryAfterMs, random);
        pausedUntilMs.set(targetKey, Math.max(pausedUntilMs.get(targetKey) ?? 0, retryAtMs));
        await store.outbox.markFailed(item.id, workerId, retryAtMs, outcome.reason);
        report.rateLimited += 1;
        logger.info({ ...log, retryAfterMs: outcome.retryAfterMs }, 'rate limited; waiting as asked');
        return;
      }
      case 'retryable': {
        const delayMs = backoffDelayMs(item.attempts, random, backoff);
        await store.outbox.markFailed(item.id, workerId, nowMs() + delayMs, outcome.reason);
        report.retried += 1;
        logger.info({ ...log, delayMs, reason: outcome.reason }, 'post failed; retrying with backoff');
        return;
      }
      case 'channel-gone': {
        await store.outbox.markAbandoned(item.id, workerId, outcome.reason, nowMs());
        const { found, watchesDeactivated } = await store.channels.markChannelInactive(item.target, nowMs());
        report.abandoned += 1;
        report.channelsGone += 1;
        logger.warn(
          { ...log, channelKnown: found, watchesDeactivated, reason: outcome.reason },
          `channel ${targetKey} is gone or removed the bot: marked inactive, ${watchesDeactivated} watch(es) deactivated`,
        );
        return;
      }
      case 'rejected': {
        await store.outbox.markAbandoned(item.id, workerId, outcome.reason, nowMs());
        report.abandoned += 1;
        logger.warn({ ...log, reason: outcome.reason }, 'platform refused the message; abandoned');
        return;
      }
    }
  }

  async function deliver(item: OutboxItem, claimedAtMs: number, report: SendPassReport): Promise<void> {
    const platform = item.target.platform;
    const poster = posters.get(platform);
    const limit = limits.get(platform);
    const targetKey = channelTargetKey(item.target);
    if (!poster || !limit) {
      await store.outbox.markFailed(item.id, workerId, nowMs() + noPosterRetryMs, `no ${platform} poster on worker ${workerId}`);
      report.retried += 1;
      logger.warn({ outboxId: item.id, platform }, 'no poster for this platform here; left for another worker');
      return;
    }
    const decoded = payloadToMessage(item.payload);
    if (!decoded.ok) {
      await store.outbox.markAbandoned(item.id, workerId, decoded.reason, nowMs());
      options.metrics?.postErrors.inc({ platform, kind: 'undecodable' });
      report.abandoned += 1;
      logger.error({ outboxId: item.id, reason: decoded.reason }, 'outbox payload unreadable; abandoned');
      return;
    }
    await limit.run(async () => {
      if (stopping) {
        await store.outbox.releaseClaim(item.id, workerId);
        return;
      }
      const pausedUntil = pausedUntilMs.get(targetKey) ?? 0;
      if (pausedUntil > nowMs()) {
        await store.outbox.markFailed(item.id, workerId, pausedUntil, 'channel rate limited; waiting');
        report.rateLimited += 1;
        return;
      }
      // Waiting for a slot may eat the lease; renew it, and never post on a lease another may hold.
      if (nowMs() - claimedAtMs > leaseMs / 2) {
        const renewed = await store.outbox.renewClaim(item.id, workerId, leaseMs, nowMs());
        if (!renewed) {
          report.leaseLost += 1;
          return;
        }
      }
      let outcome: PostOutcome;
      try {
        outcome = await poster.post(item.target, decoded.message, item.dedupeKey);
      } catch (error) {
        // The contract says posters never throw; if one does, treat it as a transient fault.
        outcome = { ok: false, kind: 'retryable', reason: `poster threw: ${errorText(error)}` };
      }
      await recordOutcome(item, outcome, report);
    });
  }

  async function sendOnce(): Promise<SendPassReport> {
    const report = emptyReport();
    await flushPendingMarks(report);
    const claimedAtMs = nowMs();
    const items = await store.outbox.claimDueOutbox(workerId, batchSize, leaseMs, claimedAtMs);
    report.claimed = items.length;
    await Promise.all(
      items.map((item) =>
        deliver(item, claimedAtMs, report).catch((error: unknown) => {
          // A store write failed (database restarting): the lease expires and the row comes back.
          report.storeErrors += 1;
          logger.warn({ outboxId: item.id, err: errorText(error) }, 'could not record a delivery outcome; the row will be retried');
        }),
      ),
    );
    if (items.length > 0) {
      logger.info({ workerId, ...report }, 'outbox pass');
    }
    return report;
  }

  function sleep(ms: number): Promise<void> {
    return new Promise((resolve) => {
      const timer = setTimeout(done, ms);
      function done(): void {
        clearTimeout(timer);
        wakeUp = null;
        resolve();
      }
      wakeUp = done;
    });
  }

  async function loop(): Promise<void> {
    let failuresInARow = 0;
    while (running) {
      try {
        const report = await sendOnce();
        failuresInARow = 0;
        if (report.claimed === 0 && running) await sleep(idlePollMs);
      } catch (error) {
        failuresInARow += 1;
        const pauseMs = Math.min(10_000, 250 * 2 ** Math.min(failuresInARow, 6));
        logger.warn({ workerId, err: errorText(error), pauseMs }, 'outbox claim failed (store unreachable?); retrying');
        if (running) await sleep(pauseMs);
      }
    }
  }

  return {
    sendOnce,
    start() {
      if (running) return;
      running = true;
      stopping = false;
      loopDone = loop();
    },
    async stop() {
      running = false;
      stopping = true;
      wakeUp?.();
      await loopDone;
      loopDone = null;
      stopping = false;
    },
    wake() {
      wakeUp?.();
    },
    get pendingMarkCount() {
      return pendingMarks.size;
    },
  };
}
