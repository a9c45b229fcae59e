/**
 * One alert-check cycle: the integration of forecast, watch, render and store, kept in this one
 * file so that names can be fixed in one place as those parts settle.
 *
 * For each watched place that is due (see alertCheckDue.ts) and that this replica wins the job for:
 *  1. fetch its forecast ONCE, however many channels watch it (watches are grouped by location key,
 *     and `deps.fetchSeries` is the forecast cache, so a later cycle on the same model run costs no
 *     request either);
 *  2. assess the series once;
 *  3. compute crossings once per distinct rule set (channels on the default rules share one);
 *  4. for each crossing, the channels that have not muted that rule there get one message each,
 *     written with the crossing record in one transaction (`recordCrossingWithOutbox`); a crossing
 *     already announced is re-announced only when `deps.isMaterialUpdate` says so
 *     (`recordCrossingUpdate`), and told as it stands (`queueRecordedCrossing`) to a channel whose
 *     mute of the rule there ended since the last check; a watch's first check (a channel that
 *     joins late included) gets all that stand in one message (`tellFirstCheck`);
 *  5. mark the watches it saw checked and complete the job.
 * A replica that dies mid-job leaves the job to another once its lease (60 s) runs out; rows it
 * wrote are whole transactions, so a re-run finds them and writes nothing twice.
 *
 * Payloads: the rendered Message with its images base64-encoded (outboxPayload.ts); an image too
 * large to queue is dropped with a note.
 */
import { createHash } from 'node:crypto';
import type { Logger } from 'pino';
import type { ForecastLocation, ForecastResult, ForecastSeries, ForecastWindow } from '../forecast/forecastSource.ts';
import type { Message } from '../render/message.ts';
import type { AlertRecord, Channel, Crossing, Mute, OutgoingMessage, Store, WatchWithChannel } from '../store/storeTypes.ts';
import { channelTargetKey, channelTargetOf, crossingKeyOf } from '../store/storeKeys.ts';
import { ALL_LOCATIONS } from '../store/storeTypes.ts';
import type { Rule, RuleId } from '../watch/rules/rule.ts';
import type { SeriesAssessment } from '../watch/seriesAssessment.ts';
import type { Crossing as WatchCrossing } from '../watch/crossings/crossing.ts';
import { assessSeries } from '../watch/assessSeries.ts';
import { findCrossings } from '../watch/crossings/findCrossings.ts';
import { isMaterialUpdate } from '../watch/crossings/isMaterialUpdate.ts';
import { forecastWindowFrom } from '../forecast/forecastWindowFrom.ts';
import { watchLocation } from './watchLocation.ts';
import { buildAlertMessage, formatAlertValue, type AlertContent, type AlertValueKind } from '../render/alertMessage.ts';
import { buildAlertDigestMessage } from '../render/alertDigestMessage.ts';
import { messageToPayload } from '../delivery/outboxPayload.ts';
import { dueAlertChecks, groupWatchesByLocation, type DueAlertCheck } from './alertCheckDue.ts';
import { mapWithConcurrency } from './mapWithConcurrency.ts';
import { channelRuleSet, type ChannelRuleSet } from './ruleSet.ts';
import { SEVERITY_RANK } from '../watch/rules/severityRank.ts';

export interface AlertRenderInput {
  crossing: WatchCrossing;
  /** The store's key for the place (also the mute button's place key). */
  locationKey: string;
  assessment: SeriesAssessment;
  channel: Channel;
  /** The channel's name for the place, or null for a bare point. */
  placeName: string | null;
  /** 0 for a first announcement, higher for a material update. */
  revision: number;
}

/** What the cycle needs from the forecast, watch and render parts (`realAlertCheckDeps` wires the real ones). */
export interface AlertCheckDeps {
  /** The forecast cache's fetch (single-flight, keyed by location, model and run). */
  fetchSeries(location: ForecastLocation, window: ForecastWindow): Promise<ForecastResult>;
  assess(series: ForecastSeries): SeriesAssessment;
  /** The configured default rules (config/rules.yaml). */
  defaultRules: readonly Rule[];
  findCrossings(current: SeriesAssessment, rules: readonly Rule[], previous?: SeriesAssessment): WatchCrossing[];
  isMaterialUpdate(previous: WatchCrossing, next: WatchCrossing): boolean;
  renderAlert(input: AlertRenderInput): Message;
  /** Several alerts of one place for one channel, in forecast order, as one message (a first check). */
  renderDigest(inputs: AlertRenderInput[]): Message;
  /** The newest model run the source knows of, when it can say without a full fetch. */
  latestRunTime?(): Promise<string | null>;
}

