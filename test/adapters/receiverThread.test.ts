// The receivers in their own thread, as `npm start` runs them: the real Bolt HTTP receiver and the
// real discord.js client in a worker thread, the router double in this thread, both platforms'
// stand-ins on 127.0.0.1. A command goes in at the wire, is acknowledged by the worker, and its
// answer comes out of this thread at the wire; /metrics is made here and served there; a receiver
// thread that dies is replaced and the next command is answered.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LogLevel } from '@slack/bolt';
import { discordCommandName } from '../../adapters/discord/commands.ts';
import { startReceiverThread, type RunningReceiverThread } from '../../adapters/receiverThread/startReceiverThread.ts';
import { slackCommandName } from '../../adapters/slack/slackCommandName.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { RouterDouble } from './routerDouble.ts';
import { DiscordStandIn, standInApplicationId, startDiscordStandIn } from './discordStandIn.ts';
import { startSlackStandIn, type SlackStandIn } from './slackStandIn.ts';
import { postSigned, slashCommandForm } from './slackSigning.ts';

const secret = 'invented-signing-secret';

describe('chat receivers in their own thread', () => {
  let slackStandIn: SlackStandIn;
  let discordStandIn: DiscordStandIn;
  let receivers: RunningReceiverThread;
  const router = new RouterDouble({ withImage: true });
  const logged: string[] = [];
  const eventsUrl = () => `http://127.0.0.1:${receivers.slack!.port}/slack/events`;

  beforeAll(async () => {
    slackStandIn = await startSlackStandIn();
    discordStandIn = await startDiscordStandIn();
    receivers = await startReceiverThread({
      router,
      slack: { botToken: 'xoxb-invented', signingSecret: secret, apiUrl: slackStandIn.apiUrl, port: 0, host: '127.0.0.1', logLevel: LogLevel.ERROR },
      discord: { token: 'invented', applicationId: standInApplicationId, apiUrl: discordStandIn.apiUrl },
      textRoutes: [{ path: '/metrics', render: async () => ({ contentType: 'text/plain', body: 'lapsewatch_thread_metric 7\n' }) }],
      log: (level, text) => logged.push(`${level}: ${text}`),
    });
  });

  afterAll(async () => {
    await receivers?.stop();
    await discordStandIn?.stop();
    await slackStandIn?.stop();
  });

  it('runs the receivers in another thread than the router', () => {
    expect(receivers.slack).toMatchObject({ mode: 'http' });
    expect(receivers.discord).toBe(true);
    expect(receivers.currentWorker().threadId).toBeGreaterThan(0);
  });

  it('acknowledges a Slack command while the router is held, then answers at the response URL with the footer and the image', async () => {
    router.hold();
    const ack = await postSigned(eventsUrl(), slashCommandForm(slackCommandName(), 'Cinder Flats', slackStandIn.responseUrl('thread-1')), { secret });
    expect(ack.status).toBe(200);
    expect(slackStandIn.calls.some((call) => call.path === '/respond/thread-1')).toBe(false);
    router.release();
    const answer = await slackStandIn.waitForCall((call) => call.path === '/respond/thread-1');
    expect(JSON.stringify(answer.body)).toContain(SAFETY_FOOTER.slice(0, 40));
    await slackStandIn.waitForCall((call) => call.path.includes('files.completeUploadExternal'));
    expect(router.commands.at(-1)).toMatchObject({ platform: 'slack', text: 'Cinder Flats' });
  });

  it('defers a Discord command, then edits the reply with the answer and its PNG', async () => {
    const { token } = discordStandIn.sendCommand(discordCommandName(), 'Cinder Flats');
    await discordStandIn.waitForCall((call) => call.method === 'POST' && call.path.includes(`/interactions/`) && call.path.includes(token));
    const edit = await discordStandIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(token));
    expect(edit.body['files[0]']).toMatchObject({ fileName: 'mixing-48h.png' });
  });

  it('serves a route whose text this thread makes', async () => {
    const response = await fetch(`http://127.0.0.1:${receivers.slack!.port}/metrics`);
    expect(await response.text()).toBe('lapsewatch_thread_metric 7\n');
  });

  it('replaces a receiver thread that dies, and the next command is answered', async () => {
    const before = receivers.currentWorker();
    await before.terminate();
    const deadline = Date.now() + 20_000;
    while ((receivers.currentWorker() === before || receivers.restarts() === 0 || !logged.some((line) => line.includes('restarted'))) && Date.now() < deadline) {
      await new Promise((resolve) => setTimeout(resolve, 50));
    }
    expect(receivers.restarts()).toBe(1);
    expect(logged.some((line) => line.startsWith('error: chat receiver thread exited'))).toBe(true);
    // Port 0 was asked for, so the new receiver listens on a port of its own.
    const ack = await postSigned(eventsUrl(), slashCommandForm(slackCommandName(), 'Cinder Flats', slackStandIn.responseUrl('thread-2')), { secret });
    expect(ack.status).toBe(200);
    await slackStandIn.waitForCall((call) => call.path === '/respond/thread-2');
  });
});
