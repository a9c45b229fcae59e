/**
 * Leases on scheduled jobs, so each due job (a summary for one channel and date, an alert check
 * for one place and slot) is done by exactly one replica. Both steps are single atomic statements:
 * insert-if-absent for a new job, then take-over-if-expired for one whose holder died.
 */
import { z } from 'zod';
import type { StoreContext } from './storeContext.ts';
import type { JobClaimRepository, JobClaimResult } from './storeTypes.ts';
import { epochMsSchema, parseInput } from './storeInputSchemas.ts';

const jobKeySchema = z.string().min(1).max(500);
const workerIdSchema = z.string().min(1).max(200);
const leaseMsSchema = z.number().int().positive().max(24 * 3600 * 1000);

export function createJobClaimRepository({ db }: StoreContext): JobClaimRepository {
  return {
    async claimJob(jobKey, workerId, leaseMs, nowMs): Promise<JobClaimResult> {
      const key = parseInput(jobKeySchema, jobKey, 'job key');
      const worker = parseInput(workerIdSchema, workerId, 'worker id');
      const lease = parseInput(leaseMsSchema, leaseMs, 'lease (ms)');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const expiresAtMs = nowMs + lease;
      const inserted = await db
        .insertInto('job_claims')
        .values({ job_key: key, claimed_by: worker, claim_expires_at_ms: expiresAtMs, done_at_ms: null, created_at_ms: nowMs })
        .onConflict((oc) => oc.column('job_key').doNothing())
        .executeTakeFirst();
      if (Number(inserted.numInsertedOrUpdatedRows ?? 0) === 1) return { status: 'claimed', claimExpiresAtMs: expiresAtMs };
      // PostgreSQL re-checks this WHERE after waiting for a concurrent taker, so only one wins.
      const taken = await db
        .updateTable('job_claims')
        .set({ claimed_by: worker, claim_expires_at_ms: expiresAtMs })
        .where('job_key', '=', key)
        .where('done_at_ms', 'is', null)
        .where('claim_expires_at_ms', '<=', nowMs)
        .executeTakeFirst();
      if (Number(taken.numUpdatedRows) === 1) return { status: 'claimed', claimExpiresAtMs: expiresAtMs };
      const row = await db.selectFrom('job_claims').selectAll().where('job_key', '=', key).executeTakeFirstOrThrow();
      if (row.done_at_ms !== null) return { status: 'done', doneAtMs: Number(row.done_at_ms) };
      return { status: 'busy', claimedBy: row.claimed_by, claimExpiresAtMs: Number(row.claim_expires_at_ms) };
    },

    async completeJob(jobKey, workerId, nowMs) {
      const key = parseInput(jobKeySchema, jobKey, 'job key');
      const worker = parseInput(workerIdSchema, workerId, 'worker id');
      parseInput(epochMsSchema, nowMs, 'nowMs');
      const result = await db
        .updateTable('job_claims')
        .set({ done_at_ms: nowMs })
        .where('job_key', '=', key)
        .where('claimed_by', '=', worker)
        .where('done_at_ms', 'is', null)
        .executeTakeFirst();
      return Number(result.numUpdatedRows) === 1;
    },

    async releaseJob(jobKey, workerId) {
      const key = parseInput(jobKeySchema, jobKey, 'job key');
      const worker = parseInput(workerIdSchema, workerId, 'worker id');
      // An expiry of 0 makes the job due for anyone at once.
      const result = await db
        .updateTable('job_claims')
        .set({ claim_expires_at_ms: 0 })
        .where('job_key', '=', key)
        .where('claimed_by', '=', worker)
        .where('done_at_ms', 'is', null)
        .executeTakeFirst();
      return Number(result.numUpdatedRows) === 1;
    },

    async pruneDone(beforeMs) {
      parseInput(epochMsSchema, beforeMs, 'beforeMs');
      const result = await db.deleteFrom('job_claims').where('done_at_ms', '<', beforeMs).executeTakeFirst();
      return Number(result.numDeletedRows);
    },
  };
}
