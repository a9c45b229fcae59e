// The real discord.js client against a local gateway and REST stand-in: a command goes in as an
// INTERACTION_CREATE event and comes out as REST calls (deferred callback, then the edited reply).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startDiscordBot, type RunningDiscordBot } from '../../adapters/discord/index.ts';
import { discordCommandName } from '../../adapters/discord/commands.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { RouterDouble } from './routerDouble.ts';
import {
  DiscordStandIn,
  MANAGE_CHANNELS,
  SEND_MESSAGES,
  standInApplicationId,
  standInChannelId,
  standInGuildId,
  startDiscordStandIn,
} from './discordStandIn.ts';

const footerStart = SAFETY_FOOTER.slice(0, 40);

describe('Discord bot at the wire', () => {
  let standIn: DiscordStandIn;
  let router: RouterDouble;
  let bot: RunningDiscordBot;
  const logged: string[] = [];

  beforeAll(async () => {
    standIn = await startDiscordStandIn();
    standIn.heartbeatIntervalMs = 500;
    router = new RouterDouble({ withImage: true });
    bot = await startDiscordBot({
      router,
      token: 'invented.discord.token',
      applicationId: standInApplicationId,
      apiUrl: standIn.apiUrl,
      log: (level, text) => logged.push(`${level}: ${text}`),
    });
  });

  afterAll(async () => {
    await bot?.stop();
    await standIn?.stop();
  });

  it('found the gateway through GET /gateway/bot and identified with the token', () => {
    expect(standIn.callsTo(/\/gateway\/bot$/).length).toBeGreaterThan(0);
    const identify = standIn.gatewayFrames.find((frame) => frame.op === 2);
    expect(identify?.d.token).toBe('invented.discord.token');
  });

  it('answers heartbeats, so the client keeps its session', async () => {
    // The client measures its ping only from a heartbeat that was acknowledged (op 11).
    const deadline = Date.now() + 5_000;
    while (bot.client.ws.ping < 0 && Date.now() < deadline) {
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    expect(standIn.gatewayFrames.some((frame) => frame.op === 1)).toBe(true);
    expect(bot.client.ws.ping).toBeGreaterThanOrEqual(0);
  });

  it('defers at once, then edits the reply into embeds, buttons, the PNG and the footer', async () => {
    router.hold();
    const { id, token } = standIn.sendCommand(discordCommandName(), '44.1N,121.3W');
    const callback = await standIn.waitForCall((call) => call.path === `/api/v10/interactions/${id}/${token}/callback`);
    // The router is still held: the deferral did not wait for the answer.
    expect(callback.body).toMatchObject({ type: 5 });
    // The interaction token is the credential: the bot token is not sent with the acknowledgement.
    expect(callback.headers.authorization).toBeUndefined();
    expect(callback.headers['user-agent']).toMatch(/^DiscordBot \(/);
    // Over the HTTP/2 connection opened at start, not a connection of its own.
    expect(callback.httpVersion).toBe('2.0');
    expect(standIn.callsTo(/messages\/@original$/).filter((call) => call.path.includes(token))).toHaveLength(0);
    router.release();

    const edit = await standIn.waitForCall((call) => call.method === 'PATCH' && call.path === `/api/v10/webhooks/${standInApplicationId}/${token}/messages/@original`);
    // discord.js's REST calls stay on HTTP/1.1 (nodeHttpFetch).
    expect(edit.httpVersion).toBe('1.1');
    const payload = DiscordStandIn.payloadOf(edit);
    expect(payload.content).toContain(footerStart);
    expect(payload.embeds[0].footer.text).toContain(footerStart);
    expect(payload.embeds[0].image.url).toBe('attachment://mixing-48h.png');
    expect(JSON.stringify(payload.components)).toContain('show-detail:detail:cinder-flats:14');
    expect(payload.allowed_mentions).toEqual({ parse: [] });
    expect(edit.body['files[0]']).toMatchObject({ fileName: 'mixing-48h.png' });

    expect(router.commands.at(-1)).toEqual({
      platform: 'discord',
      teamId: standInGuildId,
      channelId: standInChannelId,
      userId: '1100000000000000005',
      text: '44.1N,121.3W',
      canManageChannel: true,
      botCanPost: true,
    });
  });

  it("says whether the bot may post in the channel, from the interaction's app permissions", async () => {
    // View Channel and Send Messages, but no Embed Links or Attach Files: alerts would be refused.
    const { token } = standIn.sendCommand(discordCommandName(), 'watch Cinder Flats', MANAGE_CHANNELS, (1n << 10n) | SEND_MESSAGES);
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(token));
    expect(router.commands.at(-1)).toMatchObject({ text: 'watch Cinder Flats', botCanPost: false });
  });

  it('in a thread, judges posting by Send Messages in Threads rather than Send Messages', async () => {
    const threadId = standIn.sendGuildWithThread();
    const VIEW_EMBED_ATTACH = (1n << 10n) | (1n << 14n) | (1n << 15n);
    const SEND_IN_THREADS = 1n << 38n;
    const thread = { id: threadId, type: 11 };
    // Send Messages alone does not let the bot post in a thread: alerts there would be refused.
    const sendOnly = standIn.sendCommand(discordCommandName(), 'watch Cinder Flats', MANAGE_CHANNELS, VIEW_EMBED_ATTACH | SEND_MESSAGES, thread);
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(sendOnly.token));
    expect(router.commands.at(-1)).toMatchObject({ channelId: threadId, botCanPost: false });
    const threadsOnly = standIn.sendCommand(discordCommandName(), 'watch Cinder Flats', MANAGE_CHANNELS, VIEW_EMBED_ATTACH | SEND_IN_THREADS, thread);
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(threadsOnly.token));
    expect(router.commands.at(-1)).toMatchObject({ channelId: threadId, botCanPost: true });
    // The same permissions in the parent channel are not enough.
    const inChannel = standIn.sendCommand(discordCommandName(), 'watch Cinder Flats', MANAGE_CHANNELS, VIEW_EMBED_ATTACH | SEND_IN_THREADS);
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(inChannel.token));
    expect(router.commands.at(-1)).toMatchObject({ channelId: standInChannelId, botCanPost: false });
  });

  it('judges a thread the client has not been told of (no GUILD_CREATE or THREAD_CREATE) by the type the interaction carries', async () => {
    standIn.sendGuildWithThread(); // the guild is known; these two channels are not in it
    const VIEW_EMBED_ATTACH = (1n << 10n) | (1n << 14n) | (1n << 15n);
    const SEND_IN_THREADS = 1n << 38n;
    const unseenThread = { id: '1100000000000000077', type: 12 };
    const threadsOnly = standIn.sendCommand(discordCommandName(), 'watch Cinder Flats', MANAGE_CHANNELS, VIEW_EMBED_ATTACH | SEND_IN_THREADS, unseenThread);
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(threadsOnly.token));
    expect(router.commands.at(-1)).toMatchObject({ channelId: unseenThread.id, botCanPost: true });
    // And an unseen text channel by Send Messages, not Send Messages in Threads.
    const unseenChannel = { id: '1100000000000000078', type: 0 };
    const inChannel = standIn.sendCommand(discordCommandName(), 'watch Cinder Flats', MANAGE_CHANNELS, VIEW_EMBED_ATTACH | SEND_IN_THREADS, unseenChannel);
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(inChannel.token));
    expect(router.commands.at(-1)).toMatchObject({ channelId: unseenChannel.id, botCanPost: false });
  });

  it('passes an empty text when the option is left out', async () => {
    const { token } = standIn.sendCommand(discordCommandName(), undefined);
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(token));
    expect(router.commands.at(-1)?.text).toBe('');
  });

  it('a member without Manage Channels gets canManageChannel=false', async () => {
    const { token } = standIn.sendCommand(discordCommandName(), 'watch Cinder Flats', SEND_MESSAGES);
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(token));
    expect(router.commands.at(-1)).toMatchObject({ text: 'watch Cinder Flats', canManageChannel: false });
  });

  it('an Administrator counts as able to manage the channel', async () => {
    const { token } = standIn.sendCommand(discordCommandName(), 'watch Cinder Flats', 1n << 3n);
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(token));
    expect(router.commands.at(-1)?.canManageChannel).toBe(true);
  });

  it('routes a button press to handleAction with the action id and value from custom_id', async () => {
    const { id, token } = standIn.sendButton('mute-rule:mute:coupling:cinder-flats', MANAGE_CHANNELS);
    await standIn.waitForCall((call) => call.path === `/api/v10/interactions/${id}/${token}/callback`);
    const edit = await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(token));
    expect(DiscordStandIn.payloadOf(edit).content).toContain(footerStart);
    expect(router.actions.at(-1)).toEqual({
      platform: 'discord',
      teamId: standInGuildId,
      channelId: standInChannelId,
      userId: '1100000000000000005',
      actionId: 'mute-rule',
      value: 'mute:coupling:cinder-flats',
      canManageChannel: true,
      botCanPost: true,
    });
    // A button press says whether the bot may post too (ending a mute turns its posts back on).
    const refused = standIn.sendButton('end-mute:hdw-above|43.62,-115.48', MANAGE_CHANNELS, (1n << 10n) | SEND_MESSAGES);
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(refused.token));
    expect(router.actions.at(-1)).toMatchObject({ actionId: 'end-mute', botCanPost: false });
  });

  it('routes the end-mute button of a mute notice', async () => {
    const { token } = standIn.sendButton('end-mute:coupling|43.62,-115.48', MANAGE_CHANNELS);
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(token));
    expect(router.actions.at(-1)).toMatchObject({ actionId: 'end-mute', value: 'coupling|43.62,-115.48', canManageChannel: true });
  });

  it('ignores other commands and unknown buttons without calling the router', async () => {
    const before = router.commands.length + router.actions.length;
    const other = standIn.sendCommand('someone-elses', 'x');
    const button = standIn.sendButton('not-ours:1');
    // A later command of ours is answered; the two before it were skipped, not queued.
    const ours = standIn.sendCommand(discordCommandName(), 'help');
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(ours.token));
    expect(router.commands.length + router.actions.length).toBe(before + 1);
    expect(standIn.callbackOf(other.id)).toBeUndefined();
    expect(standIn.callbackOf(button.id)).toBeUndefined();
  });

  it("ignores another application's interaction and a payload without its token, and answers the next", async () => {
    const before = router.commands.length;
    const foreign = standIn.sendAlteredCommand(discordCommandName(), 'help', { application_id: '1100000000000000099' });
    const tokenless = standIn.sendAlteredCommand(discordCommandName(), 'help', { token: undefined });
    const ours = standIn.sendCommand(discordCommandName(), 'help');
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(ours.token));
    expect(router.commands.length).toBe(before + 1);
    expect(standIn.callbackOf(foreign.id)).toBeUndefined();
    expect(standIn.callbackOf(tokenless.id)).toBeUndefined();
  });

  it('waits out a 429 on the acknowledgement once, inside the 3 s window, then answers', async () => {
    standIn.addFault({ path: /\/callback$/, status: 429, retryAfterSec: 0.2, body: { message: 'You are being rate limited.', retry_after: 0.2, global: false }, times: 1 });
    const limited = standIn.sendCommand(discordCommandName(), 'Cinder Flats');
    const edit = await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(limited.token));
    const callbacks = standIn.calls.filter((call) => call.path.includes(`/interactions/${limited.id}/`));
    expect(callbacks.map((call) => call.status)).toEqual([429, 204]);
    expect(callbacks[1]!.at - callbacks[0]!.at).toBeGreaterThanOrEqual(180);
    expect(edit.status).toBe(200);
  });

  it('does not wait out a 429 that would end after the 3 s window: the interaction is logged as not acknowledged', async () => {
    standIn.addFault({ path: /\/callback$/, status: 429, retryAfterSec: 5, body: { message: 'You are being rate limited.', retry_after: 5, global: false }, times: 1 });
    const before = router.commands.length;
    const limited = standIn.sendCommand(discordCommandName(), 'Cinder Flats');
    await standIn.waitForCall((call) => call.path.includes(`/interactions/${limited.id}/`) && call.status === 429);
    const next = standIn.sendCommand(discordCommandName(), 'Cinder Flats');
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(next.token));
    expect(standIn.calls.filter((call) => call.path.includes(`/interactions/${limited.id}/`))).toHaveLength(1);
    expect(router.commands.length).toBe(before + 1);
    expect(logged.some((line) => line.includes(limited.id) && line.includes('429'))).toBe(true);
    // Discord's message is in the line too: the refusal's body is read once, for the wait and for the reason.
    expect(logged.some((line) => line.includes(limited.id) && line.includes('You are being rate limited.'))).toBe(true);
  });

  it('survives an interaction whose callback Discord refuses (expired token), and keeps answering', async () => {
    standIn.addFault({ path: /\/callback$/, status: 404, body: { message: 'Unknown interaction', code: 10062 }, times: 1 });
    const failed = standIn.sendCommand(discordCommandName(), 'Cinder Flats');
    await standIn.waitForCall((call) => call.path.includes(`/interactions/${failed.id}/`) && call.status === 404);
    const next = standIn.sendCommand(discordCommandName(), 'Cinder Flats');
    await standIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(next.token));
    expect(logged.some((line) => line.includes(failed.id) && line.includes('Unknown interaction'))).toBe(true);
  });
});
