// The Slack HTTP receiver's start-up warm-up, at the wire: the real Bolt app on 127.0.0.1 verifies
// and acknowledges the signed requests it sends itself, and none of them reaches the router or Slack.
import { createServer } from 'node:net';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LogLevel } from '@slack/bolt';
import { startSlackApp, type RunningSlackApp } from '../../adapters/slack/index.ts';
import { slackCommandName } from '../../adapters/slack/slackCommandName.ts';
import { warmUpResponseUrl, warmUpSlackReceiver } from '../../adapters/slack/warmUpSlackReceiver.ts';
import { RouterDouble } from './routerDouble.ts';
import { startSlackStandIn, type SlackStandIn } from './slackStandIn.ts';
import { postSigned, slashCommandForm } from './slackSigning.ts';

const secret = 'invented-signing-secret';

describe('Slack receiver warm-up at start', () => {
  let standIn: SlackStandIn;
  let router: RouterDouble;
  let slack: RunningSlackApp;

  beforeAll(async () => {
    standIn = await startSlackStandIn();
    router = new RouterDouble();
    slack = await startSlackApp({ router, botToken: 'xoxb-invented', signingSecret: secret, apiUrl: standIn.apiUrl, port: 0, host: '127.0.0.1', logLevel: LogLevel.ERROR, warmUpRequests: 30 });
  });

  afterAll(async () => {
    await slack?.stop();
    await standIn?.stop();
  });

  it('has Bolt acknowledge every request it sent itself (commands and button presses) before the start resolves', () => {
    // Bolt answers 401 to a bad signature and 404 to an unknown path: 30 of 30 means all went the real way.
    expect(slack.warmUp).toMatchObject({ sent: 30, acknowledged: 30, firstProblem: null });
  });

  it('hands none of them to the router and posts nothing to Slack', () => {
    expect(router.commands).toHaveLength(0);
    expect(router.actions).toHaveLength(0);
    expect(standIn.callsTo(/^\/respond\/|chat\.postMessage|files\./)).toHaveLength(0);
  });

  it('hands real commands over as before', async () => {
    const ack = await postSigned(`http://127.0.0.1:${slack.port}/slack/events`, slashCommandForm(slackCommandName(), 'help', standIn.responseUrl('after-warm-up')), { secret });
    expect(ack.status).toBe(200);
    await standIn.waitForCall((call) => call.path === '/respond/after-warm-up');
    expect(router.commands.map((command) => command.text)).toEqual(['help']);
  });
});

describe('Slack receiver warm-up on the default address (all interfaces, as npm start listens)', () => {
  it('reaches the receiver over loopback', async () => {
    const standIn = await startSlackStandIn();
    const slack = await startSlackApp({ router: new RouterDouble(), botToken: 'xoxb-invented', signingSecret: secret, apiUrl: standIn.apiUrl, port: 0, logLevel: LogLevel.ERROR, warmUpRequests: 10 });
    try {
      expect(slack.warmUp).toMatchObject({ sent: 10, acknowledged: 10, firstProblem: null });
    } finally {
      await slack.stop();
      await standIn.stop();
    }
  });
});

describe('Slack receiver warm-up that cannot reach its receiver', () => {
  it('says why, within its time limit, and does not throw', async () => {
    // A port that was free a moment ago: nothing listens on it.
    const probe = createServer();
    await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', () => resolve()));
    const address = probe.address() as AddressInfo;
    await new Promise<void>((resolve) => probe.close(() => resolve()));

    const result = await warmUpSlackReceiver({ address, path: '/slack/events', signingSecret: secret, commandName: slackCommandName(), responseUrl: warmUpResponseUrl(), actionId: 'show-detail', requests: 12 });
    expect(result).toMatchObject({ sent: 12, acknowledged: 0 });
    expect(result.firstProblem).toMatch(/ECONNREFUSED/);
  });
});
