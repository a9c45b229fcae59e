import { setImmediate as nextTurn } from 'node:timers/promises';
import { DemoSource } from '../forecast/demoSource.ts';
import type { ForecastSeries } from '../forecast/forecastSource.ts';
import { assessSeries } from '../watch/assessSeries.ts';

/**
 * V8 compiles the stability core's loops to fast code only after it has run them a few times. In a
 * fresh process the first dozen assessments of a 48-hour series take 20–70 ms each, later ones
 * 4–7 ms (.scratch measurement on this 2-core machine, npm start's V8 flags). Without a warm-up the
 * first places asked about after a restart pay that, all at once when several crews ask together.
 * So at start the bot assesses invented series, built by the demo scenario outside every cache (no
 * network, nothing stored, no forecast cached for anyone).
 */
export const WARM_UP_ROUNDS = 16;

/**
 * Two invented points (not demo places): a valley floor and a ridge, so that both the deep
 * afternoon mixing and the shallow one take their branches. Kept away from every real request:
 * the series are built here and thrown away.
 */
const WARM_UP_POINTS = [
  { latitude: 44.9, longitude: -117.9, elevationM: 900, name: 'warm-up valley (invented)' },
  { latitude: 44.9, longitude: -117.8, elevationM: 2300, name: 'warm-up ridge (invented)' },
] as const;
/** A fixed window that starts in the morning, so its first afternoon (and its coupling) is inside it. */
const WARM_UP_WINDOW = { startTime: '2026-07-15T14:00:00Z', hours: 48 } as const;

export interface WarmUpResult {
  rounds: number;
  elapsedMs: number;
}

/** The invented series the warm-up assesses (exported for its test). */
export async function warmUpSeries(): Promise<ForecastSeries[]> {
  const source = new DemoSource();
  const series: ForecastSeries[] = [];
  for (const point of WARM_UP_POINTS) {
    const result = await source.fetchSeries(point, WARM_UP_WINDOW);
    if (!result.ok) throw new Error(`warm-up series: ${result.error.message}`);
    series.push(result.series);
  }
  return series;
}

/**
 * Runs `rounds` assessments, one per turn of the event loop, so that a command arriving meanwhile
 * waits for one assessment at most. Both kinds (with and without the full analyses) are run, as
 * lookups and detail views use both.
 */
export async function warmUpAssessment(rounds: number = WARM_UP_ROUNDS): Promise<WarmUpResult> {
  const startedMs = performance.now();
  const series = await warmUpSeries();
  for (let round = 0; round < rounds; round += 1) {
    await nextTurn();
    // Each point both ways: rounds 0,1 without the analyses, 2,3 with them, and so on.
    assessSeries(series[round % series.length], { keepAnalysis: Math.floor(round / series.length) % 2 === 1 });
  }
  return { rounds, elapsedMs: performance.now() - startedMs };
}