const VALUE_KIND: Record<RuleId, AlertValueKind> = {
  'mixing-reaches-dry-layer': 'height',
  'effective-mixing-height-above': 'height',
  'hdw-above': 'hdw',
  'c-haines-above': 'c-haines',
  'pft-below': 'pft',
  'mixed-layer-rh-below': 'relative-humidity',
  'transport-wind-above': 'wind-speed',
  'plume-cloud-possible': 'height',
};

/**
 * The headline rule's value is "mixing height minus the dry layer's base"; a crew reads heights, so
 * the alert shows the mixing height against the base, and how deep mixing runs once they meet.
 */
function headlineFigures(input: AlertRenderInput): Pick<AlertContent, 'value' | 'threshold' | 'thresholdLabel' | 'consequenceLine' | 'quantityLabel'> | null {
  const hour = input.assessment.hours.find((candidate) => candidate.validTime === input.crossing.validTime);
  const baseAglM = hour?.dryLayerAloftBaseAglM ?? hour?.coupledLayer?.baseAglM ?? null;
  if (!hour || baseAglM === null) return null;
  const effective = formatAlertValue(hour.effectiveMixingHeightAglM, 'height', input.channel.unitSystem);
  return {
    value: hour.mixingHeightAglM,
    threshold: baseAglM,
    quantityLabel: 'Mixing height',
    thresholdLabel: 'the base of the dry layer aloft',
    consequenceLine: `Once they meet, mixing runs to ${effective}.`,
  };
}

function byForecastOrder(a: WatchCrossing, b: WatchCrossing): number {
  return Date.parse(a.validTime) - Date.parse(b.validTime) || SEVERITY_RANK[a.severity] - SEVERITY_RANK[b.severity];
}

/** The alert content for one channel: its units, its name for the place. */
export function alertContentOf(input: AlertRenderInput): AlertContent {
  const { crossing, assessment } = input;
  const onsetLike = crossing.direction !== 'end';
  const above = crossing.comparison === 'at-or-above';
  const headline = crossing.ruleId === 'mixing-reaches-dry-layer' ? headlineFigures(input) : null;
  return {
    ...(headline ?? {}),
    ruleId: crossing.ruleId,
    ruleName: crossing.ruleName,
    severity: crossing.severity,
    placeName: input.placeName ?? assessment.location.name ?? `${assessment.location.latitude.toFixed(3)}, ${assessment.location.longitude.toFixed(3)}`,
    latitude: assessment.location.latitude,
    longitude: assessment.location.longitude,
    placeKey: input.locationKey,
    timeZone: assessment.timeZone,
    validTime: crossing.validTime,
    value: headline?.value ?? crossing.value ?? crossing.threshold,
    valueKind: VALUE_KIND[crossing.ruleId],
    threshold: headline?.threshold ?? crossing.threshold,
    direction: onsetLike === above ? 'rising' : 'falling',
    model: assessment.model,
    runTime: assessment.runTime,
    sourceName: assessment.sourceName,
    invented: assessment.invented,
  };
}

