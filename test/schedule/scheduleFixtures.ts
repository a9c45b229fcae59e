// The real forecast-to-outbox chain for schedule tests: the invented demo source behind a counter,
// the shipped rules, and helpers to watch places from channels.
import fs from 'node:fs';
import { DemoSource } from '../../src/forecast/demoSource.ts';
import type { ForecastLocation, ForecastResult, ForecastWindow } from '../../src/forecast/forecastSource.ts';
import { DEFAULT_RULES_PATH, rulesFromYaml } from '../../src/watch/rules/loadRules.ts';
import type { Rule } from '../../src/watch/rules/rule.ts';
import type { Channel, ChannelTarget, Store } from '../../src/store/storeTypes.ts';

export function shippedRules(): Rule[] {
  const result = rulesFromYaml(fs.readFileSync(DEFAULT_RULES_PATH, 'utf8'), DEFAULT_RULES_PATH);
  if (!result.ok) throw new Error(`shipped rules do not load: ${JSON.stringify(result.problems)}`);
  return result.rules;
}

/** The demo source (invented data), counting the requests made of it per location. */
export function countingDemoSource(): {
  fetchSeries: (location: ForecastLocation, window: ForecastWindow) => Promise<ForecastResult>;
  requests: () => number;
  requestsFor: (latitude: number, longitude: number) => number;
} {
  const source = new DemoSource();
  const seen: string[] = [];
  return {
    fetchSeries: async (location, window) => {
      seen.push(`${location.latitude},${location.longitude}`);
      return source.fetchSeries(location, window);
    },
    requests: () => seen.length,
    requestsFor: (latitude, longitude) => seen.filter((k) => k === `${latitude},${longitude}`).length,
  };
}

/** Invented places of the demo scenario (see src/forecast/demoPlaces.ts). */
export const KESTREL_BENCH = { name: 'Kestrel Bench ICP', latitudeDeg: 43.62, longitudeDeg: -115.48, elevationM: 1450 };
export const ALDER_SINK = { name: 'Alder Sink', latitudeDeg: 43.49, longitudeDeg: -115.66, elevationM: 960 };

export async function channelWatching(
  store: Store,
  target: ChannelTarget,
  places: Array<typeof KESTREL_BENCH>,
  nowMs: number,
  summaryLocalTime: string | null = null,
): Promise<Channel> {
  const channel = await store.channels.ensureChannel(target, { unitSystem: 'us', summaryLocalTime }, nowMs);
  for (const place of places) {
    await store.watches.addWatch(
      channel.id,
      { placeName: place.name, latitudeDeg: place.latitudeDeg, longitudeDeg: place.longitudeDeg, elevationM: place.elevationM, createdBy: 'U0INVENTED' },
      nowMs,
    );
  }
  return channel;
}
