// The Discord ChannelPoster against the stand-in: nonce sent, repeats collapse, errors mapped.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { createDiscordPoster } from '../../adapters/discord/discordPoster.ts';
import { nonceFromKey } from '../../adapters/discord/nonceFromKey.ts';
import type { ChannelPoster, ChannelTarget } from '../../src/delivery/channelPoster.ts';
import type { Message } from '../../src/render/message.ts';
import { buildMessage, SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { fixedLookup } from './routerDouble.ts';
import { DiscordStandIn, standInChannelId, startDiscordStandIn } from './discordStandIn.ts';

const target: ChannelTarget = { platform: 'discord', teamId: '1100000000000000003', channelId: standInChannelId };
const alert = buildMessage({
  kind: 'alert',
  title: 'Invented alert: mixed layer reaches the dry layer aloft at Cinder Flats (invented)',
  severity: 'warning',
  inventedData: true,
  sections: [{ lines: ['Deep mixing brings dry air and stronger winds aloft down to the fire.'] }],
});
const postsTo = (channelId: string) => new RegExp(`^/api/v10/channels/${channelId}/messages$`);

describe('Discord poster', () => {
  let standIn: DiscordStandIn;
  let poster: ChannelPoster;

  beforeAll(async () => {
    standIn = await startDiscordStandIn();
    poster = createDiscordPoster({ token: 'invented.discord.token', apiUrl: standIn.apiUrl });
  });
  beforeEach(() => standIn.clearFaults());
  afterAll(async () => standIn?.stop());

  it('posts embeds and the footer, with the hashed key as nonce and enforce_nonce', async () => {
    const outcome = await poster.post(target, alert, 'alert:cinder-flats:2030-07-01T14');
    expect(outcome).toMatchObject({ ok: true, platformMessageId: expect.stringMatching(/^\d+$/) });
    const call = standIn.callsTo(postsTo(standInChannelId)).at(-1)!;
    const body = DiscordStandIn.payloadOf(call);
    expect(body.nonce).toBe(nonceFromKey('alert:cinder-flats:2030-07-01T14'));
    expect(body.nonce.length).toBeLessThanOrEqual(25);
    expect(body.enforce_nonce).toBe(true);
    expect(body.content).toContain(SAFETY_FOOTER.slice(0, 40));
    expect(body.embeds[0].footer.text).toContain(SAFETY_FOOTER.slice(0, 40));
    expect(call.headers.authorization).toBe('Bot invented.discord.token');
  });

  it('a repeat with the same key returns the first message, not a second one', async () => {
    const first = await poster.post(target, alert, 'alert:repeat');
    const second = await poster.post(target, alert, 'alert:repeat');
    const other = await poster.post(target, alert, 'alert:another');
    expect(first.ok && second.ok && other.ok).toBe(true);
    if (first.ok && second.ok && other.ok) {
      expect(second.platformMessageId).toBe(first.platformMessageId);
      expect(other.platformMessageId).not.toBe(first.platformMessageId);
    }
  });

  it('sends images as attachments', async () => {
    const summary = fixedLookup('summary', true);
    expect((await poster.post(target, summary, 'summary:1')).ok).toBe(true);
    const call = standIn.callsTo(postsTo(standInChannelId)).at(-1)!;
    expect(call.headers['content-type']).toContain('multipart/form-data');
    // The stand-in reads the form with undici's FormData parser, not with our encoder.
    expect(call.body['files[0]']).toMatchObject({ fileName: 'mixing-48h.png', type: 'image/png', size: summary.images[0]!.png.byteLength });
    expect(DiscordStandIn.payloadOf(call).attachments).toEqual([{ id: 0, filename: 'mixing-48h.png', description: expect.any(String) }]);
  });

  it('reports 429 as rate-limited with retry_after in ms, after a single request', async () => {
    const channelId = '1100000000000000042';
    standIn.addFault({ path: postsTo(channelId), status: 429, retryAfterSec: 3, body: { message: 'You are being rate limited.', retry_after: 3, global: false }, times: 1 });
    const outcome = await poster.post({ ...target, channelId }, alert, 'alert:429');
    expect(outcome).toMatchObject({ ok: false, kind: 'rate-limited', retryAfterMs: 3000 });
    expect(standIn.callsTo(postsTo(channelId))).toHaveLength(1);
  });

  it('reports 500 as retryable without retrying itself', async () => {
    const channelId = '1100000000000000043';
    standIn.addFault({ path: postsTo(channelId), status: 500, times: 5 });
    const outcome = await poster.post({ ...target, channelId }, alert, 'alert:500');
    expect(outcome).toMatchObject({ ok: false, kind: 'retryable' });
    expect(standIn.callsTo(postsTo(channelId))).toHaveLength(1);
  });

  it('reports 10003 Unknown Channel and 50001 Missing Access as channel-gone', async () => {
    standIn.goneChannels.add('1100000000000000044');
    standIn.forbiddenChannels.add('1100000000000000045');
    expect(await poster.post({ ...target, channelId: '1100000000000000044' }, alert, 'gone:1')).toMatchObject({ ok: false, kind: 'channel-gone', reason: expect.stringContaining('10003') });
    expect(await poster.post({ ...target, channelId: '1100000000000000045' }, alert, 'gone:2')).toMatchObject({ ok: false, kind: 'channel-gone', reason: expect.stringContaining('50001') });
  });

  it('shortens and retries once on 50035 (too long), keeping the footer and the nonce', async () => {
    const tooLong: Message = { ...alert, title: 'x' };
    const overlong = createDiscordPoster({
      token: 'invented.discord.token',
      apiUrl: standIn.apiUrl,
      // An encoder that exceeds Discord's content limit, as a future encoder bug might.
      encode: () => ({ content: 'y'.repeat(2500), embeds: [], components: [], allowed_mentions: { parse: [] }, files: [] }),
    });
    const before = standIn.callsTo(postsTo(standInChannelId)).length;
    const outcome = await overlong.post(target, tooLong, 'alert:long');
    expect(outcome.ok).toBe(true);
    const [first, second] = standIn.callsTo(postsTo(standInChannelId)).slice(before).map(DiscordStandIn.payloadOf);
    expect(first.content.length).toBe(2500);
    expect(second.content.length).toBeLessThanOrEqual(2000);
    expect(second.content.endsWith(SAFETY_FOOTER)).toBe(true);
    expect(second.nonce).toBe(first.nonce);
  });

  it('reports a refused connection as retryable', async () => {
    const closed = await startDiscordStandIn();
    const url = closed.apiUrl;
    await closed.stop();
    const offline = createDiscordPoster({ token: 'invented.discord.token', apiUrl: url });
    expect(await offline.post(target, alert, 'alert:offline')).toMatchObject({ ok: false, kind: 'retryable' });
  });
});

describe('nonce from key', () => {
  it('is stable, at most 25 characters, and differs between keys', () => {
    expect(nonceFromKey('a')).toBe(nonceFromKey('a'));
    expect(nonceFromKey('a')).not.toBe(nonceFromKey('b'));
    expect(nonceFromKey('k'.repeat(500))).toHaveLength(25);
  });
});

