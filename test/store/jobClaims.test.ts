import { expect, it } from 'vitest';
import { describeEachBackend } from './storeTestBackends.ts';

const LEASE_MS = 60_000;
// An invented job: the morning summary of one channel on one day.
const job = 'summary|channel-ember-creek|2031-07-14';

describeEachBackend('scheduled job claims', (h) => {
  it('gives a job to one worker, tells the others who holds it, and ends as done', async () => {
    const store = await h.openFresh();
    expect(await store.jobs.claimJob(job, 'replica-a', LEASE_MS, 1_000)).toEqual({ status: 'claimed', claimExpiresAtMs: 61_000 });
    expect(await store.jobs.claimJob(job, 'replica-b', LEASE_MS, 2_000)).toEqual({ status: 'busy', claimedBy: 'replica-a', claimExpiresAtMs: 61_000 });
    expect(await store.jobs.completeJob(job, 'replica-b', 3_000)).toBe(false);
    expect(await store.jobs.completeJob(job, 'replica-a', 3_000)).toBe(true);
    expect(await store.jobs.claimJob(job, 'replica-b', LEASE_MS, 100_000)).toEqual({ status: 'done', doneAtMs: 3_000 });
  });

  it('hands a job whose holder died to another worker after the lease, and a released job at once', async () => {
    const store = await h.openFresh();
    await store.jobs.claimJob(job, 'replica-dead', LEASE_MS, 1_000);
    expect((await store.jobs.claimJob(job, 'replica-b', LEASE_MS, 60_999)).status).toBe('busy');
    expect(await store.jobs.claimJob(job, 'replica-b', LEASE_MS, 61_000)).toEqual({ status: 'claimed', claimExpiresAtMs: 121_000 });
    expect(await store.jobs.completeJob(job, 'replica-dead', 70_000)).toBe(false);

    const other = 'alert-check|44.0500,-121.3100|2031-07-14T21:00Z';
    await store.jobs.claimJob(other, 'replica-a', LEASE_MS, 1_000);
    expect(await store.jobs.releaseJob(other, 'replica-b')).toBe(false);
    expect(await store.jobs.releaseJob(other, 'replica-a')).toBe(true);
    expect((await store.jobs.claimJob(other, 'replica-b', LEASE_MS, 2_000)).status).toBe('claimed');
  });

  it('prunes done jobs older than a time', async () => {
    const store = await h.openFresh();
    await store.jobs.claimJob(job, 'a', LEASE_MS, 1_000);
    await store.jobs.completeJob(job, 'a', 2_000);
    await store.jobs.claimJob('other', 'a', LEASE_MS, 1_000);
    expect(await store.jobs.pruneDone(2_000)).toBe(0);
    expect(await store.jobs.pruneDone(2_001)).toBe(1);
    expect((await store.jobs.claimJob('other', 'b', LEASE_MS, 1_500)).status).toBe('busy');
    await expect(store.jobs.claimJob('', 'a', LEASE_MS, 1)).rejects.toThrow(/job key/);
  });
});
