// Slack (Socket Mode, which loads undici 7 and its global dispatcher) and Discord in one process,
// as `npm start` runs them: a Discord reply with a PNG attachment and a Discord post with one
// must still arrive. Without adapters/discord/fetchRequest.ts both fail inside undici.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { LogLevel } from '@slack/bolt';
import { startSlackApp, type RunningSlackApp } from '../../adapters/slack/index.ts';
import { createDiscordPoster, startDiscordBot, type RunningDiscordBot } from '../../adapters/discord/index.ts';
import { discordCommandName } from '../../adapters/discord/commands.ts';
import { slackCommandName } from '../../adapters/slack/slackCommandName.ts';
import { fixedLookup, RouterDouble } from './routerDouble.ts';
import { DiscordStandIn, standInApplicationId, standInChannelId, startDiscordStandIn } from './discordStandIn.ts';
import { startSlackStandIn, type SlackStandIn } from './slackStandIn.ts';
import { slashCommandForm } from './slackSigning.ts';

describe('Slack and Discord in one process', () => {
  let slackStandIn: SlackStandIn;
  let discordStandIn: DiscordStandIn;
  let slack: RunningSlackApp;
  let discord: RunningDiscordBot;
  const router = new RouterDouble({ withImage: true });
  const logged: string[] = [];

  beforeAll(async () => {
    slackStandIn = await startSlackStandIn({ socketMode: true });
    discordStandIn = await startDiscordStandIn();
    slack = await startSlackApp({ router, botToken: 'xoxb-invented', appToken: 'xapp-invented', apiUrl: slackStandIn.apiUrl, port: 0, host: '127.0.0.1', logLevel: LogLevel.ERROR });
    await slackStandIn.socketConnected();
    discord = await startDiscordBot({ router, token: 'invented', applicationId: standInApplicationId, apiUrl: discordStandIn.apiUrl, log: (level, text) => logged.push(`${level}: ${text}`) });
  });

  afterAll(async () => {
    await discord?.stop();
    await slack?.stop();
    await discordStandIn?.stop();
    await slackStandIn?.stop();
  });

  it('a Slack command still works', async () => {
    await slackStandIn.sendEnvelope('slash_commands', slashCommandForm(slackCommandName(), 'Cinder Flats', slackStandIn.responseUrl('both-1')));
    await slackStandIn.waitForCall((call) => call.path === '/respond/both-1');
  });

  it('a Discord reply carries its PNG attachment', async () => {
    const { token } = discordStandIn.sendCommand(discordCommandName(), 'Cinder Flats');
    const edit = await discordStandIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(token));
    expect(edit.body['files[0]']).toMatchObject({ fileName: 'mixing-48h.png' });
    expect(logged).toEqual([]);
  });

  it('a Discord post with an image is delivered', async () => {
    const poster = createDiscordPoster({ token: 'invented', apiUrl: discordStandIn.apiUrl });
    const outcome = await poster.post({ platform: 'discord', teamId: '', channelId: standInChannelId }, fixedLookup('summary', true), 'both:summary');
    expect(outcome).toMatchObject({ ok: true });
  });
});
