// Morning summaries through the scheduler's tick, two replicas on one store, a tick each minute
// across the fall-back and spring-forward days in America/Denver (invented place in Colorado).
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { DateTime } from 'luxon';
import { createScheduler } from '../../src/schedule/scheduler.ts';
import { ManualClock } from '../../src/schedule/clock.ts';
import { createSummaryCycle, realSummaryDeps } from '../../src/schedule/summaryCycle.ts';
import { payloadToMessage } from '../../src/delivery/outboxPayload.ts';
import type { Store } from '../../src/store/storeTypes.ts';
import { capturingLogger, openTempSqliteStore, slackTarget } from '../delivery/deliveryFixtures.ts';
import { channelWatching, countingDemoSource } from './scheduleFixtures.ts';

const JUNIPER_SADDLE = { name: 'Juniper Saddle (invented)', latitudeDeg: 39.52, longitudeDeg: -106.04, elevationM: 2900 };
const ZONE = 'America/Denver';

async function summaryRows(store: Store) {
  const rows = await store.outbox.claimDueOutbox('inspector', 10_000, 1, Date.UTC(2032, 0, 1));
  return rows.filter((r) => r.kind === 'summary');
}

describe('morning summary schedule', () => {
  let store: Store;
  beforeEach(async () => {
    ({ store } = await openTempSqliteStore('summary'));
  });
  afterEach(async () => {
    await store.close();
  });

  for (const [label, firstDay] of [['fall-back', '2031-11-02'], ['spring-forward', '2031-03-09']] as const) {
    it(`06:30 runs exactly once per day around ${label}, with two replicas ticking each minute`, async () => {
      const start = DateTime.fromISO(`${firstDay}T00:00`, { zone: ZONE });
      await channelWatching(store, slackTarget('C0JUNIPER'), [JUNIPER_SADDLE], start.toMillis() - 86_400_000, '06:30');
      const source = countingDemoSource();
      const clock = new ManualClock(start.toMillis());
      const schedulers = ['replica-1', 'replica-2'].map((workerId) =>
        createScheduler({
          clock,
          logger: capturingLogger().logger,
          steps: [{ name: 'summaries', run: createSummaryCycle({ store, deps: realSummaryDeps({ fetchSeries: source.fetchSeries }), workerId, logger: capturingLogger().logger }).run }],
        }),
      );
      const end = start.plus({ days: 2 }).toMillis();
      // Every minute from midnight to 09:00 local (the change and the summary both fall there), every 10 min after.
      for (let t = start.toMillis(); t < end; t += DateTime.fromMillis(t, { zone: ZONE }).hour < 9 ? 60_000 : 600_000) {
        clock.set(t);
        await Promise.all(schedulers.map((s) => s.tick(t)));
      }
      const rows = await summaryRows(store);
      const localTimes = rows.map((r) => DateTime.fromMillis(r.createdAtMs, { zone: ZONE }).toFormat('yyyy-MM-dd HH:mm'));
      expect(localTimes.sort()).toEqual([`${firstDay} 06:30`, `${start.plus({ days: 1 }).toISODate()} 06:30`]);
      expect(source.requests()).toBe(2);
      for (const row of rows) {
        const decoded = payloadToMessage(row.payload);
        expect(decoded.ok && decoded.message.inventedData).toBe(true);
      }
    }, 120_000);
  }
});
