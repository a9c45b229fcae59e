import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import { DEMO_PLACES } from '../../src/forecast/demoPlaces.ts';
import { ForecastCache } from '../../src/forecast/forecastCache.ts';
import { OpenMeteoSource } from '../../src/forecast/openMeteoSource.ts';
import { OpenMeteoStandIn } from './openMeteoStandIn.ts';

// Requests are counted at the stand-in on 127.0.0.1; the data are the invented demo scenario.
const [bench, lookout] = DEMO_PLACES;
const WINDOW = { startTime: '2026-08-14T06:00:00Z', hours: 24 };
const HOUR_MS = 3_600_000;

let standIn: OpenMeteoStandIn;
beforeAll(async () => {
  // Some latency so that the concurrent requests really overlap on the wire.
  standIn = await OpenMeteoStandIn.start({ latencyMs: 50 });
});
afterAll(async () => {
  await standIn.close();
});
afterEach(() => {
  standIn.faultQueue.length = 0;
  standIn.persistentFaults = [];
});

function cachedSource(nowMs: () => number) {
  const upstream = new OpenMeteoSource({ baseUrl: standIn.baseUrl, timeoutMs: 5000, backoffBaseMs: 10, backoffMaxMs: 20 }, { nowMs });
  return new ForecastCache(upstream, { model: 'gfs_seamless', gridDeg: 0.1 }, nowMs);
}