/** The real forecast-to-message chain: assessSeries, findCrossings, isMaterialUpdate, buildAlertMessage. */
export function realAlertCheckDeps(options: {
  fetchSeries: AlertCheckDeps['fetchSeries'];
  defaultRules: readonly Rule[];
  latestRunTime?: () => Promise<string | null>;
  footerLocalLine?: string;
}): AlertCheckDeps {
  return {
    fetchSeries: options.fetchSeries,
    // Said outright: a kept per-hour analysis is ~0.9 MB a place (vs ~44 kB without), and the
    // assessment is held until the next run for worsenings, so 200 places would hold ~170 MB.
    assess: (series) => assessSeries(series, { keepAnalysis: false }),
    defaultRules: options.defaultRules,
    findCrossings,
    isMaterialUpdate,
    renderAlert: (input) =>
      buildAlertMessage(alertContentOf(input), input.channel.unitSystem, {
        ...(options.footerLocalLine !== undefined ? { footerLocalLine: options.footerLocalLine } : {}),
      }),
    renderDigest: (inputs) =>
      buildAlertDigestMessage(inputs.map(alertContentOf), inputs[0]!.channel.unitSystem, {
        ...(options.footerLocalLine !== undefined ? { footerLocalLine: options.footerLocalLine } : {}),
      }),
    ...(options.latestRunTime ? { latestRunTime: options.latestRunTime } : {}),
  };
}

/** The store's view of a watch crossing: onset and worsened are the rule turning on ('up'). */
export function storeCrossingOf(found: WatchCrossing, locationKey: string, ruleKey: string): Crossing {
  return {
    locationKey,
    ruleId: ruleKey,
    validLocalDay: found.localDate,
    direction: found.direction === 'end' ? 'down' : 'up',
    validTime: found.validTime,
    // An end with no value (the dry layer is gone) records the threshold it fell back past.
    value: found.value ?? found.threshold,
    effectiveDepthM: found.episodePeakEffectiveMixingHeightAglM,
  };
}

/** The announced version of a crossing, as the watch module compares them. */
function announcedAsWatchCrossing(record: AlertRecord, next: WatchCrossing): WatchCrossing {
  return { ...next, validTime: record.validTime, value: record.value, episodePeakEffectiveMixingHeightAglM: record.effectiveDepthM ?? 0 };
}

export interface AlertCheckCycleOptions {
  store: Pick<Store, 'watches' | 'rules' | 'alerts' | 'jobs' | 'outbox'>;
  deps: AlertCheckDeps;
  workerId: string;
  logger: Logger;
  intervalMs?: number;
  forecastHours?: number;
  /** Places fetched at once. */
  fetchConcurrency?: number;
  jobLeaseMs?: number;
  /** After a failed fetch a place waits this long before its next try. */
  fetchFailureRetryMs?: number;
}

export interface AlertCheckReport {
  placesWatched: number;
  placesDue: number;
  placesChecked: number;
  jobsBusyOrDone: number;
  forecastRequests: number;
  forecastFailures: number;
  crossingsFound: number;
  crossingsRecorded: number;
  updatesRecorded: number;
  duplicates: number;
  /** Crossings already announced, told to channels that had not heard them (a mute of the rule ended). */
  toldStanding: number;
  /** Channels told a first check's alerts in one message (see `tellFirstCheck`). */
  digestsQueued: number;
  messagesQueued: number;
  mutedSkips: number;
  /** Ends of events never announced as onsets on the same local day: not told. */
  endsNotAnnounced: number;
  errors: number;
}

export interface AlertCheckCycle {
  run(nowMs: number): Promise<AlertCheckReport>;
}

function emptyReport(): AlertCheckReport {
  return {
    placesWatched: 0, placesDue: 0, placesChecked: 0, jobsBusyOrDone: 0, forecastRequests: 0, forecastFailures: 0,
    crossingsFound: 0, crossingsRecorded: 0, updatesRecorded: 0, duplicates: 0, toldStanding: 0, digestsQueued: 0, messagesQueued: 0, mutedSkips: 0, endsNotAnnounced: 0, errors: 0,
  };
}

interface ChannelContext {
  ruleSet: ChannelRuleSet;
  /** Mutes in force now. */
  mutes: Mute[];
  /** Mutes that ended within ENDED_MUTES_LOOKBACK_MS. */
  endedMutes: Mute[];
}

/** How far back an ended mute is looked for; longer than any pause between two checks of a place. */
const ENDED_MUTES_LOOKBACK_MS = 7 * 86_400_000;

function isMuted(mutes: readonly Mute[], ruleId: string, locationKey: string): boolean {
  return mutes.some((m) => m.ruleId === ruleId && (m.locationKey === locationKey || m.locationKey === ALL_LOCATIONS));
}

