// Fault: two sender replicas, each its own process with its own connection pool, on one database.
// Each alert is posted exactly once (claims under lease, SKIP LOCKED on PostgreSQL). Runs on a
// scratch PostgreSQL database (skipped with a warning when no server is configured, a failure
// under CI) and on one SQLite file, which must behave the same.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openStore } from '../../src/store/index.ts';
import type { Store } from '../../src/store/storeTypes.ts';
import { SlackStandIn } from '../adapters/slackStandIn.ts';
import { DiscordStandIn } from '../adapters/discordStandIn.ts';
import { openTempSqliteStore, testPostgresUrl } from '../delivery/deliveryFixtures.ts';
import { countDiscord, countSlack, sayGo, seedFanOut, spawnSender, unsentRows } from './faultHarness.ts';
import { createScratchDatabase } from './faultPostgres.ts';

const ALERTS = 400;
const pgUrl = testPostgresUrl();

async function runTwoReplicas(label: string, store: Store, url: string): Promise<void> {
  const slack = await new SlackStandIn().start();
  const discord = await new DiscordStandIn().start();
  try {
    const ids = await seedFanOut(store, ALERTS, Date.now());
    const env = { LAPSEWATCH_STORE_URL: url, SLACK_API_URL: slack.apiUrl, DISCORD_API_URL: discord.apiUrl, EXIT_WHEN_DRAINED: '1', WAIT_FOR_GO: '1', BATCH_SIZE: '10' };
    const replicas = [spawnSender({ ...env, WORKER_ID: `${label}-a` }), spawnSender({ ...env, WORKER_ID: `${label}-b` })];
    await Promise.all(replicas.map((r) => r.ready));
    replicas.forEach(sayGo); // both start together
    const results = await Promise.all(replicas.map((r) => r.exited));
    for (const result of results) expect(result.code, result.stderr.slice(-2000)).toBe(0);
    const s = countSlack(slack);
    const d = countDiscord(discord);
    // Which replica posted what: the stand-ins cannot tell, so count passes each replica logged.
    console.log(
      `[fault two-replicas ${label}] alerts=${ALERTS} delivered=${s.shown + d.shown} lost=${ALERTS - s.shown - d.shown} ` +
        `slackPosts=${s.postsAttempted} discordPosts=${d.postsAttempted} duplicates=${s.extraCopies + d.extraCopies} discordRepeats=${d.absorbedRepeats}`,
    );
    expect(s.shown + d.shown).toBe(ALERTS);
    expect(s.postsAttempted + d.postsAttempted).toBe(ALERTS); // each alert posted once, not merely shown once
    expect(await unsentRows(store, ids)).toBe(0);
  } finally {
    await slack.stop();
    await discord.stop();
  }
}

describe('fault: two replicas on one database', () => {
  describe.skipIf(pgUrl === null)('PostgreSQL', () => {
    let scratch: { url: string; drop: () => Promise<void> };
    let store: Store;
    beforeAll(async () => {
      scratch = await createScratchDatabase(pgUrl!, 'lw_two_replicas');
      store = await openStore({ url: scratch.url });
    }, 60_000);
    afterAll(async () => {
      await store?.close();
      await scratch?.drop();
    }, 60_000);
    it('each alert is posted once', () => runTwoReplicas('postgres', store, scratch.url), 180_000);
  });

  describe('SQLite', () => {
    let store: Store;
    let url: string;
    beforeAll(async () => {
      ({ store, url } = await openTempSqliteStore('two-replicas'));
    });
    afterAll(async () => {
      await store.close();
    });
    it('each alert is posted once', () => runTwoReplicas('sqlite', store, url), 180_000);
  });
});
