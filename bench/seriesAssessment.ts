import { availableParallelism, loadavg } from 'node:os';
import { Worker, isMainThread, parentPort, workerData } from 'node:worker_threads';
import { analyzeProfile } from '../src/core/analyzeProfile.ts';
import { prepareProfile } from '../src/core/prepareProfile.ts';
import type { ForecastSeries } from '../src/forecast/forecastSource.ts';
import { assessSeries } from '../src/watch/assessSeries.ts';
import { findCrossings } from '../src/watch/crossings/findCrossings.ts';
import { formatConfigProblem } from '../src/watch/rules/configProblem.ts';
import { loadRulesFile } from '../src/watch/rules/loadRules.ts';
import type { Rule } from '../src/watch/rules/rule.ts';
import { LEVEL_HEIGHTS_AGL_M, syntheticSeries } from '../test/watch/support/syntheticSeries.ts';

/**
 * Speed of the series assessment, on invented data (test/watch/support/syntheticSeries.ts):
 * - one 48-hour, 37-level series: quality control, the full analysis of every hour, day summaries,
 *   then the crossings of every rule; median over repeats (goal: under 5 ms);
 * - 500 locations' series, on one thread and on two worker threads side by side, with the speed-up
 *   (goal: under 3 s). Series are built before the clock starts; only the assessment is timed.
 * Bounded: one pair of fleet runs always, more only within BUDGET_MS; about 25–50 s on a loaded
 * two-core machine.
 */
const HOURS = 48;
const LOCATIONS = 500;
const WORKERS = 2;
const SINGLE_SERIES_REPEATS = 300;
const FLEET_REPEATS = 3;
/** After this, no further pair of fleet runs starts (one pair always runs). */
const BUDGET_MS = 25_000;
const SINGLE_SERIES_BUDGET_MS = 4_000;
/** A fleet run stops here and projects the rest, so a loaded machine cannot stretch the bench past a minute. */
const FLEET_RUN_CAP_MS = 12_000;
const GOAL_SERIES_MS = 5;
const GOAL_FLEET_MS = 3000;

interface WorkerRequest {
  locationIndices: number[];
}

/** 500 invented points spread over a 13° × 17° box, so time zones and keys differ. */
function locationFor(index: number): { latitude: number; longitude: number } {
  return { latitude: 35 + (index % 25) * 0.52, longitude: -122 + Math.floor(index / 25) * 0.85 };
}

function seriesFor(index: number): ForecastSeries {
  const { latitude, longitude } = locationFor(index);
  // Vary the coupling hour so crossings differ between locations.
  return syntheticSeries({ hours: HOURS, latitude, longitude, couplingLocalHourByDay: [12 + (index % 4), index % 3 === 0 ? 15 : null] });
}

/** Assesses series in order until done or past the deadline; how many were done, and the crossings found. */
function assessAll(series: readonly ForecastSeries[], rules: readonly Rule[], deadlineMs = Infinity): { done: number; crossings: number } {
  let crossings = 0;
  let done = 0;
  for (const one of series) {
    if (performance.now() > deadlineMs) break;
    crossings += findCrossings(assessSeries(one), rules).length;
    done++;
  }
  return { done, crossings };
}

function osLoad(): string {
  return `${loadavg()[0].toFixed(1)} on ${availableParallelism()} cores`;
}

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const middle = Math.floor(sorted.length / 2);
  return sorted.length % 2 === 1 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

async function defaultRules(): Promise<Rule[]> {
  const loaded = await loadRulesFile();
  if (!loaded.ok) throw new Error(loaded.problems.map(formatConfigProblem).join('\n'));
  return loaded.rules;
}

/** Inside a worker: build its share of series, say ready, then assess on each "go" and report the time. */
async function workerMain(): Promise<void> {
  const port = parentPort!;
  const { locationIndices } = workerData as WorkerRequest;
  const rules = await defaultRules();
  const series = locationIndices.map(seriesFor);
  assessAll(series.slice(0, 5), rules); // warm the JIT like the main thread's warm-up
  port.on('message', (message: string) => {
    if (message === 'stop') {
      port.close();
      return;
    }
    const started = performance.now();
    const { done, crossings } = assessAll(series, rules, started + FLEET_RUN_CAP_MS);
    port.postMessage({ elapsedMs: performance.now() - started, done, crossings });
  });
  port.postMessage('ready');
}

/** Workers run this file through tsx, as the main thread does. */
function startWorker(locationIndices: number[]): Worker {
  const source = `
    const { workerData } = require('node:worker_threads');
    import(workerData.tsxApiUrl).then(({ register }) => { register(); return import(workerData.benchUrl); });
  `;
  return new Worker(source, {
    eval: true,
    workerData: { locationIndices, tsxApiUrl: import.meta.resolve('tsx/esm/api'), benchUrl: import.meta.url } satisfies WorkerRequest & Record<string, unknown>,
  });
}

function nextMessage<T>(worker: Worker): Promise<T> {
  return new Promise((resolve, reject) => {
    const onError = (error: Error): void => reject(error);
    worker.once('error', onError);
    worker.once('message', (message: T) => {
      worker.off('error', onError);
      resolve(message);
    });
  });
}

