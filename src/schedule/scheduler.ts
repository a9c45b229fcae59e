/**
 * The minute tick. In real time node-cron fires it at the top of every minute; on an accelerated
 * clock (the demo) a timer fires it every 60 s of scenario time; tests call `tick(nowMs)` directly.
 * A tick that is still running when the next is due is not overlapped: the next one is skipped
 * (the work is idempotent and the following tick picks up whatever is still due).
 */
import cron, { type ScheduledTask } from 'node-cron';
import type { Logger } from 'pino';
import type { LapsewatchMetrics } from '../observability/lapsewatchMetrics.ts';
import type { Clock } from './clock.ts';

export interface TickStep {
  name: string;
  run(nowMs: number): Promise<unknown>;
}

export interface SchedulerOptions {
  clock: Clock;
  steps: TickStep[];
  logger: Logger;
  metrics?: LapsewatchMetrics;
  /** Called after each tick (e.g. to wake the outbox sender). */
  afterTick?: () => void;
}

export interface Scheduler {
  /** Runs every step once at `nowMs`; steps fail independently. Returns false if a tick was already running. */
  tick(nowMs: number): Promise<boolean>;
  start(): void;
  stop(): Promise<void>;
  /** Scenario time of the last finished tick, for the health check. */
  readonly lastTickAtMs: number | null;
}

export const TICK_INTERVAL_MS = 60_000;

export function createScheduler(options: SchedulerOptions): Scheduler {
  const { clock, steps, logger } = options;
  let running: Promise<void> | null = null;
  let lastTickAtMs: number | null = null;
  let task: ScheduledTask | null = null;
  let timer: NodeJS.Timeout | null = null;

  async function runSteps(nowMs: number): Promise<void> {
    for (const step of steps) {
      try {
        const result = await step.run(nowMs);
        logger.debug({ step: step.name, nowMs, result }, 'tick step done');
      } catch (error) {
        options.metrics?.schedulerTickErrors.inc({ step: step.name });
        logger.warn({ step: step.name, err: error instanceof Error ? error.message : String(error) }, 'tick step failed; next tick retries');
      }
    }
    lastTickAtMs = nowMs;
    options.afterTick?.();
  }

  async function tick(nowMs: number): Promise<boolean> {
    if (running) {
      logger.info({ nowMs }, 'previous tick still running; skipping this one');
      return false;
    }
    running = runSteps(nowMs);
    try {
      await running;
    } finally {
      running = null;
    }
    return true;
  }

  return {
    tick,
    start() {
      if (task || timer) return;
      const fire = (): void => void tick(clock.nowMs());
      if (clock.speedFactor === 1) {
        task = cron.schedule('* * * * *', fire, { name: 'lapsewatch-tick', noOverlap: true });
      } else {
        timer = setInterval(fire, Math.max(50, TICK_INTERVAL_MS / clock.speedFactor));
      }
      fire(); // a tick at start, so nothing waits up to a minute after a restart
    },
    async stop() {
      if (task) await task.stop();
      task = null;
      if (timer) clearInterval(timer);
      timer = null;
      await running;
    },
    get lastTickAtMs() {
      return lastTickAtMs;
    },
  };
}
