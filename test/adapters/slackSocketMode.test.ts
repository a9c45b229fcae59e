// Socket Mode: apps.connections.open on the stand-in hands out a local ws:// URL; the stand-in
// says hello, sends a slash command envelope and expects the envelope's acknowledgement.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LogLevel } from '@slack/bolt';
import { startSlackApp, type RunningSlackApp } from '../../adapters/slack/index.ts';
import { slackCommandName } from '../../adapters/slack/slackCommandName.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { RouterDouble } from './routerDouble.ts';
import { startSlackStandIn, type SlackStandIn } from './slackStandIn.ts';
import { buttonPayload, slashCommandForm } from './slackSigning.ts';

describe('Slack Socket Mode at the wire', () => {
  let standIn: SlackStandIn;
  let router: RouterDouble;
  let slack: RunningSlackApp;

  beforeAll(async () => {
    standIn = await startSlackStandIn({ socketMode: true });
    router = new RouterDouble();
    slack = await startSlackApp({
      router,
      botToken: 'xoxb-invented',
      appToken: 'xapp-invented',
      apiUrl: standIn.apiUrl,
      port: 0,
      host: '127.0.0.1',
      logLevel: LogLevel.ERROR,
    });
    await standIn.socketConnected();
  });

  afterAll(async () => {
    await slack?.stop();
    await standIn?.stop();
  });

  it('opened the connection with the app token', () => {
    const open = standIn.apiCalls('apps.connections.open')[0];
    expect(open?.headers.authorization).toBe('Bearer xapp-invented');
  });

  it('makes no HTTP warm-up: events come over the socket, which the receiver cannot send itself', () => {
    expect(slack.warmUp).toBeNull();
  });

  it('acknowledges a slash command envelope, then answers at the response URL', async () => {
    router.hold();
    const ack = await standIn.sendEnvelope('slash_commands', slashCommandForm(slackCommandName(), 'Cinder Flats', standIn.responseUrl('sock-1')));
    expect(ack.envelope_id).toMatch(/^env-/);
    expect(standIn.callsTo(/^\/respond\/sock-1$/)).toHaveLength(0);
    router.release();
    const answer = await standIn.waitForCall((call) => call.path === '/respond/sock-1');
    expect(answer.body.text).toContain(SAFETY_FOOTER.slice(0, 40));
    expect(router.commands.at(-1)).toMatchObject({ platform: 'slack', text: 'Cinder Flats', channelId: 'C0INVENTED' });
  });

  it('routes a button envelope to handleAction', async () => {
    await standIn.sendEnvelope('interactive', buttonPayload('mute-rule', 'mute:coupling:cinder-flats', standIn.responseUrl('sock-2')));
    await standIn.waitForCall((call) => call.path === '/respond/sock-2');
    expect(router.actions.at(-1)).toMatchObject({ actionId: 'mute-rule', value: 'mute:coupling:cinder-flats' });
  });

  it('serves /healthz on its own port', async () => {
    expect((await fetch(`http://127.0.0.1:${slack.port}/healthz`)).status).toBe(200);
  });
});