describe('ForecastCache', () => {
  it('makes one upstream request for 50 concurrent requests for one place, then serves it from memory', async () => {
    let now = Date.UTC(2026, 7, 14, 12, 0);
    const cache = cachedSource(() => now);
    const before = standIn.forecastRequests;
    const channels = Array.from({ length: 50 }, (_, index) => ({ latitude: bench.latitude, longitude: bench.longitude, name: `channel ${index}` }));
    const results = await Promise.all(channels.map((location) => cache.fetchSeries(location, WINDOW)));
    expect(standIn.forecastRequests - before).toBe(1);
    expect(results.every((result) => result.ok)).toBe(true);
    expect(cache.stats).toEqual({ hits: 0, misses: 1, joined: 49 });
    // Each answer carries its own asker's name.
    expect(results.map((result) => (result.ok ? result.series.location.name : ''))).toEqual(channels.map((location) => location.name));

    // Later, and from a point in the same grid cell: still no new request.
    now += HOUR_MS;
    const neighbour = await cache.fetchSeries({ latitude: bench.latitude + 0.02, longitude: bench.longitude - 0.03 }, WINDOW);
    expect(neighbour.ok).toBe(true);
    if (neighbour.ok) expect(neighbour.series.profiles[0].latitude).toBeCloseTo(bench.latitude + 0.02, 6);
    expect(standIn.forecastRequests - before).toBe(1);
    expect(cache.stats.hits).toBe(1);

    // Another place is another key.
    await cache.fetchSeries({ latitude: lookout.latitude, longitude: lookout.longitude }, WINDOW);
    expect(standIn.forecastRequests - before).toBe(2);

    // When the next model run is due (GFS: 6-hourly, served ~5 h later), the entry has expired.
    now = Date.UTC(2026, 7, 14, 17, 30);
    await cache.fetchSeries({ latitude: bench.latitude, longitude: bench.longitude }, WINDOW);
    expect(standIn.forecastRequests - before).toBe(3);
  });

  it('sends the misses of a batch upstream together, once each', async () => {
    const cache = cachedSource(() => Date.UTC(2026, 7, 14, 12, 0));
    const before = standIn.forecastRequests;
    const spots = [0, 1, 2, 3, 4].map((index) => ({ latitude: 44 + index * 0.5, longitude: -116 }));
    const asked = [...spots, ...spots, ...spots];
    const results = await Promise.all([cache.fetchMany(asked, WINDOW), cache.fetchMany(spots, WINDOW)]);
    expect(results.flat().every((result) => result.ok)).toBe(true);
    expect(standIn.forecastRequests - before).toBe(1);
    expect(standIn.forecastUrls.at(-1)!.searchParams.get('latitude')!.split(',')).toHaveLength(5);
  });

  it('shares a failure with those who waited for it, but does not keep it', async () => {
    const cache = cachedSource(() => Date.UTC(2026, 7, 14, 12, 0));
    const before = standIn.forecastRequests;
    standIn.faultQueue.push([{ kind: 'status', status: 400 }]);
    const location = { latitude: 45.5, longitude: -117.5 };
    const failed = await Promise.all(Array.from({ length: 20 }, (_, index) => cache.fetchSeries({ ...location, name: `watcher ${index}` }, WINDOW)));
    expect(standIn.forecastRequests - before).toBe(1);
    expect(failed.every((result) => !result.ok)).toBe(true);
    const last = failed[19];
    if (!last.ok) expect(last.error.message).toContain('45.500, -117.500 (watcher 19)');
    const retried = await cache.fetchSeries(location, WINDOW);
    expect(retried.ok).toBe(true);
    expect(standIn.forecastRequests - before).toBe(2);
  });

  it('keys different windows apart', async () => {
    const cache = cachedSource(() => Date.UTC(2026, 7, 14, 12, 0));
    const before = standIn.forecastRequests;
    const location = { latitude: 46, longitude: -118 };
    await cache.fetchSeries(location, WINDOW);
    await cache.fetchSeries(location, { ...WINDOW, hours: 12 });
    await cache.fetchSeries(location, { startTime: '2026-08-14T06:30:00Z', hours: 24 });
    expect(standIn.forecastRequests - before).toBe(2);
  });

  it('lets go of a series once the provider announces a newer run, and asks once for it', async () => {
    const initialRun = standIn.runInitialisationSeconds;
    try {
      let now = Date.UTC(2026, 7, 14, 12, 0);
      const cache = cachedSource(() => now);
      const location = { latitude: 47, longitude: -119 };
      const before = standIn.forecastRequests;
      const runOf = async () => {
        const result = await cache.fetchSeries(location, WINDOW);
        if (!result.ok) throw new Error(result.error.message);
        return result.series.runTime;
      };
      standIn.runInitialisationSeconds = Date.UTC(2026, 7, 14, 6) / 1000;
      expect(await runOf()).toBe('2026-08-14T06:00:00Z');
      expect(await cache.latestRunTime()).toBe('2026-08-14T06:00:00Z');
      expect(await runOf()).toBe('2026-08-14T06:00:00Z');
      expect(standIn.forecastRequests - before).toBe(1);

      // The 12Z run is served early, before the update cycle says so (the slot of 06Z lasts to 17Z).
      standIn.runInitialisationSeconds = Date.UTC(2026, 7, 14, 12) / 1000;
      now += 11 * 60_000; // past the metadata's reuse period (10 min)
      expect(await runOf()).toBe('2026-08-14T06:00:00Z'); // not known yet: the entry still serves
      expect(standIn.forecastRequests - before).toBe(1);
      expect(await cache.latestRunTime()).toBe('2026-08-14T12:00:00Z');
      expect(await runOf()).toBe('2026-08-14T12:00:00Z');
      expect(await runOf()).toBe('2026-08-14T12:00:00Z');
      expect(standIn.forecastRequests - before).toBe(2);

      // A newer run announced, then the metadata stops answering: the series fetched again carries
      // a derived (older) run label, and is kept: no request on every lookup until the next announcement.
      standIn.runInitialisationSeconds = Date.UTC(2026, 7, 14, 18) / 1000;
      now += 11 * 60_000;
      expect(await cache.latestRunTime()).toBe('2026-08-14T18:00:00Z');
      standIn.metadataFails = true;
      now += 11 * 60_000;
      expect(await runOf()).toBe('2026-08-14T06:00:00Z');
      expect(await cache.latestRunTime()).toBeNull();
      await runOf();
      await runOf();
      expect(standIn.forecastRequests - before).toBe(3);
    } finally {
      standIn.runInitialisationSeconds = initialRun;
      standIn.metadataFails = false;
    }
  });

  it('refuses a bad config with the key named', () => {
    const upstream = new OpenMeteoSource({ baseUrl: standIn.baseUrl });
    expect(() => new ForecastCache(upstream, { model: 'gfs_seamless', gridDeg: -1 })).toThrow(/gridDeg/);
  });
});
