import { expect, it } from 'vitest';
import { alertDedupeKey, crossingKeyOf, summaryDedupeKey } from '../../src/store/storeKeys.ts';
import type { ChannelTarget, Crossing, OutgoingMessage } from '../../src/store/storeTypes.ts';
import { describeEachBackend, type BackendHarness } from './storeTestBackends.ts';

// An invented crossing at an invented place.
const crossing: Crossing = {
  locationKey: '44.0500,-121.3100',
  ruleId: 'coupling-dry-layer',
  validLocalDay: '2031-07-14',
  direction: 'up',
  validTime: '2031-07-14T21:00:00Z',
  value: 3150,
  effectiveDepthM: 3150,
};
const slackA: ChannelTarget = { platform: 'slack', teamId: 'T-INVENTED', channelId: 'C-a' };
const discordB: ChannelTarget = { platform: 'discord', teamId: 'G-INVENTED', channelId: 'C-b' };
const messages: OutgoingMessage[] = [
  { target: slackA, payload: { title: 'Mixed layer reaches the dry layer aloft', hour: '14:00' } },
  { target: discordB, payload: { title: 'Mixed layer reaches the dry layer aloft', hour: '14:00' } },
];

async function counts(h: BackendHarness, url: string): Promise<{ history: number; outbox: number }> {
  const [history] = await h.rawQuery<{ n: number | string }>(url, 'SELECT count(*) AS n FROM alert_history');
  const [outbox] = await h.rawQuery<{ n: number | string }>(url, 'SELECT count(*) AS n FROM outbox');
  return { history: Number(history?.n), outbox: Number(outbox?.n) };
}

/** A real fault inside the database: the outbox insert for channel C-boom raises an error. */
function failingTriggerSql(backend: BackendHarness['backend']): string {
  if (backend === 'sqlite') {
    return `CREATE TRIGGER fail_outbox BEFORE INSERT ON outbox WHEN NEW.channel_id = 'C-boom'
            BEGIN SELECT RAISE(ABORT, 'injected failure'); END;`;
  }
  return `CREATE FUNCTION fail_outbox() RETURNS trigger AS $$
          BEGIN IF NEW.channel_id = 'C-boom' THEN RAISE EXCEPTION 'injected failure'; END IF; RETURN NEW; END
          $$ LANGUAGE plpgsql;
          CREATE TRIGGER fail_outbox BEFORE INSERT ON outbox FOR EACH ROW EXECUTE FUNCTION fail_outbox();`;
}

describeEachBackend('alert history with the outbox', (h) => {
  it('records a crossing and one outbox row per channel, and writes nothing for the same crossing again', async () => {
    const store = await h.openFresh();
    const first = await store.alerts.recordCrossingWithOutbox(crossing, messages, 10_000);
    expect(first.status).toBe('recorded');
    if (first.status !== 'recorded') return;
    expect(first.record).toMatchObject({ ...crossing, crossingKey: crossingKeyOf(crossing), revision: 0, firstAnnouncedAtMs: 10_000 });
    expect(first.outboxIds).toHaveLength(2);
    const item = await store.outbox.getItem(first.outboxIds[0]!);
    expect(item).toMatchObject({
      kind: 'alert',
      attempts: 0,
      nextAttemptAtMs: 10_000,
      sentAtMs: null,
      claimedBy: null,
    });
    expect([alertDedupeKey(first.record.crossingKey, 0, slackA), alertDedupeKey(first.record.crossingKey, 0, discordB)]).toContain(item?.dedupeKey);

    // A later check (or another replica) sees the same event with a slightly different value.
    const again = await store.alerts.recordCrossingWithOutbox({ ...crossing, value: 3100 }, messages, 20_000);
    expect(again).toMatchObject({ status: 'duplicate', existing: { value: 3150, revision: 0 } });
    expect(await counts(h, store.url)).toEqual({ history: 1, outbox: 2 });
    expect(await store.alerts.findCrossing(crossing)).toMatchObject({ value: 3150 });
    expect(await store.alerts.findCrossing({ ...crossing, direction: 'down' })).toBeNull();
  });

  it('is atomic: a failure while writing the outbox leaves no history row and no outbox row', async () => {
    const store = await h.openFresh();
    await h.rawExecute(store.url, failingTriggerSql(h.backend));
    const boom: OutgoingMessage = { target: { platform: 'slack', teamId: 'T-INVENTED', channelId: 'C-boom' }, payload: { x: 1 } };
    await expect(store.alerts.recordCrossingWithOutbox(crossing, [messages[0]!, boom, messages[1]!], 10_000)).rejects.toThrow(
      /injected failure/,
    );
    expect(await counts(h, store.url)).toEqual({ history: 0, outbox: 0 });
    expect(await store.alerts.findCrossing(crossing)).toBeNull();
    // Once the fault is gone the same crossing records normally: the failed attempt left no trace.
    expect((await store.alerts.recordCrossingWithOutbox(crossing, messages, 11_000)).status).toBe('recorded');
  });

  it('refuses bad input before writing anything', async () => {
    const store = await h.openFresh();
    await expect(store.alerts.recordCrossingWithOutbox({ ...crossing, validLocalDay: 'Tuesday' }, messages, 1)).rejects.toThrow(
      /validLocalDay/,
    );
    await expect(
      store.alerts.recordCrossingWithOutbox(crossing, [{ target: slackA, payload: { n: 10n } }], 1),
    ).rejects.toThrow(/not JSON-serialisable/);
    await expect(store.alerts.recordCrossingWithOutbox({ ...crossing, value: Number.NaN }, messages, 1)).rejects.toThrow(/value/);
    expect(await counts(h, store.url)).toEqual({ history: 0, outbox: 0 });
  });

  it('records a material update once per revision, with new outbox keys; a stale revision writes nothing', async () => {
    const store = await h.openFresh();
    await store.alerts.recordCrossingWithOutbox(crossing, messages, 10_000);
    const moved = { ...crossing, validTime: '2031-07-14T19:00:00Z', value: 3600, effectiveDepthM: 3600 };
    const update = await store.alerts.recordCrossingUpdate(moved, 0, [messages[0]!], 30_000);
    expect(update.status).toBe('recorded');
    if (update.status !== 'recorded') return;
    expect(update.record).toMatchObject({ revision: 1, validTime: '2031-07-14T19:00:00Z', value: 3600, firstAnnouncedAtMs: 10_000, lastAnnouncedAtMs: 30_000 });
    expect((await store.outbox.getItem(update.outboxIds[0]!))?.dedupeKey).toBe(alertDedupeKey(crossingKeyOf(crossing), 1, slackA));

    const stale = await store.alerts.recordCrossingUpdate({ ...moved, value: 4000 }, 0, [messages[0]!], 40_000);
    expect(stale).toMatchObject({ status: 'stale', current: { revision: 1, value: 3600 } });
    const unknown = await store.alerts.recordCrossingUpdate({ ...moved, ruleId: 'never-announced' }, 0, messages, 40_000);
    expect(unknown).toEqual({ status: 'stale', current: null });
    expect(await counts(h, store.url)).toEqual({ history: 1, outbox: 3 });
  });
});

