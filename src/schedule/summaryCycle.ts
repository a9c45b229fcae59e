/**
 * Morning summaries. A channel with a summary time gets, each local day, one summary for each place
 * it watches, at that time of day in the place's own time zone (daylight-saving days included:
 * summaryOccurrence.ts). Each is a job claimed by one replica (`summary|<channel>|<place>|<date>`)
 * and queued with `enqueueSummary`, whose dedupe key (channel, place, date) and the watch's
 * `lastSummaryLocalDate`, written in the same transaction, make any second attempt a no-op.
 */
import type { Logger } from 'pino';
import type { ForecastResult, ForecastSeries, ForecastLocation, ForecastWindow } from '../forecast/forecastSource.ts';
import type { Message } from '../render/message.ts';
import type { Channel, Store, WatchWithChannel } from '../store/storeTypes.ts';
import { channelTargetOf } from '../store/storeKeys.ts';
import type { SeriesAssessment } from '../watch/seriesAssessment.ts';
import { assessSeries } from '../watch/assessSeries.ts';
import { timeZoneAt } from '../geo/timeZoneAt.ts';
import { forecastWindowFrom } from '../forecast/forecastWindowFrom.ts';
import { watchLocation } from './watchLocation.ts';
import { buildMorningSummary } from '../render/summaryMessage.ts';
import { buildMessage } from '../render/safetyFooter.ts';
import { messageToPayload } from '../delivery/outboxPayload.ts';
import { dueSummaryDate } from './summaryOccurrence.ts';

export interface SummaryRenderInput {
  channel: Channel;
  watch: WatchWithChannel;
  localDate: string;
  /** Null when the forecast could not be had; the summary says so instead of being skipped. */
  assessment: SeriesAssessment | null;
  failure: string | null;
}

export interface SummaryDeps {
  fetchSeries(location: ForecastLocation, window: ForecastWindow): Promise<ForecastResult>;
  assess(series: ForecastSeries): SeriesAssessment;
  renderSummary(input: SummaryRenderInput): Message;
}

/** The real chain: assessSeries and buildMorningSummary; a failed fetch becomes a plain notice. */
export function realSummaryDeps(options: { fetchSeries: SummaryDeps['fetchSeries']; footerLocalLine?: string }): SummaryDeps {
  const renderOptions = options.footerLocalLine !== undefined ? { footerLocalLine: options.footerLocalLine } : {};
  return {
    fetchSeries: options.fetchSeries,
    assess: (series) => assessSeries(series),
    renderSummary: ({ channel, watch, localDate, assessment, failure }) => {
      if (assessment) return buildMorningSummary(assessment, channel.unitSystem, { ...renderOptions, localDate });
      const place = watch.placeName ?? `${watch.latitudeDeg.toFixed(3)}, ${watch.longitudeDeg.toFixed(3)}`;
      return buildMessage(
        {
          kind: 'notice',
          title: `${place}: morning summary unavailable for ${localDate}`,
          sections: [{ lines: [`The forecast could not be fetched: ${failure ?? 'unknown cause'}. This is not an all-clear; ask again with the command.`] }],
        },
        options.footerLocalLine,
      );
    },
  };
}

export interface SummaryCycleOptions {
  store: Pick<Store, 'watches' | 'outbox' | 'jobs'>;
  deps: SummaryDeps;
  workerId: string;
  logger: Logger;
  forecastHours?: number;
  jobLeaseMs?: number;
  catchUpMs?: number;
}

export interface SummaryReport {
  due: number;
  queued: number;
  alreadyQueued: number;
  busyOrDone: number;
  errors: number;
}

export interface DueSummary {
  watch: WatchWithChannel;
  timeZone: string;
  localDate: string;
  summaryKey: string;
  jobKey: string;
}

export function zoneOf(watch: WatchWithChannel): string {
  return watch.timeZone ?? timeZoneAt(watch.latitudeDeg, watch.longitudeDeg);
}

/** Pure: which (channel, place) summaries are due at `nowMs`. */
export function dueSummaries(watches: readonly WatchWithChannel[], nowMs: number, catchUpMs?: number): DueSummary[] {
  const due: DueSummary[] = [];
  for (const watch of watches) {
    const localTime = watch.channel.summaryLocalTime;
    if (!watch.active || !watch.channel.active || localTime === null) continue;
    const timeZone = zoneOf(watch);
    const localDate = dueSummaryDate({ nowMs, localTime, timeZone, lastSummaryLocalDate: watch.lastSummaryLocalDate, catchUpMs });
    if (localDate === null) continue;
    const summaryKey = `${watch.channel.id}|${watch.locationKey}`;
    due.push({ watch, timeZone, localDate, summaryKey, jobKey: `summary|${summaryKey}|${localDate}` });
  }
  return due;
}

export function createSummaryCycle(options: SummaryCycleOptions): { run(nowMs: number): Promise<SummaryReport> } {
  const { store, deps, workerId, logger } = options;
  const forecastHours = options.forecastHours ?? 48;
  const jobLeaseMs = options.jobLeaseMs ?? 60_000;

  async function render(summary: DueSummary, nowMs: number, fetched: Map<string, Promise<ForecastResult>>): Promise<Message> {
    const { watch } = summary;
    // Channels that watch one place at the same summary time share one fetch within the tick.
    let pending = fetched.get(watch.locationKey);
    if (!pending) {
      pending = deps.fetchSeries(watchLocation(watch), forecastWindowFrom(nowMs, forecastHours));
      fetched.set(watch.locationKey, pending);
    }
    const result = await pending;
    const base = { channel: watch.channel, watch, localDate: summary.localDate };
    return result.ok
      ? deps.renderSummary({ ...base, assessment: deps.assess(result.series), failure: null })
      : deps.renderSummary({ ...base, assessment: null, failure: result.error.message });
  }

  async function run(nowMs: number): Promise<SummaryReport> {
    const report: SummaryReport = { due: 0, queued: 0, alreadyQueued: 0, busyOrDone: 0, errors: 0 };
    const due = dueSummaries(await store.watches.listActiveWatchesWithChannel(), nowMs, options.catchUpMs);
    report.due = due.length;
    const fetched = new Map<string, Promise<ForecastResult>>();
    for (const summary of due) {
      const claim = await store.jobs.claimJob(summary.jobKey, workerId, jobLeaseMs, nowMs);
      if (claim.status !== 'claimed') {
        report.busyOrDone += 1;
        continue;
      }
      try {
        const message = await render(summary, nowMs, fetched);
        const channel = summary.watch.channel;
        const { queued } = await store.outbox.enqueueSummary(
          {
            target: channelTargetOf(channel),
            localDate: summary.localDate,
            summaryKey: summary.summaryKey,
            payload: messageToPayload(message),
            watchIds: [summary.watch.id],
          },
          nowMs,
        );
        if (queued) report.queued += 1;
        else report.alreadyQueued += 1;
        await store.jobs.completeJob(summary.jobKey, workerId, nowMs);
        logger.info({ channelRef: channel.id, locationKey: summary.watch.locationKey, localDate: summary.localDate, queued }, 'morning summary');
      } catch (error) {
        report.errors += 1;
        logger.warn({ jobKey: summary.jobKey, err: error instanceof Error ? error.message : String(error) }, 'morning summary failed; will retry');
        await store.jobs.releaseJob(summary.jobKey, workerId).catch(() => false);
      }
    }
    return report;
  }
  return { run };
}
