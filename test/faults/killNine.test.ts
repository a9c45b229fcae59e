// Fault: kill -9 of the sender process at random points of a fan-out of 500 alerts, 20 times, then
// a restart that drains the outbox. Zero lost; duplicates only inside the stated window
// (outboxSender.ts): Slack may repeat a post only for rows in flight when a kill landed (at most
// CONCURRENCY per kill), Discord shows none (repeats carry the same nonce).
//
// Test-only setting: the lease is 1.5 s instead of 30 s so twenty restarts fit in CI time; the
// window's shape does not depend on the lease length.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Store } from '../../src/store/storeTypes.ts';
import { SlackStandIn } from '../adapters/slackStandIn.ts';
import { DiscordStandIn } from '../adapters/discordStandIn.ts';
import { openTempSqliteStore } from '../delivery/deliveryFixtures.ts';
import { countDiscord, countSlack, killHard, sayGo, seedFanOut, seededRandom, spawnSender, unsentRows, type SenderChild } from './faultHarness.ts';

const ALERTS = 500;
const KILLS = 20;
const CONCURRENCY = 4;

describe('fault: kill -9 during a 500-alert fan-out', () => {
  let store: Store;
  let url: string;
  let slack: SlackStandIn;
  let discord: DiscordStandIn;
  beforeAll(async () => {
    ({ store, url } = await openTempSqliteStore('kill9'));
    slack = await new SlackStandIn().start();
    discord = await new DiscordStandIn().start();
  });
  afterAll(async () => {
    await store.close();
    await slack.stop();
    await discord.stop();
  });

  it('loses nothing and duplicates only within the window', async () => {
    const seed = Number(process.env.LAPSEWATCH_FAULT_SEED ?? Date.now() % 100_000);
    const random = seededRandom(seed);
    const ids = await seedFanOut(store, ALERTS, Date.now());
    const env = {
      LAPSEWATCH_STORE_URL: url,
      SLACK_API_URL: slack.apiUrl,
      DISCORD_API_URL: discord.apiUrl,
      LEASE_MS: '1500',
      CONCURRENCY: String(CONCURRENCY),
      BATCH_SIZE: '20',
      IDLE_POLL_MS: '100',
    };
    const posts = () => slack.apiCalls('chat.postMessage').length + discord.callsTo(/messages$/).length;
    let killsLanded = 0;
    // Four processes warm at a time (loaded, store open, waiting for "go"), so restarts are quick.
    const warm: SenderChild[] = [];
    let spawned = 0;
    const topUp = () => {
      while (warm.length < 4 && spawned < KILLS) {
        warm.push(spawnSender({ ...env, WORKER_ID: `kill9-${spawned}`, WAIT_FOR_GO: '1' }));
        spawned += 1;
      }
    };
    for (let i = 0; i < KILLS; i += 1) {
      topUp();
      const sender = warm.shift()!;
      await sender.ready;
      sayGo(sender);
      // Kill after a random number (1..30) of further posts: always in the middle of the fan-out.
      const target = posts() + 1 + Math.floor(random() * 30);
      const deadline = Date.now() + 15_000;
      while (posts() < target && Date.now() < deadline && sender.child.exitCode === null) {
        await new Promise((resolve) => setTimeout(resolve, 2 + Math.floor(random() * 5)));
      }
      await killHard(sender);
      killsLanded += 1;
      if (process.env.LAPSEWATCH_FAULT_VERBOSE) console.log(`[fault kill-9] kill ${i + 1}: posts so far ${posts()}`);
    }
    const finalRun = spawnSender({ ...env, WORKER_ID: 'kill9-final', EXIT_WHEN_DRAINED: '1' });
    const result = await finalRun.exited;
    for (const leftover of warm) await killHard(leftover);
    expect(result.code, result.stderr).toBe(0);

    const slackCounts = countSlack(slack);
    const discordCounts = countDiscord(discord);
    const lost = ALERTS - slackCounts.shown - discordCounts.shown;
    console.log(
      `[fault kill-9] seed=${seed} alerts=${ALERTS} kills=${killsLanded} lost=${lost} unsentRows=${await unsentRows(store, ids)} ` +
        `slack: shown=${slackCounts.shown} duplicated=${slackCounts.duplicated} extraCopies=${slackCounts.extraCopies} posts=${slackCounts.postsAttempted}; ` +
        `discord: shown=${discordCounts.shown} duplicated=${discordCounts.duplicated} repeatsAbsorbedByNonce=${discordCounts.absorbedRepeats} posts=${discordCounts.postsAttempted}`,
    );
    expect(killsLanded).toBe(KILLS);
    expect(lost).toBe(0);
    expect(await unsentRows(store, ids)).toBe(0);
    expect(discordCounts.duplicated).toBe(0);
    expect(slackCounts.extraCopies).toBeLessThanOrEqual(KILLS * CONCURRENCY);
  }, 600_000);
});
