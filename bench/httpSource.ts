import { DEMO_PLACES } from '../src/forecast/demoPlaces.ts';
import { ForecastCache } from '../src/forecast/forecastCache.ts';
import type { ForecastLocation, ForecastSource, ForecastWindow } from '../src/forecast/forecastSource.ts';
import { OpenMeteoSource } from '../src/forecast/openMeteoSource.ts';
import { OpenMeteoStandIn } from '../test/forecast/openMeteoStandIn.ts';

/**
 * Throughput of the Open-Meteo source against the local stand-in (127.0.0.1, 50 ms of latency per
 * request, invented demo data): 200 location fetches over 10 places, with the cache off and on, and
 * with the cache off but locations batched into one request each (fetchMany). Bounded to ~30 s.
 */
const LATENCY_MS = 50;
const FETCHES = 200;
const CONCURRENCY = 20;
const BATCH = 20;
const WINDOW: ForecastWindow = { startTime: '2026-08-14T06:00:00Z', hours: 48 };
const BUDGET_MS = 30_000;

interface Row {
  label: string;
  seconds: number;
  fetches: number;
  profiles: number;
  upstreamRequests: number;
}

function places(): ForecastLocation[] {
  const base = DEMO_PLACES.map((place) => ({ latitude: place.latitude, longitude: place.longitude }));
  const extra = Array.from({ length: 7 }, (_, index) => ({ latitude: 42 + index * 0.7, longitude: -114 - index * 0.9 }));
  return [...base, ...extra];
}

async function runConcurrently(source: ForecastSource, locations: ForecastLocation[]): Promise<number> {
  let next = 0;
  let profiles = 0;
  const worker = async () => {
    while (next < locations.length) {
      const location = locations[next++];
      const result = await source.fetchSeries(location, WINDOW);
      if (!result.ok) throw new Error(result.error.message);
      profiles += result.series.profiles.length;
    }
  };
  await Promise.all(Array.from({ length: CONCURRENCY }, worker));
  return profiles;
}

async function measure(label: string, standIn: OpenMeteoStandIn, run: () => Promise<number>): Promise<Row> {
  const before = standIn.forecastRequests;
  const started = performance.now();
  const profiles = await run();
  return { label, seconds: (performance.now() - started) / 1000, fetches: FETCHES, profiles, upstreamRequests: standIn.forecastRequests - before };
}

export async function runHttpSourceBench(): Promise<void> {
  const standIn = await OpenMeteoStandIn.start({ latencyMs: LATENCY_MS });
  const guard = setTimeout(() => {
    console.error(`httpSource bench: over its ${BUDGET_MS / 1000} s budget, stopping`);
    void standIn.close();
  }, BUDGET_MS);
  try {
    const distinct = places();
    const locations = Array.from({ length: FETCHES }, (_, index) => distinct[index % distinct.length]);
    const config = { baseUrl: standIn.baseUrl, timeoutMs: 10_000, backoffBaseMs: 50, backoffMaxMs: 200 };
    // Warm the stand-in's own memo so the figures measure the client, not the demo's generation.
    await new OpenMeteoSource(config).fetchMany(distinct, WINDOW);

    const rows: Row[] = [];
    rows.push(await measure(`cache off, ${CONCURRENCY} at a time`, standIn, () => runConcurrently(new OpenMeteoSource(config), locations)));
    rows.push(
      await measure(`cache on, ${CONCURRENCY} at a time`, standIn, () =>
        runConcurrently(new ForecastCache(new OpenMeteoSource(config), { model: 'gfs_seamless' }), locations),
      ),
    );
    rows.push(
      await measure(`cache off, fetchMany by ${BATCH}`, standIn, async () => {
        const source = new OpenMeteoSource({ ...config, maxLocationsPerRequest: BATCH });
        let profiles = 0;
        const batches = [];
        for (let start = 0; start < locations.length; start += BATCH) batches.push(locations.slice(start, start + BATCH));
        for (const results of await Promise.all(batches.map((batch) => source.fetchMany(batch, WINDOW)))) {
          for (const result of results) {
            if (!result.ok) throw new Error(result.error.message);
            profiles += result.series.profiles.length;
          }
        }
        return profiles;
      }),
    );

    console.log(`HTTP source against the local stand-in (${LATENCY_MS} ms latency per request, ${FETCHES} fetches of ${WINDOW.hours} h over ${distinct.length} places)`);
    console.log(['mode'.padEnd(30), 'seconds'.padStart(8), 'fetches/s'.padStart(10), 'profiles/s'.padStart(11), 'upstream requests'.padStart(18)].join(' '));
    for (const row of rows) {
      console.log(
        [
          row.label.padEnd(30),
          row.seconds.toFixed(2).padStart(8),
          (row.fetches / row.seconds).toFixed(0).padStart(10),
          (row.profiles / row.seconds).toFixed(0).padStart(11),
          String(row.upstreamRequests).padStart(18),
        ].join(' '),
      );
    }
  } finally {
    clearTimeout(guard);
    await standIn.close();
  }
}
