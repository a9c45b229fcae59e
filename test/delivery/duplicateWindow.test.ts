// The stated duplicate window (see outboxSender.ts): a sender that dies after the platform
// accepted a post and before markSent. Simulated in-process by a sender whose store never
// records the mark and which is then thrown away; the kill -9 version is in test/faults.
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createOutboxSender, DEFAULT_LEASE_MS, DISCORD_NONCE_WINDOW_MS } from '../../src/delivery/outboxSender.ts';
import { createSlackPoster } from '../../adapters/slack/slackPoster.ts';
import { createDiscordPoster } from '../../adapters/discord/discordPoster.ts';
import { SlackStandIn } from '../adapters/slackStandIn.ts';
import { DiscordStandIn } from '../adapters/discordStandIn.ts';
import type { Store } from '../../src/store/storeTypes.ts';
import { capturingLogger, discordTarget, enqueueAlerts, inventedAlert, openTempSqliteStore, slackTarget } from './deliveryFixtures.ts';

const T0 = Date.UTC(2031, 6, 14, 18, 0, 0);

/** The store as a dying process sees it: the post goes out, the mark never commits. */
function storeThatDiesBeforeMark(store: Store): Store {
  return {
    ...store,
    outbox: { ...store.outbox, markSent: () => new Promise<boolean>(() => {}) },
  } as Store;
}

describe('duplicate window: crash between post and markSent', () => {
  let store: Store;
  let slack: SlackStandIn;
  let discord: DiscordStandIn;
  beforeEach(async () => {
    ({ store } = await openTempSqliteStore('dupwin'));
    slack = await new SlackStandIn().start();
    discord = await new DiscordStandIn().start();
  });
  afterEach(async () => {
    await store.close();
    await slack.stop();
    await discord.stop();
  });

  function posters() {
    return [
      createSlackPoster({ botToken: 'xoxb-invented', apiUrl: slack.apiUrl }),
      createDiscordPoster({ token: 'invented.token', apiUrl: discord.apiUrl }),
    ];
  }

  it('the lease is well inside the Discord nonce window', () => {
    expect(DEFAULT_LEASE_MS * 2).toBeLessThan(DISCORD_NONCE_WINDOW_MS);
  });

  it('Discord: the re-post after the lease carries the same nonce and shows one message', async () => {
    const [id] = await enqueueAlerts(store, [{ key: 'alert|dup|r0|d', target: discordTarget('1200000000000000009'), message: inventedAlert('Dup (invented)') }], T0);
    const dying = createOutboxSender({ store: storeThatDiesBeforeMark(store), posters: posters(), workerId: 'dies', logger: capturingLogger().logger, nowMs: () => T0 });
    void dying.sendOnce(); // never finishes: the process "died" after the post
    await discord.waitForCall((c) => /messages$/.test(c.path));
    const heir = createOutboxSender({ store, posters: posters(), workerId: 'heir', logger: capturingLogger().logger, nowMs: () => T0 + DEFAULT_LEASE_MS + 1 });
    expect((await heir.sendOnce()).sent).toBe(1);
    const posts = discord.callsTo(/messages$/);
    expect(posts).toHaveLength(2);
    expect(posts[0]!.body.nonce).toBe(posts[1]!.body.nonce);
    // Both enforce the nonce, so the stand-in (like Discord) answers the repeat with the first message.
    expect(posts.every((p) => p.body.enforce_nonce === true)).toBe(true);
    expect((await store.outbox.getItem(id!))!.sentAtMs).not.toBeNull();
  });

  it('Slack: at least once, and twice only in this window', async () => {
    const [id] = await enqueueAlerts(store, [{ key: 'alert|dup|r0|s', target: slackTarget('C0CINDER'), message: inventedAlert('Dup (invented)') }], T0);
    const dying = createOutboxSender({ store: storeThatDiesBeforeMark(store), posters: posters(), workerId: 'dies', logger: capturingLogger().logger, nowMs: () => T0 });
    void dying.sendOnce();
    await slack.waitForCall((c) => c.path === '/api/chat.postMessage');
    const heir = createOutboxSender({ store, posters: posters(), workerId: 'heir', logger: capturingLogger().logger, nowMs: () => T0 + DEFAULT_LEASE_MS + 1 });
    expect((await heir.sendOnce()).sent).toBe(1);
    expect(slack.apiCalls('chat.postMessage')).toHaveLength(2);
    // Once marked, never again.
    expect((await heir.sendOnce()).claimed).toBe(0);
    expect((await store.outbox.getItem(id!))!.sentAtMs).toBe(T0 + DEFAULT_LEASE_MS + 1);
  });

  it('Slack: a mark that fails while the process lives is retried, not re-posted', async () => {
    const [id] = await enqueueAlerts(store, [{ key: 'alert|mark|r0|s', target: slackTarget('C0CINDER'), message: inventedAlert('Mark later (invented)') }], T0);
    let storeDown = true;
    const flaky = {
      ...store,
      outbox: {
        ...store.outbox,
        markSent: (...args: Parameters<Store['outbox']['markSent']>) => (storeDown ? Promise.reject(new Error('connection terminated (invented)')) : store.outbox.markSent(...args)),
      },
    } as Store;
    const s = createOutboxSender({ store: flaky, posters: posters(), workerId: 'w', logger: capturingLogger().logger, nowMs: () => T0 });
    expect((await s.sendOnce()).storeErrors).toBe(1);
    expect(s.pendingMarkCount).toBe(1);
    storeDown = false;
    const report = await s.sendOnce();
    expect(report.sent).toBe(1);
    expect(s.pendingMarkCount).toBe(0);
    expect(slack.apiCalls('chat.postMessage')).toHaveLength(1);
    expect((await store.outbox.getItem(id!))!.sentAtMs).toBe(T0);
  });
});