describeEachBackend('outbox queueing', (h) => {
  it('skips dedupe keys already queued, within a batch and across calls', async () => {
    const store = await h.openFresh();
    const item = { dedupeKey: 'notice|x', kind: 'notice' as const, target: slackA, payload: { text: 'hello' } };
    const first = await store.outbox.enqueue([item, { ...item, dedupeKey: 'notice|y', nextAttemptAtMs: 99_000 }, item], 5_000);
    expect(first.insertedIds).toHaveLength(2);
    expect(first.duplicateKeys).toEqual(['notice|x']);
    const second = await store.outbox.enqueue([item], 6_000);
    expect(second).toEqual({ insertedIds: [], duplicateKeys: ['notice|x'] });
    const y = (await Promise.all(first.insertedIds.map((id) => store.outbox.getItem(id)))).find((i) => i?.dedupeKey === 'notice|y');
    expect(y).toMatchObject({ nextAttemptAtMs: 99_000, createdAtMs: 5_000, payload: { text: 'hello' } });
    await expect(store.outbox.enqueue([{ ...item, kind: 'shout' as never }], 1)).rejects.toThrow(/kind/);
  });

  it('queues a morning summary once per channel and date and marks its watches in the same transaction', async () => {
    const store = await h.openFresh();
    const channel = await store.channels.ensureChannel(slackA, { unitSystem: 'metric', summaryLocalTime: '06:30' }, 1);
    const watch = (await store.watches.addWatch(channel.id, { latitudeDeg: 44.05, longitudeDeg: -121.31, createdBy: 'U' }, 1)).watch;
    const summary = { target: slackA, localDate: '2031-07-14', summaryKey: channel.id, payload: { title: 'Morning' }, watchIds: [watch.id] };
    const queued = await store.outbox.enqueueSummary(summary, 2_000);
    expect(queued.queued).toBe(true);
    expect((await store.outbox.getItem(queued.outboxId!))?.dedupeKey).toBe(summaryDedupeKey(channel.id, slackA, '2031-07-14'));
    expect((await store.watches.listWatches(channel.id))[0]?.lastSummaryLocalDate).toBe('2031-07-14');
    expect(await store.outbox.enqueueSummary(summary, 3_000)).toEqual({ queued: false, outboxId: null });
    expect((await store.outbox.enqueueSummary({ ...summary, localDate: '2031-07-15' }, 4_000)).queued).toBe(true);
    expect((await store.outbox.stats(4_000)).queueDepth).toBe(2);
  });
});
