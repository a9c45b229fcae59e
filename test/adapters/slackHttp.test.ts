// The real Bolt app on 127.0.0.1, its Web API pointed at the Slack stand-in, driven by signed requests.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LogLevel } from '@slack/bolt';
import { startSlackApp, type RunningSlackApp } from '../../adapters/slack/index.ts';
import { slackCommandName } from '../../adapters/slack/slackCommandName.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { RouterDouble } from './routerDouble.ts';
import { startSlackStandIn, type SlackStandIn } from './slackStandIn.ts';
import { buttonPayload, postSigned, slashCommandForm } from './slackSigning.ts';

const secret = 'invented-signing-secret';
const footerStart = SAFETY_FOOTER.slice(0, 40);

describe('Slack HTTP receiver at the wire', () => {
  let standIn: SlackStandIn;
  let router: RouterDouble;
  let slack: RunningSlackApp;
  let eventsUrl: string;

  beforeAll(async () => {
    standIn = await startSlackStandIn();
    router = new RouterDouble({ withImage: true });
    slack = await startSlackApp({
      router,
      botToken: 'xoxb-invented',
      signingSecret: secret,
      apiUrl: standIn.apiUrl,
      port: 0,
      host: '127.0.0.1',
      logLevel: LogLevel.ERROR,
      extraRoutes: [{ path: '/metrics', handler: (_req, res) => res.writeHead(200).end('lapsewatch_test_metric 1\n') }],
    });
    eventsUrl = `http://127.0.0.1:${slack.port}/slack/events`;
  });

  afterAll(async () => {
    await slack?.stop();
    await standIn?.stop();
  });

  it('answers /healthz with 200, and extra routes, on the receiver port', async () => {
    const response = await fetch(`http://127.0.0.1:${slack.port}/healthz`);
    expect(response.status).toBe(200);
    expect(await (await fetch(`http://127.0.0.1:${slack.port}/metrics`)).text()).toContain('lapsewatch_test_metric 1');
  });

  it('survives a response URL that fails, and answers the next command', async () => {
    standIn.addFault({ path: /^\/respond\/expired$/, status: 404, times: 1 });
    const first = await postSigned(eventsUrl, slashCommandForm(slackCommandName(), 'x', standIn.responseUrl('expired')), { secret });
    expect(first.status).toBe(200);
    await standIn.waitForCall((call) => call.path === '/respond/expired' && call.status === 404);
    await postSigned(eventsUrl, slashCommandForm(slackCommandName(), 'y', standIn.responseUrl('after-expired')), { secret });
    await standIn.waitForCall((call) => call.path === '/respond/after-expired' && call.status === 200);
  });

  it('acknowledges a signed command before the answer, then answers at the response URL with blocks, text, footer and the image', async () => {
    const form = slashCommandForm(slackCommandName(), '44.1N,121.3W', standIn.responseUrl('cmd-1'));
    router.hold();
    // The router is held, so a 200 here was sent before any answer existed.
    const ack = await postSigned(eventsUrl, form, { secret });
    expect(ack.status).toBe(200);
    expect(standIn.callsTo(/^\/respond\/cmd-1$/)).toHaveLength(0);
    router.release();

    const answer = await standIn.waitForCall((call) => call.path === '/respond/cmd-1');
    expect(answer.body.response_type).toBe('in_channel');
    expect(answer.body.text).toContain(footerStart);
    expect(Array.isArray(answer.body.blocks)).toBe(true);
    expect(JSON.stringify(answer.body.blocks)).toContain(footerStart);
    expect(JSON.stringify(answer.body.blocks)).toContain('show-detail');

    expect(router.commands.at(-1)).toMatchObject({
      platform: 'slack',
      teamId: 'T0INVENTED',
      channelId: 'C0INVENTED',
      userId: 'U0CREWLEAD',
      text: '44.1N,121.3W',
      canManageChannel: true,
    });

    // The chart goes up through the external upload flow into the same channel.
    const complete = await standIn.waitForCall((call) => call.path === '/api/files.completeUploadExternal');
    expect(complete.body.channel_id).toBe('C0INVENTED');
    expect(standIn.callsTo(/^\/upload\//).length).toBeGreaterThan(0);
    expect(standIn.apiCalls('files.getUploadURLExternal')[0]?.body.filename).toBe('mixing-48h.png');
  });

  it('posts a watch confirmation as the bot, into the channel its alerts will go to', async () => {
    const posted = standIn.apiCalls('chat.postMessage').length;
    await postSigned(eventsUrl, slashCommandForm(slackCommandName(), 'watch Cinder Flats', standIn.responseUrl('watch-1')), { secret });
    const post = await standIn.waitForCall((call) => call.path === '/api/chat.postMessage' && JSON.stringify(call.body).includes('Watching'));
    expect(standIn.apiCalls('chat.postMessage').length).toBe(posted + 1);
    expect(post.body.channel).toBe('C0INVENTED');
    expect(post.body.text).toContain(footerStart);
    expect(standIn.callsTo(/^\/respond\/watch-1$/)).toHaveLength(0);
  });

  it('says at once when the bot cannot post in the channel, instead of alerts that never arrive', async () => {
    standIn.failMethod('chat.postMessage', 'not_in_channel');
    await postSigned(eventsUrl, slashCommandForm(slackCommandName(), 'watch Cinder Flats', standIn.responseUrl('watch-2')), { secret });
    const answer = await standIn.waitForCall((call) => call.path === '/respond/watch-2' && call.body?.response_type === 'in_channel');
    expect(answer.body.text).toContain('Watching');
    const hint = await standIn.waitForCall((call) => call.path === '/respond/watch-2' && call.body?.response_type === 'ephemeral');
    expect(hint.body.text).toContain('cannot post in this channel (Slack: not_in_channel), so its alerts and morning summaries would not arrive');
    expect(hint.body.text).toContain('`/invite @Lapsewatch`');
    expect(hint.body.text).toContain(footerStart);

    // A lookup's chart refused the same way: the answer stands, and the asker learns why the chart is missing.
    standIn.failMethod('files.completeUploadExternal', 'not_in_channel');
    await postSigned(eventsUrl, slashCommandForm(slackCommandName(), '44.1N,121.3W', standIn.responseUrl('chart-1')), { secret });
    const chartHint = await standIn.waitForCall((call) => call.path === '/respond/chart-1' && call.body?.response_type === 'ephemeral');
    expect(chartHint.body.text).toContain('The chart is not attached: Lapsewatch cannot post in this channel (Slack: not_in_channel)');
    expect(chartHint.body.text).toContain(footerStart);
  });

  it('refuses a request with a bad signature and never calls the router', async () => {
    const before = router.commands.length;
    const form = slashCommandForm(slackCommandName(), 'bad-sig', standIn.responseUrl('bad-sig'));
    const refused = await postSigned(eventsUrl, form, { secret, signature: 'v0=' + '0'.repeat(64) });
    expect(refused.status).toBe(401);
    const wrongSecret = await postSigned(eventsUrl, form, { secret: 'not-the-secret' });
    expect(wrongSecret.status).toBe(401);
    expect(router.commands.length).toBe(before);
    expect(standIn.callsTo(/^\/respond\/bad-sig$/)).toHaveLength(0);
  });

  it('refuses a correctly signed request older than five minutes', async () => {
    const before = router.commands.length;
    const form = slashCommandForm(slackCommandName(), 'stale', standIn.responseUrl('stale'));
    const stale = await postSigned(eventsUrl, form, { secret, timestampSec: Math.floor(Date.now() / 1000) - 6 * 60 });
    expect(stale.status).toBe(401);
    expect(router.commands.length).toBe(before);
  });

  it('routes a button press to handleAction and answers at its response URL', async () => {
    const payload = buttonPayload('show-detail', 'detail:cinder-flats:14', standIn.responseUrl('btn-1'));
    const ack = await postSigned(eventsUrl, { payload: JSON.stringify(payload) }, { secret });
    expect(ack.status).toBe(200);
    const answer = await standIn.waitForCall((call) => call.path === '/respond/btn-1');
    expect(answer.body.text).toContain(footerStart);
    expect(router.actions.at(-1)).toMatchObject({
      platform: 'slack',
      actionId: 'show-detail',
      value: 'detail:cinder-flats:14',
      channelId: 'C0INVENTED',
      userId: 'U0CREWLEAD',
      teamId: 'T0INVENTED',
    });
  });

  it('routes the mute button and the end-mute button too (with a suffix that keeps ids unique in one message)', async () => {
    for (const [actionId, key] of [['mute-rule', 'btn-2'], ['end-mute:1', 'btn-3']] as const) {
      const payload = buttonPayload(actionId, 'coupling|43.62,-115.48', standIn.responseUrl(key));
      expect((await postSigned(eventsUrl, { payload: JSON.stringify(payload) }, { secret })).status).toBe(200);
      await standIn.waitForCall((call) => call.path === `/respond/${key}`);
      expect(router.actions.at(-1)).toMatchObject({ actionId: actionId.split(':')[0], value: 'coupling|43.62,-115.48' });
    }
  });
});

describe('Slack adapter with a router that breaks its promise', () => {
  it('still answers with the footer, and the process goes on', async () => {
    const standIn = await startSlackStandIn();
    const slack = await startSlackApp({
      router: new RouterDouble({ throws: true }),
      botToken: 'xoxb-invented',
      signingSecret: secret,
      apiUrl: standIn.apiUrl,
      port: 0,
      host: '127.0.0.1',
      logLevel: LogLevel.ERROR,
    });
    try {
      const form = slashCommandForm(slackCommandName(), 'anything', standIn.responseUrl('broken'));
      expect((await postSigned(`http://127.0.0.1:${slack.port}/slack/events`, form, { secret })).status).toBe(200);
      const answer = await standIn.waitForCall((call) => call.path === '/respond/broken');
      expect(answer.body.response_type).toBe('ephemeral');
      expect(answer.body.text).toContain(footerStart);
      expect(answer.body.text).toContain('Nothing was changed');
    } finally {
      await slack.stop();
      await standIn.stop();
    }
  });
});