/** What a channel's alert about a crossing is rendered from. */
function alertInput(found: WatchCrossing, crossing: Crossing, watch: WatchWithChannel, assessment: SeriesAssessment, revision: number): AlertRenderInput {
  return { crossing: found, locationKey: crossing.locationKey, assessment, channel: watch.channel, placeName: watch.placeName, revision };
}

interface Member {
  watch: WatchWithChannel;
  mutes: Mute[];
  /** The channel's mutes that ended since this watch's last check. */
  endedSinceCheck: Mute[];
}

/** A short, order-free name for a set of crossings (the digest's share of its outbox key). */
function crossingsDigest(crossings: readonly Crossing[]): string {
  const keys = crossings.map((crossing) => crossingKeyOf(crossing)).sort();
  return createHash('sha256').update(keys.join('\n')).digest('hex').slice(0, 24);
}

export function createAlertCheckCycle(options: AlertCheckCycleOptions): AlertCheckCycle {
  const { store, deps, workerId, logger } = options;
  const forecastHours = options.forecastHours ?? 48;
  const jobLeaseMs = options.jobLeaseMs ?? 60_000;
  const fetchFailureRetryMs = options.fetchFailureRetryMs ?? 5 * 60_000;
  /** Model run each place's last check used (this process's memory; a restart checks on interval). */
  const lastSeenRunTime = new Map<string, string>();
  const retryNotBeforeMs = new Map<string, number>();
  /** Each place's last assessment (without per-hour analyses), for run-to-run worsenings. */
  const lastAssessment = new Map<string, SeriesAssessment>();

  async function channelContext(channelRef: string, nowMs: number, cache: Map<string, Promise<ChannelContext>>) {
    let pending = cache.get(channelRef);
    if (!pending) {
      pending = Promise.all([store.rules.listOverrides(channelRef), store.rules.listMutesEndingAfter(channelRef, Math.max(0, nowMs - ENDED_MUTES_LOOKBACK_MS))]).then(
        ([overrides, mutes]) => ({
          ruleSet: channelRuleSet(deps.defaultRules, overrides),
          mutes: mutes.filter((mute) => mute.untilMs > nowMs),
          endedMutes: mutes.filter((mute) => mute.untilMs <= nowMs),
        }),
      );
      cache.set(channelRef, pending);
    }
    return pending;
  }

  async function announce(
    found: WatchCrossing,
    crossing: Crossing,
    recipients: WatchWithChannel[],
    owed: WatchWithChannel[],
    assessment: SeriesAssessment,
    nowMs: number,
    report: AlertCheckReport,
  ): Promise<void> {
    const render = (revision: number, to: WatchWithChannel[] = recipients): OutgoingMessage[] =>
      to.map((watch) => ({ target: channelTargetOf(watch.channel), payload: messageToPayload(deps.renderAlert(alertInput(found, crossing, watch, assessment, revision))) }));
    const first = await store.alerts.recordCrossingWithOutbox(crossing, render(0), nowMs);
    if (first.status === 'recorded') {
      report.crossingsRecorded += 1;
      report.messagesQueued += first.outboxIds.length;
      logger.info(
        { locationKey: crossing.locationKey, ruleId: crossing.ruleId, validLocalDay: crossing.validLocalDay, direction: crossing.direction, channels: first.outboxIds.length },
        'crossing recorded and queued',
      );
      return;
    }
    const existing = first.existing;
    if (!deps.isMaterialUpdate(announcedAsWatchCrossing(existing, found), found)) {
      report.duplicates += 1;
      // For a channel that had not heard it (new watch, mute ended), it is its first announcement.
      if (owed.length === 0) return;
      const told = await store.alerts.queueRecordedCrossing(crossing, render(0, owed), nowMs);
      if (told.status === 'recorded' && told.outboxIds.length > 0) {
        report.toldStanding += 1;
        report.messagesQueued += told.outboxIds.length;
      }
      return;
    }
    const update = await store.alerts.recordCrossingUpdate(crossing, existing.revision, render(existing.revision + 1), nowMs);
    if (update.status === 'recorded') {
      report.updatesRecorded += 1;
      report.messagesQueued += update.outboxIds.length;
      logger.info({ locationKey: crossing.locationKey, ruleId: crossing.ruleId, revision: update.record.revision }, 'material update queued');
    } else {
      report.duplicates += 1; // another replica updated it first
    }
  }

  /**
   * A watch's first check: the alerts that stand for the place (recorded now or before), told to
   * its channel. One alert goes as itself (keyed per crossing and channel, as any alert); several go
   * as one digest, so that starting to watch does not bury the channel under a dozen posts. The
   * digest's key names the watch and the crossings it tells, as a single alert's names its crossing
   * and channel: a first check run again after a crash, in the same interval or a later one, queues
   * it once, and a watch switched off and on again is not told the same set of warnings twice.
   */
  async function tellFirstCheck(
    watch: WatchWithChannel,
    alerts: Array<{ found: WatchCrossing; crossing: Crossing }>,
    assessment: SeriesAssessment,
    nowMs: number,
    report: AlertCheckReport,
  ): Promise<void> {
    const target = channelTargetOf(watch.channel);
    const inputs = alerts.map(({ found, crossing }) => alertInput(found, crossing, watch, assessment, 0));
    if (alerts.length === 1) {
      const told = await store.alerts.queueRecordedCrossing(alerts[0]!.crossing, [{ target, payload: messageToPayload(deps.renderAlert(inputs[0]!)) }], nowMs);
      if (told.status === 'recorded') report.messagesQueued += told.outboxIds.length;
      return;
    }
    const queued = await store.outbox.enqueue(
      [{ dedupeKey: `alert-digest|${watch.locationKey}|${watch.id}|${crossingsDigest(alerts.map(({ crossing }) => crossing))}|${channelTargetKey(target)}`, kind: 'alert', target, payload: messageToPayload(deps.renderDigest(inputs)) }],
      nowMs,
    );
    report.digestsQueued += queued.insertedIds.length;
    report.messagesQueued += queued.insertedIds.length;
  }

  async function checkPlace(check: DueAlertCheck, nowMs: number, report: AlertCheckReport): Promise<void> {
    const { locationKey, watches } = check;
    report.forecastRequests += 1;
    const result = await deps.fetchSeries(watchLocation(watches[0]!), forecastWindowFrom(nowMs, forecastHours));
    if (!result.ok) {
      report.forecastFailures += 1;
      retryNotBeforeMs.set(locationKey, nowMs + fetchFailureRetryMs);
      // Never an all-clear: the place stays due and is tried again after the pause.
      logger.warn({ locationKey, kind: result.error.kind, reason: result.error.message }, 'forecast fetch failed; alert check postponed');
      throw new Error(`forecast for ${locationKey}: ${result.error.message}`);
    }
    retryNotBeforeMs.delete(locationKey);
    const assessment = deps.assess(result.series);
    const previous = lastAssessment.get(locationKey);
    const firstCheckAlerts = new Map<string, { watch: WatchWithChannel; alerts: Array<{ found: WatchCrossing; crossing: Crossing }> }>();
    const channelCache = new Map<string, Promise<ChannelContext>>();
    const contexts = await Promise.all(watches.map((w) => channelContext(w.channelRef, nowMs, channelCache)));

    // Channels with the same rules share one crossing computation.
    const bySignature = new Map<string, { ruleSet: ChannelRuleSet; members: Member[] }>();
    watches.forEach((watch, i) => {
      const { ruleSet, mutes, endedMutes } = contexts[i]!;
      const group = bySignature.get(ruleSet.signature) ?? { ruleSet, members: [] };
      const checkedAtMs = watch.lastAlertCheckAtMs;
      group.members.push({ watch, mutes, endedSinceCheck: checkedAtMs === null ? [] : endedMutes.filter((mute) => mute.untilMs > checkedAtMs) });
      bySignature.set(ruleSet.signature, group);
    });

    // A channel reads its alerts in forecast order, the most severe first within an hour; each is
    // queued a millisecond after the one before, so the outbox (oldest due first) keeps that order.
    let queuedAtMs = nowMs;
    for (const { ruleSet, members } of bySignature.values()) {
      const enabled = ruleSet.rules.filter((r) => r.enabled);
      // The previous run's assessment (same place, older run) lets the watch report worsenings.
      const earlier = previous && previous.runTime !== assessment.runTime ? previous : undefined;
      const foundInOrder = [...deps.findCrossings(assessment, enabled, earlier)].sort(byForecastOrder);
      for (const found of foundInOrder) {
        report.crossingsFound += 1;
        const listening = members.filter(({ mutes }) => !isMuted(mutes, found.ruleId, locationKey));
        report.mutedSkips += members.length - listening.length;
        // Nobody listening: record nothing, so the event can still be told when a mute ends.
        if (listening.length === 0) continue;
        const crossing = storeCrossingOf(found, locationKey, ruleSet.crossingRuleKey.get(found.ruleId) ?? found.ruleId);
        // Ends are not pushed: "the dry air has gone" read in a channel is an all-clear, and an
        // all-clear is the forecaster's call. Lookups and the morning summary show when a rule eases.
        if (crossing.direction === 'down') {
          report.endsNotAnnounced += 1;
          continue;
        }
        // A watch's first check: everything that stands goes to it in one message, after the loop.
        const firstCheck = listening.filter((m) => m.watch.lastAlertCheckAtMs === null);
        for (const member of firstCheck) {
          const pending = firstCheckAlerts.get(member.watch.id) ?? { watch: member.watch, alerts: [] };
          pending.alerts.push({ found, crossing });
          firstCheckAlerts.set(member.watch.id, pending);
        }
        const checkedBefore = listening.filter((m) => m.watch.lastAlertCheckAtMs !== null);
        // Checked before and not yet told what stands: its mute of this rule here ended since its
        // last check (alerts recorded meanwhile for other channels passed it by).
        const owed = checkedBefore.filter((m) => isMuted(m.endedSinceCheck, found.ruleId, locationKey)).map((m) => m.watch);
        // Recorded even when only first checks listen, so that a later check knows it was told.
        await announce(found, crossing, checkedBefore.map((m) => m.watch), owed, assessment, queuedAtMs++, report);
      }
    }
    for (const { watch, alerts } of firstCheckAlerts.values()) {
      await tellFirstCheck(watch, alerts.sort((a, b) => byForecastOrder(a.found, b.found)), assessment, queuedAtMs++, report);
    }
    lastSeenRunTime.set(locationKey, result.series.runTime);
    lastAssessment.set(locationKey, assessment);
  }

  async function run(nowMs: number): Promise<AlertCheckReport> {
    const report = emptyReport();
    const groups = groupWatchesByLocation(await store.watches.listActiveWatchesWithChannel());
    report.placesWatched = groups.size;
    let latestRunTime: string | null = null;
    if (deps.latestRunTime) {
      try {
        latestRunTime = await deps.latestRunTime();
      } catch (error) {
        logger.warn({ err: error instanceof Error ? error.message : String(error) }, 'could not learn the latest model run; checking on interval');
      }
    }
    const due = dueAlertChecks({ nowMs, groups, intervalMs: options.intervalMs, lastSeenRunTime, latestRunTime, retryNotBeforeMs });
    report.placesDue = due.length;
    await mapWithConcurrency(due, options.fetchConcurrency ?? 16, async (check) => {
      const claim = await store.jobs.claimJob(check.jobKey, workerId, jobLeaseMs, nowMs).catch((error: unknown) => {
        report.errors += 1;
        logger.warn({ jobKey: check.jobKey, err: String(error) }, 'could not claim an alert-check job');
        return null;
      });
      if (claim === null) return;
      if (claim.status !== 'claimed') {
        report.jobsBusyOrDone += 1;
        return;
      }
      try {
        await checkPlace(check, nowMs, report);
        // Only the watches this check saw: one added meanwhile stays new, and is told at the next tick.
        await store.watches.markAlertChecked(check.locationKey, nowMs, check.watches.map((watch) => watch.id));
        await store.jobs.completeJob(check.jobKey, workerId, nowMs);
        report.placesChecked += 1;
      } catch (error) {
        report.errors += 1;
        logger.warn({ locationKey: check.locationKey, err: error instanceof Error ? error.message : String(error) }, 'alert check failed; will retry');
        await store.jobs.releaseJob(check.jobKey, workerId).catch(() => false);
      }
    });
    return report;
  }

  return { run };
}
