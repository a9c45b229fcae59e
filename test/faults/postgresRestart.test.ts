// Fault: the PostgreSQL server is restarted (.ci/postgres.sh restart) while a sender process is
// delivering. The sender's claims and marks fail while the server is down; it keeps retrying,
// reconnects through the pool, and delivers everything. The restart uses a server of the suite's
// own (faultPostgres.ts) so that tests running beside it keep theirs.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openStore } from '../../src/store/index.ts';
import type { Store } from '../../src/store/storeTypes.ts';
import { SlackStandIn } from '../adapters/slackStandIn.ts';
import { DiscordStandIn } from '../adapters/discordStandIn.ts';
import { testPostgresUrl } from '../delivery/deliveryFixtures.ts';
import { countDiscord, countSlack, seedFanOut, spawnSender, unsentRows } from './faultHarness.ts';
import { waitUntil } from '../waitUntil.ts';
import { startOwnPostgres, type OwnPostgres } from './faultPostgres.ts';

const pgAvailable = testPostgresUrl() !== null;
const ALERTS = 300;

describe.skipIf(!pgAvailable)('fault: PostgreSQL restarted mid-run', () => {
  let server: OwnPostgres;
  let store: Store;
  let slack: SlackStandIn;
  let discord: DiscordStandIn;
  beforeAll(async () => {
    server = await startOwnPostgres();
    store = await openStore({ url: server.url, onConnectionError: () => {} });
    const pg = (await import('pg')).default;
    const client = new pg.Client({ connectionString: server.url });
    await client.connect();
    await client.query('TRUNCATE outbox, job_claims, alert_history, mutes, rule_overrides, watches, places, channels');
    await client.end();
    slack = await new SlackStandIn().start();
    discord = await new DiscordStandIn().start();
  }, 180_000);
  afterAll(async () => {
    await store?.close();
    await slack?.stop();
    await discord?.stop();
    await server?.stop();
  }, 60_000);

  it('the sender reconnects and delivers everything', async () => {
    const ids = await seedFanOut(store, ALERTS, Date.now());
    const sender = spawnSender({
      LAPSEWATCH_STORE_URL: server.url,
      SLACK_API_URL: slack.apiUrl,
      DISCORD_API_URL: discord.apiUrl,
      EXIT_WHEN_DRAINED: '1',
      CONCURRENCY: '2',
      BATCH_SIZE: '10',
      WORKER_ID: 'pg-restart',
      MAX_RUN_MS: '170000',
    });
    const posts = () => slack.apiCalls('chat.postMessage').length + discord.callsTo(/messages$/).length;
    await waitUntil(() => posts() >= 20 || sender.child.exitCode !== null, 90_000, 'the first posts');
    const postsBeforeRestart = posts();
    const restartStartedAtMs = Date.now();
    await server.restart();
    const restartMs = Date.now() - restartStartedAtMs;
    const result = await sender.exited;
    expect(result.code, result.stderr.slice(-2000)).toBe(0);
    const s = countSlack(slack);
    const d = countDiscord(discord);
    const storeErrorsLogged = ((result.stdout + result.stderr).match(/outbox claim failed|could not record|could not mark sent/g) ?? []).length;
    console.log(
      `[fault pg-restart] alerts=${ALERTS} postsBeforeRestart=${postsBeforeRestart} restartMs=${restartMs} storeErrorsLogged=${storeErrorsLogged} ` +
        `delivered=${s.shown + d.shown} lost=${ALERTS - s.shown - d.shown} slackDuplicates=${s.extraCopies} discordDuplicates=${d.extraCopies} discordRepeatsAbsorbed=${d.absorbedRepeats}`,
    );
    expect(postsBeforeRestart).toBeLessThan(ALERTS);
    expect(s.shown + d.shown).toBe(ALERTS);
    expect(await unsentRows(store, ids)).toBe(0);
    expect(d.extraCopies).toBe(0);
    // The process lived through the outage, so posted-but-unmarked rows were marked on reconnect.
    expect(s.extraCopies).toBeLessThanOrEqual(2);
  }, 240_000);
});
