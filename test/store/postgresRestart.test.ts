/**
 * The PostgreSQL server restarts under a running store: a query during the outage fails with an
 * error, and the pool reconnects by itself for the next query once the server is back.
 *
 * It restarts a private server (its own port and folder, through `.ci/postgres.sh`) so the other
 * suites, which share the main test server and run in parallel, are not disturbed.
 */
import { execFile } from 'node:child_process';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, expect, it } from 'vitest';
import { openStore } from '../../src/store/openStore.ts';
import type { Store } from '../../src/store/storeTypes.ts';
import { describePostgres } from './storeTestBackends.ts';

const run = promisify(execFile);
const script = path.resolve(import.meta.dirname, '../../.ci/postgres.sh');
const port = process.env.LAPSEWATCH_TEST_PG_RESTART_PORT ?? '54339';
const scriptEnv = { ...process.env, LAPSEWATCH_PG_PORT: port, LAPSEWATCH_PG_DB: 'lapsewatch_restart' };
// Bounded: each script step gives up after 30 s of its own, and the test after 90 s in all.
const STEP_TIMEOUT_MS = 45_000;

async function serverControl(action: 'start' | 'stop' | 'restart' | 'destroy'): Promise<string> {
  const { stdout } = await run(script, [action], { env: scriptEnv, timeout: STEP_TIMEOUT_MS });
  return stdout.trim().split('\n').pop() ?? '';
}

const target = { platform: 'discord' as const, teamId: 'G-INVENTED', channelId: 'C-restart' };

describePostgres('server restart', () => {
  let store: Store | undefined;
  afterAll(async () => {
    await store?.close().catch(() => undefined);
    await serverControl('destroy');
  }, STEP_TIMEOUT_MS);

  it(
    'fails a query while the server is down, and succeeds after it is back, with the data intact',
    async () => {
      const url = await serverControl('start');
      expect(url).toBe(`postgres://postgres@127.0.0.1:${port}/lapsewatch_restart`);
      const droppedConnections: Error[] = [];
      store = await openStore({ url, onConnectionError: (error) => droppedConnections.push(error) });
      const channel = await store.channels.ensureChannel(target, { unitSystem: 'us', summaryLocalTime: '06:30' }, 1_000);
      await store.outbox.enqueue([{ dedupeKey: 'restart|1', kind: 'alert', target, payload: { n: 1 } }], 1_000);

      await serverControl('stop');
      await expect(store.channels.getChannelById(channel.id)).rejects.toThrow();
      await expect(store.outbox.claimDueOutbox('replica-a', 10, 30_000, 2_000)).rejects.toThrow();

      await serverControl('start');
      expect(await store.channels.getChannelById(channel.id)).toMatchObject({ unitSystem: 'us' });
      const claimed = await store.outbox.claimDueOutbox('replica-a', 10, 30_000, 2_000);
      expect(claimed.map((i) => i.dedupeKey)).toEqual(['restart|1']);

      // The script's own restart, with connections idle in the pool: they are dropped and replaced.
      const before = droppedConnections.length;
      await serverControl('restart');
      expect(await store.outbox.markSent(claimed[0]!.id, 'replica-a', 'm-1', 3_000)).toBe(true);
      expect(droppedConnections.length).toBeGreaterThan(before);
      expect((await store.outbox.stats(3_000)).queueDepth).toBe(0);
    },
    90_000,
  );
});
