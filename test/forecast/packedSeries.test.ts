// The forecast cache holds series packed; what comes out must be exactly what went in.
import { describe, expect, it } from 'vitest';
import { DemoSource } from '../../src/forecast/demoSource.ts';
import type { ForecastSeries } from '../../src/forecast/forecastSource.ts';
import { packSeries, unpackSeries } from '../../src/forecast/packedSeries.ts';

async function demoSeries(): Promise<ForecastSeries> {
  const result = await new DemoSource().fetchSeries({ latitude: 43.62, longitude: -115.48, name: 'Kestrel Bench ICP' }, { startTime: '2026-08-14T12:00:00Z', hours: 48 });
  if (!result.ok) throw new Error(result.error.message);
  return result.series;
}

describe('packSeries / unpackSeries', () => {
  it('gives back the same series, every number exact, notes and labels kept', async () => {
    const series = { ...(await demoSeries()), notes: ['a level dropped (invented note)'] };
    expect(unpackSeries(packSeries(series))).toEqual(series);
  });

  it('keeps profiles with different numbers of levels apart', async () => {
    const series = await demoSeries();
    const uneven = { ...series, profiles: series.profiles.map((profile, i) => (i === 3 ? { ...profile, levels: profile.levels.slice(1) } : profile)) };
    const back = unpackSeries(packSeries(uneven));
    expect(back.profiles[3]!.levels).toHaveLength(series.profiles[3]!.levels.length - 1);
    expect(back).toEqual(uneven);
  });

  it('keeps values that are not round in binary (0.1 steps) and extremes exactly', async () => {
    const series = await demoSeries();
    const odd = structuredClone(series);
    odd.profiles[0]!.levels[0]!.temperatureC = 0.1 + 0.2;
    odd.profiles[0]!.surface.dewpointC = -89.123456789;
    const back = unpackSeries(packSeries(odd));
    expect(back.profiles[0]!.levels[0]!.temperatureC).toBe(0.1 + 0.2);
    expect(back.profiles[0]!.surface.dewpointC).toBe(-89.123456789);
  });

  it('hands out fresh objects: changing one answer cannot change the next', async () => {
    const packed = packSeries(await demoSeries());
    const first = unpackSeries(packed);
    first.profiles[0]!.levels[0]!.temperatureC = 999;
    expect(unpackSeries(packed).profiles[0]!.levels[0]!.temperatureC).not.toBe(999);
  });
});

describe('the forecast cache with packed entries', () => {
  it('gives a place asked about again the very same series object, and a copy equal to it once it has left the unpacked few', async () => {
    const { ForecastCache } = await import('../../src/forecast/forecastCache.ts');
    const cache = new ForecastCache(new DemoSource(), { model: 'demo-scenario', maxUnpacked: 1 }, () => Date.parse('2026-08-14T12:00:00Z'));
    const window = { startTime: '2026-08-14T12:00:00Z', hours: 48 };
    const here = { latitude: 43.62, longitude: -115.48 };
    const there = { latitude: 44.5, longitude: -116.5 };
    const probe = await cache.fetchSeries(here, window);
    if (!probe.ok) throw new Error('demo source failed');
    // Asked as the answer names the place (with its elevation), so no relabelled copy is made.
    const place = probe.series.location;
    const first = await cache.fetchSeries(place, window);
    const missesAfterFirst = cache.stats.misses;
    const again = await cache.fetchSeries(place, window);
    if (!first.ok || !again.ok) throw new Error('demo source failed');
    expect(again.series).toBe(first.series);
    await cache.fetchSeries(there, window); // pushes `place` out of the unpacked one
    const later = await cache.fetchSeries(place, window);
    if (!later.ok) throw new Error('demo source failed');
    expect(later.series).not.toBe(first.series);
    expect(later.series).toEqual(first.series);
    expect(cache.stats.misses).toBe(missesAfterFirst + 1); // only `there` went upstream
  });
});
