/**
 * Every Prometheus metric Lapsewatch exports, on one registry.
 *
 * Gauges that describe the outbox (queue depth, oldest unsent alert age) are read from the store
 * when /metrics is scraped, through `setOutboxStatsSource`, so they are never stale and no timer
 * polls the database between scrapes.
 */
import { Counter, Gauge, Histogram, Registry, collectDefaultMetrics } from 'prom-client';
import type { OutboxStats } from '../store/storeTypes.ts';

export type OutboxStatsSource = () => Promise<OutboxStats>;

export interface LapsewatchMetrics {
  readonly registry: Registry;
  readonly providerRequestSeconds: Histogram<'source' | 'outcome'>;
  readonly providerErrors: Counter<'source' | 'kind'>;
  readonly postsSent: Counter<'platform' | 'kind'>;
  readonly postErrors: Counter<'platform' | 'kind'>;
  readonly outboxQueueDepth: Gauge;
  readonly outboxOldestUnsentAlertAgeSeconds: Gauge;
  readonly outboxOldestUnsentAgeSeconds: Gauge;
  readonly alertCheckCycleSeconds: Histogram;
  readonly schedulerTickErrors: Counter<'step'>;
  /** Where the outbox gauges read from; until set they read 0. */
  setOutboxStatsSource(source: OutboxStatsSource | null): void;
}

export function createLapsewatchMetrics(options: { withProcessMetrics?: boolean } = {}): LapsewatchMetrics {
  const registry = new Registry();
  if (options.withProcessMetrics) collectDefaultMetrics({ register: registry, prefix: 'lapsewatch_' });
  let statsSource: OutboxStatsSource | null = null;
  // One store read per scrape serves all three gauges: the first collect() fetches, the others reuse it.
  let pendingStats: Promise<OutboxStats | null> | null = null;
  const readStats = (): Promise<OutboxStats | null> => {
    if (!pendingStats) {
      pendingStats = (statsSource ? statsSource().catch(() => null) : Promise.resolve(null)).finally(() => {
        setImmediate(() => {
          pendingStats = null;
        });
      });
    }
    return pendingStats;
  };

  const providerRequestSeconds = new Histogram({
    name: 'lapsewatch_forecast_request_duration_seconds',
    help: 'Time a forecast provider took to answer one request',
    labelNames: ['source', 'outcome'] as const,
    buckets: [0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30],
    registers: [registry],
  });
  const providerErrors = new Counter({
    name: 'lapsewatch_forecast_request_errors_total',
    help: 'Forecast provider requests that failed, by kind of failure',
    labelNames: ['source', 'kind'] as const,
    registers: [registry],
  });
  const postsSent = new Counter({
    name: 'lapsewatch_platform_posts_total',
    help: 'Messages posted to chat platforms, by platform and outbox kind',
    labelNames: ['platform', 'kind'] as const,
    registers: [registry],
  });
  const postErrors = new Counter({
    name: 'lapsewatch_platform_post_errors_total',
    help: 'Failed posts to chat platforms, by platform and outcome (rate-limited, retryable, channel-gone, rejected, undecodable)',
    labelNames: ['platform', 'kind'] as const,
    registers: [registry],
  });
  const outboxQueueDepth = new Gauge({
    name: 'lapsewatch_outbox_queue_depth',
    help: 'Outbox rows neither sent nor abandoned',
    registers: [registry],
    async collect() {
      const stats = await readStats();
      this.set(stats?.queueDepth ?? 0);
    },
  });
  const outboxOldestUnsentAlertAgeSeconds = new Gauge({
    name: 'lapsewatch_outbox_oldest_unsent_alert_age_seconds',
    help: 'Age of the oldest alert not yet posted (0 when none waits)',
    registers: [registry],
    async collect() {
      const stats = await readStats();
      this.set((stats?.oldestUnsentAlertAgeMs ?? 0) / 1000);
    },
  });
  const outboxOldestUnsentAgeSeconds = new Gauge({
    name: 'lapsewatch_outbox_oldest_unsent_age_seconds',
    help: 'Age of the oldest outbox row of any kind not yet posted (0 when none waits)',
    registers: [registry],
    async collect() {
      const stats = await readStats();
      this.set((stats?.oldestUnsentAgeMs ?? 0) / 1000);
    },
  });
  const alertCheckCycleSeconds = new Histogram({
    name: 'lapsewatch_alert_check_cycle_duration_seconds',
    help: 'Wall time of one alert-check cycle',
    buckets: [0.1, 0.5, 1, 2, 5, 10, 30, 60, 120],
    registers: [registry],
  });
  const schedulerTickErrors = new Counter({
    name: 'lapsewatch_scheduler_tick_errors_total',
    help: 'Scheduler steps that failed and will be tried again on a later tick',
    labelNames: ['step'] as const,
    registers: [registry],
  });

  return {
    registry,
    providerRequestSeconds,
    providerErrors,
    postsSent,
    postErrors,
    outboxQueueDepth,
    outboxOldestUnsentAlertAgeSeconds,
    outboxOldestUnsentAgeSeconds,
    alertCheckCycleSeconds,
    schedulerTickErrors,
    setOutboxStatsSource(source) {
      statsSource = source;
    },
  };
}
