// A new model run seen at the provider makes a watched place due before the check interval, and the
// forecast cache lets go of the older run so the check reads the new one. The chain as the app
// builds it for the http source (buildForecastSource: cache, instrumentation, Open-Meteo source),
// against the Open-Meteo stand-in on 127.0.0.1 (invented demo data) and a real SQLite store.
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { buildForecastSource } from '../../src/app/buildForecastSource.ts';
import { parseAppConfig } from '../../src/config/appConfig.ts';
import { createAlertCheckCycle, realAlertCheckDeps } from '../../src/schedule/alertCheckCycle.ts';
import type { Store } from '../../src/store/storeTypes.ts';
import { capturingLogger, openTempSqliteStore, slackTarget } from '../delivery/deliveryFixtures.ts';
import { OpenMeteoStandIn } from '../forecast/openMeteoStandIn.ts';
import { KESTREL_BENCH, channelWatching, shippedRules } from './scheduleFixtures.ts';

const MORNING = Date.UTC(2026, 7, 14, 14, 0); // 08:00 MDT on an invented August morning
const MINUTE_MS = 60_000;

let standIn: OpenMeteoStandIn;
let store: Store;
beforeAll(async () => {
  standIn = await OpenMeteoStandIn.start();
});
afterAll(async () => {
  await standIn.close();
});
beforeEach(async () => {
  ({ store } = await openTempSqliteStore('newrun'));
});
afterEach(async () => {
  await store.close();
});

describe('a new model run between checks', () => {
  it('makes the watched place due at once, and the check reads the new run', async () => {
    let now = MORNING;
    const config = parseAppConfig({ forecast: { source: 'http', openMeteo: { baseUrl: standIn.baseUrl, timeoutMs: 5_000 } } }, 'test');
    if (!config.ok) throw new Error(config.error);
    const { source } = buildForecastSource(config.config.forecast, () => now);
    expect(source.latestRunTime).toBeDefined();
    const cycle = createAlertCheckCycle({
      store,
      deps: realAlertCheckDeps({ fetchSeries: (location, window) => source.fetchSeries(location, window), defaultRules: shippedRules(), latestRunTime: () => source.latestRunTime!() }),
      workerId: 'w',
      logger: capturingLogger().logger,
      intervalMs: 30 * MINUTE_MS,
    });
    await channelWatching(store, slackTarget('C0AAA'), [KESTREL_BENCH], MORNING);
    standIn.runInitialisationSeconds = Date.UTC(2026, 7, 14, 6) / 1000;
    const before = standIn.forecastRequests;

    expect((await cycle.run(now)).placesChecked).toBe(1);
    expect(standIn.forecastRequests - before).toBe(1);
    now += 5 * MINUTE_MS;
    expect((await cycle.run(now)).placesDue).toBe(0);

    // The 12Z run is served. Once the metadata is asked again (it is reused for 10 minutes), the
    // place is due, 12 minutes after its check instead of 30, and the check fetches the new run.
    standIn.runInitialisationSeconds = Date.UTC(2026, 7, 14, 12) / 1000;
    now += 7 * MINUTE_MS;
    const onNewRun = await cycle.run(now);
    expect(onNewRun.placesDue).toBe(1);
    expect(onNewRun.placesChecked).toBe(1);
    expect(standIn.forecastRequests - before).toBe(2);
    now += 2 * MINUTE_MS;
    expect((await cycle.run(now)).placesDue).toBe(0);
    expect(standIn.forecastRequests - before).toBe(2);
  });
});
