// Fault: both platform stand-ins answer 500 to every post for an outage window, then recover.
// Everything queued is delivered after, nothing is abandoned, each alert shown once.
//
// The outage lasts LAPSEWATCH_FAULT_OUTAGE_MS: 60 s by default, 20 s under CI (to keep the suite
// to a few minutes). Test-only setting: backoff base 0.5 s and cap 5 s instead of 2 s and 5 min, so
// the last retry comes within seconds of recovery; in production the first post after a one-minute
// outage comes within the backoff then reached (at most about two minutes).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createOutboxSender } from '../../src/delivery/outboxSender.ts';
import { createSlackPoster } from '../../adapters/slack/slackPoster.ts';
import { createDiscordPoster } from '../../adapters/discord/discordPoster.ts';
import type { Store } from '../../src/store/storeTypes.ts';
import { SlackStandIn } from '../adapters/slackStandIn.ts';
import { DiscordStandIn } from '../adapters/discordStandIn.ts';
import { capturingLogger, openTempSqliteStore } from '../delivery/deliveryFixtures.ts';
import { countDiscord, countSlack, seedFanOut, unsentRows } from './faultHarness.ts';
import { waitUntil } from '../waitUntil.ts';

const OUTAGE_MS = Number(process.env.LAPSEWATCH_FAULT_OUTAGE_MS ?? (process.env.CI ? 20_000 : 60_000));
const ALERTS = 200;

describe('fault: platform answers 500 for an outage window', () => {
  let store: Store;
  let slack: SlackStandIn;
  let discord: DiscordStandIn;
  beforeAll(async () => {
    ({ store } = await openTempSqliteStore('outage'));
    slack = await new SlackStandIn().start();
    discord = await new DiscordStandIn().start();
  });
  afterAll(async () => {
    await store.close();
    await slack.stop();
    await discord.stop();
  });

  it('delivers everything after the outage', async () => {
    const outageEndsAtMs = Date.now() + OUTAGE_MS;
    slack.addFault({ path: /chat\.postMessage/, status: 500, untilMs: outageEndsAtMs });
    discord.addFault({ path: /messages$/, status: 500, untilMs: outageEndsAtMs });
    const ids = await seedFanOut(store, ALERTS, Date.now());
    const { logger } = capturingLogger('warn');
    const sender = createOutboxSender({
      store,
      posters: [
        createSlackPoster({ botToken: 'xoxb-invented', apiUrl: slack.apiUrl }),
        createDiscordPoster({ token: 'invented.token', apiUrl: discord.apiUrl }),
      ],
      workerId: 'outage-sender',
      logger,
      backoff: { baseMs: 500, capMs: 5_000, floorMs: 100 },
      idlePollMs: 100,
      batchSize: 50,
    });
    sender.start();
    try {
      await waitUntil(async () => (await store.outbox.stats(Date.now())).queueDepth === 0, OUTAGE_MS + 60_000, 'the outbox to drain');
    } finally {
      await sender.stop();
    }
    const failedDuringOutage =
      slack.calls.filter((c) => c.status === 500).length + discord.calls.filter((c) => c.status === 500).length;
    const s = countSlack(slack);
    const d = countDiscord(discord);
    const stats = await store.outbox.stats(Date.now());
    console.log(
      `[fault platform-500] outageMs=${OUTAGE_MS} alerts=${ALERTS} answered500=${failedDuringOutage} delivered=${s.shown + d.shown} ` +
        `lost=${ALERTS - s.shown - d.shown} abandoned=${stats.abandoned} slackDuplicates=${s.extraCopies} discordDuplicates=${d.extraCopies} ` +
        `lastDeliveryAfterRecoveryMs=${Math.max(...[...slack.calls, ...discord.calls].filter((c) => c.status === 200).map((c) => c.at)) - outageEndsAtMs}`,
    );
    expect(failedDuringOutage).toBeGreaterThan(0);
    expect(s.shown + d.shown).toBe(ALERTS);
    expect(await unsentRows(store, ids)).toBe(0);
    expect(stats.abandoned).toBe(0);
    expect(s.extraCopies + d.extraCopies).toBe(0);
    // Nothing got through while the stand-ins were failing.
    const early = [...slack.calls, ...discord.calls].filter((c) => c.status === 200 && c.at < outageEndsAtMs - 50);
    expect(early.filter((c) => /messages$|chat\.postMessage/.test(c.path))).toHaveLength(0);
  }, 240_000);
});
