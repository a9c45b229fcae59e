// The answer desk's turn-taking, at the wire: answers go out as edits of deferred Discord replies to
// the Discord stand-in on 127.0.0.1, asked of the router double (held or released by the test).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AnswerJob } from '../../adapters/answering/answerJob.ts';
import { createAnswerDesk } from '../../adapters/answering/createAnswerDesk.ts';
import { RouterDouble } from './routerDouble.ts';
import { standInApplicationId, startDiscordStandIn, type DiscordStandIn } from './discordStandIn.ts';

function job(token: string, text: string): AnswerJob {
  return {
    platform: 'discord',
    ask: { kind: 'command', request: { platform: 'discord', teamId: 'guild-invented', channelId: 'channel-invented', userId: 'user-invented', text, canManageChannel: false } },
    applicationId: standInApplicationId,
    interactionToken: token,
  };
}

const editPath = (token: string) => new RegExp(`/webhooks/\\d+/${token}/messages/@original$`);

describe('answer desk: a few answers at once, in arrival order', () => {
  let standIn: DiscordStandIn;
  const logged: string[] = [];
  const log = (level: string, text: string) => logged.push(`${level}: ${text}`);

  beforeAll(async () => {
    standIn = await startDiscordStandIn();
  });

  afterAll(async () => {
    await standIn?.stop();
  });

  it('works on at most answersAtOnce answers; the rest wait and are answered first asked, first answered', async () => {
    const router = new RouterDouble();
    const desk = createAnswerDesk({ router, discord: { apiUrl: standIn.apiUrl }, log, answersAtOnce: 2, placeHeldMs: 30_000 });
    router.hold();
    const texts = ['Cinder Flats 1', 'Cinder Flats 2', 'Cinder Flats 3', 'Cinder Flats 4', 'Cinder Flats 5'];
    texts.forEach((text, index) => void desk.answer(job(`turn-${index}`, text)));
    await router.received(2);
    // Held answers keep their places: nothing more reaches the router while they are held.
    await new Promise((resolve) => setTimeout(resolve, 200));
    expect(router.commands.map((command) => command.text)).toEqual(texts.slice(0, 2));
    router.release();
    await desk.idle();
    expect(router.commands.map((command) => command.text)).toEqual(texts);
    const arrivals = texts.map((_, index) => standIn.calls.findIndex((call) => call.method === 'PATCH' && editPath(`turn-${index}`).test(call.path)));
    expect(arrivals.every((at) => at >= 0)).toBe(true);
    // The last asked is answered after the first two, which held the places.
    expect(arrivals[4]).toBeGreaterThan(Math.max(arrivals[0]!, arrivals[1]!));
    expect(logged).toEqual([]);
  });

  it('lets the next answer start when one has held its place too long, and still delivers both', async () => {
    const router = new RouterDouble();
    const desk = createAnswerDesk({ router, discord: { apiUrl: standIn.apiUrl }, log, answersAtOnce: 1, placeHeldMs: 150 });
    router.hold();
    void desk.answer(job('stuck-0', 'Cinder Flats stuck'));
    void desk.answer(job('stuck-1', 'Cinder Flats next'));
    // With the place held for good, the second would never reach the router.
    await router.received(2, 3_000);
    router.release();
    await desk.idle();
    for (const token of ['stuck-0', 'stuck-1']) expect(standIn.calls.some((call) => call.method === 'PATCH' && editPath(token).test(call.path))).toBe(true);
  });

  it('refuses a number of answers at once that is not a positive whole number', () => {
    expect(() => createAnswerDesk({ router: new RouterDouble(), log, answersAtOnce: 0 })).toThrow(/positive integer/);
  });
});
