/**
 * Two replicas on one PostgreSQL database: two stores, each with its own pool, claiming at once.
 * Every row must go to exactly one of them.
 */
import { expect, it } from 'vitest';
import type { Crossing, Store } from '../../src/store/storeTypes.ts';
import { describePostgres, postgresHarness } from './storeTestBackends.ts';

const target = { platform: 'slack' as const, teamId: 'T-INVENTED', channelId: 'C-fanout' };
const LEASE_MS = 60_000;

async function claimUntilEmpty(store: Store, workerId: string, claimed: Map<string, string[]>): Promise<void> {
  for (;;) {
    const batch = await store.outbox.claimDueOutbox(workerId, 7, LEASE_MS, 10_000);
    if (batch.length === 0) return;
    for (const item of batch) claimed.set(item.id, [...(claimed.get(item.id) ?? []), workerId]);
  }
}

describePostgres('concurrent replicas', (baseUrl) => {
  const h = postgresHarness(baseUrl);

  it('never claim the same outbox row twice: 500 rows, two replicas, three claim loops each', async () => {
    const url = await h.freshUrl();
    const replicaA = await h.open(url, { maxConnections: 4 });
    const replicaB = await h.open(url, { maxConnections: 4 });
    const { insertedIds } = await replicaA.outbox.enqueue(
      Array.from({ length: 500 }, (_, i) => ({ dedupeKey: `fanout|${i}`, kind: 'alert' as const, target, payload: { i } })),
      1_000,
    );
    expect(insertedIds).toHaveLength(500);

    const claimed = new Map<string, string[]>();
    await Promise.all([
      ...[1, 2, 3].map((n) => claimUntilEmpty(replicaA, `replica-a-${n}`, claimed)),
      ...[1, 2, 3].map((n) => claimUntilEmpty(replicaB, `replica-b-${n}`, claimed)),
    ]);

    expect(claimed.size).toBe(500);
    const twice = [...claimed.entries()].filter(([, workers]) => workers.length !== 1);
    expect(twice).toEqual([]);
    expect(new Set(claimed.keys())).toEqual(new Set(insertedIds));
    const byA = [...claimed.values()].filter((w) => w[0]!.startsWith('replica-a')).length;
    console.info(`[concurrent claims] replica A took ${byA} rows, replica B ${500 - byA}`);
    // What the database holds agrees: one claim, one attempt per row.
    const rows = await h.rawQuery<{ attempts: number; n: string }>(url, 'SELECT attempts, count(*) AS n FROM outbox GROUP BY attempts');
    expect(rows.map((r) => [Number(r.attempts), Number(r.n)])).toEqual([[1, 500]]);
  });

  it('record a crossing once when both replicas see it at the same moment', async () => {
    const url = await h.freshUrl();
    const replicaA = await h.open(url);
    const replicaB = await h.open(url);
    const results = await Promise.all(
      Array.from({ length: 10 }, (_, i) => {
        const crossing: Crossing = {
          locationKey: `44.0${i}00,-121.3100`,
          ruleId: 'coupling-dry-layer',
          validLocalDay: '2031-07-14',
          direction: 'up',
          validTime: '2031-07-14T21:00:00Z',
          value: 3000,
          effectiveDepthM: 3000,
        };
        const message = [{ target, payload: { i } }];
        return Promise.all([
          replicaA.alerts.recordCrossingWithOutbox(crossing, message, 1_000),
          replicaB.alerts.recordCrossingWithOutbox(crossing, message, 1_000),
        ]);
      }),
    );
    for (const pair of results) expect(pair.map((r) => r.status).sort()).toEqual(['duplicate', 'recorded']);
    expect((await replicaA.outbox.stats(1_000)).queueDepth).toBe(10);
  });

  it('give each scheduled job to exactly one replica', async () => {
    const url = await h.freshUrl();
    const replicaA = await h.open(url);
    const replicaB = await h.open(url);
    const jobKeys = Array.from({ length: 50 }, (_, i) => `alert-check|place-${i}|2031-07-14T21:00Z`);
    const outcomes = await Promise.all(
      jobKeys.flatMap((key) => [
        replicaA.jobs.claimJob(key, 'replica-a', LEASE_MS, 1_000).then((r) => ({ key, r })),
        replicaB.jobs.claimJob(key, 'replica-b', LEASE_MS, 1_000).then((r) => ({ key, r })),
      ]),
    );
    for (const key of jobKeys) {
      const statuses = outcomes.filter((o) => o.key === key).map((o) => o.r.status).sort();
      expect(statuses).toEqual(['busy', 'claimed']);
    }
    // Both replicas try to take over the same expired jobs at once: still one winner each.
    const takeovers = await Promise.all(
      jobKeys.flatMap((key) => [
        replicaA.jobs.claimJob(key, 'replica-a2', LEASE_MS, 1_000 + LEASE_MS).then((r) => ({ key, r })),
        replicaB.jobs.claimJob(key, 'replica-b2', LEASE_MS, 1_000 + LEASE_MS).then((r) => ({ key, r })),
      ]),
    );
    for (const key of jobKeys) {
      const statuses = takeovers.filter((o) => o.key === key).map((o) => o.r.status).sort();
      expect(statuses).toEqual(['busy', 'claimed']);
    }
  });
});
