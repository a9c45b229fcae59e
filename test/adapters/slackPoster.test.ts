// The Slack ChannelPoster against the stand-in: every platform answer becomes the right outcome.
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { createSlackPoster } from '../../adapters/slack/slackPoster.ts';
import type { ChannelPoster, ChannelTarget } from '../../src/delivery/channelPoster.ts';
import { buildMessage, SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { fixedLookup } from './routerDouble.ts';
import { startSlackStandIn, type SlackStandIn } from './slackStandIn.ts';

const target: ChannelTarget = { platform: 'slack', teamId: 'T0INVENTED', channelId: 'C0INVENTED' };
const alert = buildMessage({
  kind: 'alert',
  title: 'Invented alert: mixed layer reaches the dry layer aloft at Cinder Flats (invented)',
  severity: 'warning',
  inventedData: true,
  sections: [{ lines: ['Deep mixing brings dry air and stronger winds aloft down to the fire.'] }],
});

describe('Slack poster', () => {
  let standIn: SlackStandIn;
  let poster: ChannelPoster;

  beforeAll(async () => {
    standIn = await startSlackStandIn();
    poster = createSlackPoster({ botToken: 'xoxb-invented', apiUrl: standIn.apiUrl });
  });
  beforeEach(() => standIn.clearFaults());
  afterAll(async () => standIn?.stop());

  it('posts with chat.postMessage: blocks, fallback text with the footer, the message ts back', async () => {
    const outcome = await poster.post(target, alert, 'alert-1');
    expect(outcome).toEqual({ ok: true, platformMessageId: expect.stringMatching(/^1700000000\.\d{6}$/) });
    const call = standIn.apiCalls('chat.postMessage').at(-1)!;
    expect(call.body.channel).toBe('C0INVENTED');
    expect(call.body.text).toContain(SAFETY_FOOTER.slice(0, 40));
    expect(JSON.parse(call.body.blocks).length).toBeGreaterThan(1);
    expect(call.headers.authorization).toBe('Bearer xoxb-invented');
  });

  it('uploads images into the thread of the posted message', async () => {
    const outcome = await poster.post(target, fixedLookup('summary', true), 'summary-1');
    expect(outcome.ok).toBe(true);
    const complete = standIn.apiCalls('files.completeUploadExternal').at(-1)!;
    expect(complete.body.thread_ts).toBe(outcome.ok ? outcome.platformMessageId : '');
  });

  it('reports 429 as rate-limited with Retry-After in ms, after a single request', async () => {
    standIn.addFault({ path: /chat\.postMessage/, status: 429, retryAfterSec: 7, times: 1 });
    const before = standIn.apiCalls('chat.postMessage').length;
    const outcome = await poster.post(target, alert, 'alert-2');
    expect(outcome).toMatchObject({ ok: false, kind: 'rate-limited', retryAfterMs: 7000 });
    expect(standIn.apiCalls('chat.postMessage').length).toBe(before + 1);
  });

  it('reports 500 as retryable without retrying itself', async () => {
    standIn.addFault({ path: /chat\.postMessage/, status: 500, times: 5 });
    const before = standIn.apiCalls('chat.postMessage').length;
    const outcome = await poster.post(target, alert, 'alert-3');
    expect(outcome).toMatchObject({ ok: false, kind: 'retryable' });
    expect(standIn.apiCalls('chat.postMessage').length).toBe(before + 1);
  });

  it.each(['channel_not_found', 'not_in_channel', 'is_archived', 'account_inactive'])('reports %s as channel-gone', async (error) => {
    standIn.failMethod('chat.postMessage', error);
    const outcome = await poster.post(target, alert, `gone-${error}`);
    expect(outcome).toMatchObject({ ok: false, kind: 'channel-gone', reason: `Slack: ${error}` });
  });

  it('reports another refusal as rejected', async () => {
    standIn.failMethod('chat.postMessage', 'invalid_arguments');
    expect(await poster.post(target, alert, 'alert-4')).toMatchObject({ ok: false, kind: 'rejected' });
  });

  it('shortens and retries once on msg_too_long; the short version keeps the footer', async () => {
    standIn.failMethod('chat.postMessage', 'msg_too_long');
    const before = standIn.apiCalls('chat.postMessage').length;
    const outcome = await poster.post(target, alert, 'alert-5');
    expect(outcome.ok).toBe(true);
    const [first, second] = standIn.apiCalls('chat.postMessage').slice(before);
    expect(first?.body.blocks).toBeDefined();
    expect(second?.body.blocks).toBeUndefined();
    expect(second?.body.text.length).toBeLessThanOrEqual(1500);
    expect(second?.body.text.endsWith(SAFETY_FOOTER)).toBe(true);
  });

  it('gives up after the one shortened retry', async () => {
    standIn.failMethod('chat.postMessage', 'msg_too_long', 2);
    expect(await poster.post(target, alert, 'alert-6')).toMatchObject({ ok: false, kind: 'rejected', reason: 'Slack: msg_too_long' });
  });

  it('reports a refused connection as retryable', async () => {
    const closed = await startSlackStandIn();
    const url = closed.apiUrl;
    await closed.stop();
    const offline = createSlackPoster({ botToken: 'xoxb-invented', apiUrl: url });
    expect(await offline.post(target, alert, 'alert-7')).toMatchObject({ ok: false, kind: 'retryable' });
  });
});
