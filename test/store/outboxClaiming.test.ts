import { expect, it } from 'vitest';
import type { ChannelTarget, NewOutboxItem, Store } from '../../src/store/storeTypes.ts';
import { describeEachBackend } from './storeTestBackends.ts';

const target: ChannelTarget = { platform: 'discord', teamId: 'G-INVENTED', channelId: 'C-ember-creek' };
const LEASE_MS = 45_000;

function items(count: number, prefix: string, extra: Partial<NewOutboxItem> = {}): NewOutboxItem[] {
  return Array.from({ length: count }, (_, i) => ({
    dedupeKey: `${prefix}|${i}`,
    kind: 'alert' as const,
    target,
    payload: { n: i },
    ...extra,
  }));
}

async function queue(store: Store, count: number, prefix: string, nowMs: number, extra: Partial<NewOutboxItem> = {}): Promise<string[]> {
  return (await store.outbox.enqueue(items(count, prefix, extra), nowMs)).insertedIds;
}

describeEachBackend('outbox claiming', (h) => {
  it('claims due rows oldest first, up to the limit, and not future or already-claimed ones', async () => {
    const store = await h.openFresh();
    await queue(store, 3, 'early', 1_000);
    await queue(store, 2, 'late', 2_000);
    await queue(store, 2, 'future', 2_000, { nextAttemptAtMs: 50_000 });
    const first = await store.outbox.claimDueOutbox('worker-a', 4, LEASE_MS, 10_000);
    expect(first.map((i) => i.dedupeKey.split('|')[0])).toEqual(['early', 'early', 'early', 'late']);
    for (const item of first) expect(item).toMatchObject({ claimedBy: 'worker-a', claimExpiresAtMs: 10_000 + LEASE_MS, attempts: 1 });
    const second = await store.outbox.claimDueOutbox('worker-b', 10, LEASE_MS, 10_001);
    expect(second.map((i) => i.dedupeKey.split('|')[0])).toEqual(['late']);
    expect(await store.outbox.claimDueOutbox('worker-b', 10, LEASE_MS, 10_002)).toEqual([]);
    // The future rows come due later.
    expect((await store.outbox.claimDueOutbox('worker-b', 10, LEASE_MS, 50_000)).map((i) => i.dedupeKey.split('|')[0])).toEqual(['future', 'future']);
  });

  it('lets another worker reclaim a row whose lease expired (the first worker died), and fences the first out', async () => {
    const store = await h.openFresh();
    const [id] = await queue(store, 1, 'one', 1_000);
    await store.outbox.claimDueOutbox('worker-dead', 10, LEASE_MS, 1_000);
    expect(await store.outbox.claimDueOutbox('worker-b', 10, LEASE_MS, 1_000 + LEASE_MS - 1)).toEqual([]);
    const reclaimed = await store.outbox.claimDueOutbox('worker-b', 10, LEASE_MS, 1_000 + LEASE_MS);
    expect(reclaimed).toHaveLength(1);
    expect(reclaimed[0]).toMatchObject({ id, claimedBy: 'worker-b', attempts: 2 });
    // The dead worker's late calls do not touch worker-b's claim.
    expect(await store.outbox.releaseClaim(id!, 'worker-dead')).toBe(false);
    expect(await store.outbox.markFailed(id!, 'worker-dead', 99_000, 'late')).toBe(false);
    expect(await store.outbox.renewClaim(id!, 'worker-dead', LEASE_MS, 50_000)).toBe(false);
    expect((await store.outbox.getItem(id!))?.claimedBy).toBe('worker-b');
  });

  it('renews a lease so a slow post keeps its row', async () => {
    const store = await h.openFresh();
    const [id] = await queue(store, 1, 'slow', 1_000);
    await store.outbox.claimDueOutbox('worker-a', 1, LEASE_MS, 1_000);
    expect(await store.outbox.renewClaim(id!, 'worker-a', LEASE_MS, 40_000)).toBe(true);
    expect(await store.outbox.claimDueOutbox('worker-b', 1, LEASE_MS, 1_000 + LEASE_MS)).toEqual([]);
    expect((await store.outbox.getItem(id!))?.claimExpiresAtMs).toBe(40_000 + LEASE_MS);
  });

  it('marks sent once (from whichever worker posted it) and never hands a sent row out again', async () => {
    const store = await h.openFresh();
    const [id] = await queue(store, 1, 'sent', 1_000);
    await store.outbox.claimDueOutbox('worker-a', 1, LEASE_MS, 1_000);
    expect(await store.outbox.markSent(id!, 'worker-a', 'msg-123', 2_000)).toBe(true);
    expect(await store.outbox.markSent(id!, 'worker-b', 'msg-456', 3_000)).toBe(false);
    expect(await store.outbox.getItem(id!)).toMatchObject({ sentAtMs: 2_000, platformMessageId: 'msg-123', claimedBy: null });
    expect(await store.outbox.claimDueOutbox('worker-b', 10, LEASE_MS, 10_000_000)).toEqual([]);
    expect(await store.outbox.markSent('no-such-id', 'worker-a', null, 3_000)).toBe(false);
  });

  it('retries a failed row at the given time with its error, and releases a claim untouched', async () => {
    const store = await h.openFresh();
    const [failing, released] = await queue(store, 2, 'retry', 1_000);
    await store.outbox.claimDueOutbox('worker-a', 2, LEASE_MS, 1_000);
    expect(await store.outbox.markFailed(failing!, 'worker-a', 31_000, 'HTTP 503 from the platform')).toBe(true);
    expect(await store.outbox.releaseClaim(released!, 'worker-a')).toBe(true);
    expect(await store.outbox.getItem(failing!)).toMatchObject({ nextAttemptAtMs: 31_000, lastError: 'HTTP 503 from the platform', claimedBy: null, attempts: 1 });
    const now = await store.outbox.claimDueOutbox('worker-b', 10, LEASE_MS, 2_000);
    expect(now.map((i) => i.id)).toEqual([released]);
    const later = await store.outbox.claimDueOutbox('worker-b', 10, LEASE_MS, 31_000);
    expect(later.map((i) => i.id)).toEqual([failing]);
    expect(later[0]?.attempts).toBe(2);
  });

  it('abandons a row for good and keeps it out of the queue depth', async () => {
    const store = await h.openFresh();
    const [id] = await queue(store, 1, 'gone', 1_000);
    await store.outbox.claimDueOutbox('worker-a', 1, LEASE_MS, 1_000);
    expect(await store.outbox.markAbandoned(id!, 'worker-a', 'channel_not_found', 2_000)).toBe(true);
    expect(await store.outbox.getItem(id!)).toMatchObject({ abandonedAtMs: 2_000, lastError: 'channel_not_found' });
    expect(await store.outbox.claimDueOutbox('worker-a', 1, LEASE_MS, 10_000_000)).toEqual([]);
    expect(await store.outbox.stats(3_000)).toEqual({ queueDepth: 0, oldestUnsentAgeMs: null, oldestUnsentAlertAgeMs: null, claimed: 0, abandoned: 1 });
  });

  it('reports queue depth, oldest unsent ages and live claims, and prunes finished rows', async () => {
    const store = await h.openFresh();
    expect(await store.outbox.stats(1_000)).toEqual({ queueDepth: 0, oldestUnsentAgeMs: null, oldestUnsentAlertAgeMs: null, claimed: 0, abandoned: 0 });
    await queue(store, 1, 'notice', 1_000, { kind: 'notice' });
    const alertIds = await queue(store, 3, 'alert', 4_000);
    await store.outbox.claimDueOutbox('worker-a', 2, LEASE_MS, 5_000);
    const stats = await store.outbox.stats(10_000);
    expect(stats).toEqual({ queueDepth: 4, oldestUnsentAgeMs: 9_000, oldestUnsentAlertAgeMs: 6_000, claimed: 2, abandoned: 0 });
    // Expired leases no longer count as claimed.
    expect((await store.outbox.stats(5_000 + LEASE_MS)).claimed).toBe(0);
    for (const id of alertIds) await store.outbox.markSent(id, 'worker-a', null, 20_000);
    expect((await store.outbox.stats(20_000)).queueDepth).toBe(1);
    expect(await store.outbox.pruneFinished(20_000)).toBe(0);
    expect(await store.outbox.pruneFinished(20_001)).toBe(3);
    expect((await store.outbox.stats(20_001)).queueDepth).toBe(1);
  });

  it('refuses nonsense claim arguments', async () => {
    const store = await h.openFresh();
    await expect(store.outbox.claimDueOutbox('', 10, LEASE_MS, 1)).rejects.toThrow(/worker id/);
    await expect(store.outbox.claimDueOutbox('w', 0, LEASE_MS, 1)).rejects.toThrow(/limit/);
    await expect(store.outbox.claimDueOutbox('w', 10, -5, 1)).rejects.toThrow(/lease/);
  });
});