export async function runSeriesAssessmentBench(): Promise<void> {
  const benchStarted = performance.now();
  const overBudget = (): boolean => performance.now() - benchStarted > BUDGET_MS;
  const rules = await defaultRules();

  // One series.
  const one = seriesFor(0);
  for (let i = 0; i < 30; i++) findCrossings(assessSeries(one), rules);
  const assessOnlyMs: number[] = [];
  const withCrossingsMs: number[] = [];
  const singleSeriesStarted = performance.now();
  const cpuBefore = process.cpuUsage();
  for (let i = 0; i < SINGLE_SERIES_REPEATS && performance.now() - singleSeriesStarted < SINGLE_SERIES_BUDGET_MS; i++) {
    const started = performance.now();
    const assessment = assessSeries(one);
    const assessed = performance.now();
    findCrossings(assessment, rules);
    const done = performance.now();
    assessOnlyMs.push(assessed - started);
    withCrossingsMs.push(done - started);
  }
  const cpuUsed = process.cpuUsage(cpuBefore);
  // The core's share: quality control and the full analysis of the 48 profiles, nothing of the watch.
  const coreOnlyMs: number[] = [];
  for (let i = 0; i < Math.min(100, withCrossingsMs.length); i++) {
    const started = performance.now();
    for (const profile of one.profiles) {
      const prepared = prepareProfile(profile);
      if (prepared.ok) analyzeProfile(prepared.profile);
    }
    coreOnlyMs.push(performance.now() - started);
  }
  // CPU time is the figure to trust on a machine other work is loading: wall time there includes waiting for a core.
  const cpuMsPerSeries = (cpuUsed.user + cpuUsed.system) / 1000 / Math.max(1, withCrossingsMs.length);
  const seriesMs = median(withCrossingsMs);
  console.log(`series assessment (invented data): one ${HOURS}-hour series, ${LEVEL_HEIGHTS_AGL_M.length} levels above ground, ${rules.length} rules`);
  console.log(
    `  median over ${withCrossingsMs.length} runs: assess ${median(assessOnlyMs).toFixed(2)} ms, assess + crossings ${seriesMs.toFixed(2)} ms ` +
      `(goal < ${GOAL_SERIES_MS} ms: ${seriesMs < GOAL_SERIES_MS ? 'met' : 'NOT met'})`,
  );
  console.log(`  of which the core (prepareProfile + analyzeProfile of ${HOURS} profiles): ${median(coreOnlyMs).toFixed(2)} ms`);
  console.log(`  process CPU time per series (assess + crossings): ${cpuMsPerSeries.toFixed(2)} ms; load average now ${osLoad()}`);

  // 500 locations: on this thread, then on two worker threads with half each; pairs of runs while the budget lasts.
  const fleet = Array.from({ length: LOCATIONS }, (_, index) => seriesFor(index));
  const shares = Array.from({ length: WORKERS }, (_, worker) => Array.from({ length: LOCATIONS }, (_, index) => index).filter((index) => index % WORKERS === worker));
  const workers = shares.map(startWorker);
  const singleMs: number[] = [];
  const parallelMs: number[] = [];
  let crossingsSingle = 0;
  let crossingsParallel = 0;
  let doneSingle = 0;
  let doneParallel = 0;
  try {
    // Workers build their series before any timing starts, so the two kinds of run do not overlap.
    await Promise.all(workers.map((worker) => nextMessage<string>(worker)));
    for (let pair = 0; pair < FLEET_REPEATS && (pair === 0 || !overBudget()); pair++) {
      let started = performance.now();
      ({ done: doneSingle, crossings: crossingsSingle } = assessAll(fleet, rules, started + FLEET_RUN_CAP_MS));
      singleMs.push(performance.now() - started);
      started = performance.now();
      const replies = await Promise.all(
        workers.map((worker) => {
          const reply = nextMessage<{ elapsedMs: number; done: number; crossings: number }>(worker);
          worker.postMessage('go');
          return reply;
        }),
      );
      parallelMs.push(performance.now() - started);
      crossingsParallel = replies.reduce((sum, reply) => sum + reply.crossings, 0);
      doneParallel = replies.reduce((sum, reply) => sum + reply.done, 0);
    }
  } finally {
    for (const worker of workers) worker.postMessage('stop');
    await Promise.all(workers.map((worker) => worker.terminate()));
  }

  // A run cut off at the cap is projected to all locations from the share it finished, and says so.
  const projected = (ms: number, done: number): { ms: number; note: string } =>
    done >= LOCATIONS ? { ms, note: '' } : { ms: (ms * LOCATIONS) / Math.max(1, done), note: ` (cut off at ${FLEET_RUN_CAP_MS / 1000} s after ${done} of ${LOCATIONS}; projected)` };
  const single = projected(median(singleMs), doneSingle);
  const parallel = parallelMs.length > 0 ? projected(median(parallelMs), doneParallel) : { ms: Number.NaN, note: ' (not run)' };
  const verdict = (ms: number): string => (ms < GOAL_FLEET_MS ? 'met' : 'NOT met');
  console.log(`  ${LOCATIONS} locations' series (assess + crossings), median of ${singleMs.length} run(s) each, same series both ways; load average ${osLoad()}:`);
  console.log(`    one thread          ${(single.ms / 1000).toFixed(2)} s  (${(single.ms / LOCATIONS).toFixed(2)} ms a series; goal < ${GOAL_FLEET_MS / 1000} s: ${verdict(single.ms)})${single.note}`);
  console.log(`    ${WORKERS} worker threads    ${(parallel.ms / 1000).toFixed(2)} s  (goal < ${GOAL_FLEET_MS / 1000} s: ${verdict(parallel.ms)})${parallel.note}`);
  console.log(`    speed-up            ${(single.ms / parallel.ms).toFixed(2)}x  (crossings found: ${crossingsSingle} on one thread, ${crossingsParallel} in workers)`);
}

if (!isMainThread && (workerData as Partial<WorkerRequest> | null)?.locationIndices) void workerMain();
