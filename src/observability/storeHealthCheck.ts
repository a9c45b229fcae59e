/** A health check that the store answers a cheap query (PostgreSQL reachable, SQLite file open). */
import type { Store } from '../store/storeTypes.ts';
import type { HealthCheck } from './healthServer.ts';

export function storeHealthCheck(store: Pick<Store, 'outbox'>, clock: () => number = Date.now): HealthCheck {
  return async () => {
    try {
      await store.outbox.stats(clock());
      return null;
    } catch (error) {
      return `store not answering: ${error instanceof Error ? error.message : String(error)}`;
    }
  };
}

/** Unhealthy when the scheduler has not ticked for `staleAfterMs` (a hung event loop or a dead cron). */
export function tickFreshnessCheck(lastTickAtMs: () => number | null, staleAfterMs: number, clock: () => number = Date.now): HealthCheck {
  return async () => {
    const last = lastTickAtMs();
    if (last === null) return null; // not started yet: start-up is not a failure
    const ageMs = clock() - last;
    return ageMs > staleAfterMs ? `scheduler last ticked ${Math.round(ageMs / 1000)} s ago` : null;
  };
}
