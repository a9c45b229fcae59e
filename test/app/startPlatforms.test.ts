// `npm start` with Slack and Discord credentials, as a workspace admin runs it: the whole bot in a
// child process (compiled build when current), its Slack Web API, response URLs and Discord REST and
// gateway pointed at the stand-ins on 127.0.0.1 through the platforms' usual variables. A command
// on each platform is answered at the wire with the footer and the picture; /healthz and /metrics
// answer on the receiver's port; SIGTERM stops it cleanly.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { discordCommandName } from '../../adapters/discord/commands.ts';
import { slackCommandName } from '../../adapters/slack/slackCommandName.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { DiscordStandIn, standInApplicationId, startDiscordStandIn } from '../adapters/discordStandIn.ts';
import { startSlackStandIn, type SlackStandIn } from '../adapters/slackStandIn.ts';
import { postSigned, slashCommandForm } from '../adapters/slackSigning.ts';

const BIN = join(import.meta.dirname, '../../bin/lapsewatch.mjs');
const secret = 'invented-signing-secret';

function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as { port: number };
      server.close(() => resolve(port));
    });
  });
}

async function waitForHealth(port: number, deadlineMs: number): Promise<void> {
  while (Date.now() < deadlineMs) {
    try {
      if ((await fetch(`http://127.0.0.1:${port}/healthz`)).status === 200) return;
    } catch {
      /* not listening yet */
    }
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
  throw new Error('the bot did not answer /healthz in time');
}

describe('npm start with Slack and Discord credentials', { timeout: 90_000 }, () => {
  let slackStandIn: SlackStandIn;
  let discordStandIn: DiscordStandIn;
  let bot: ChildProcess;
  let port: number;
  let stderr = '';
  let log = '';
  let dataDir: string;

  beforeAll(async () => {
    slackStandIn = await startSlackStandIn();
    discordStandIn = await startDiscordStandIn();
    port = await freePort();
    dataDir = mkdtempSync(join(tmpdir(), 'lapsewatch-start-platforms-'));
    bot = spawn(process.execPath, [BIN, 'start'], {
      cwd: dataDir,
      env: {
        ...process.env,
        LAPSEWATCH_DATA_DIR: dataDir,
        LAPSEWATCH_HTTP_PORT: String(port),
        LAPSEWATCH_LOG_LEVEL: 'info',
        SLACK_BOT_TOKEN: 'xoxb-invented',
        SLACK_SIGNING_SECRET: secret,
        SLACK_APP_TOKEN: '',
        SLACK_API_URL: slackStandIn.apiUrl,
        DISCORD_TOKEN: 'invented.discord.token',
        DISCORD_APPLICATION_ID: standInApplicationId,
        DISCORD_API_URL: discordStandIn.apiUrl,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    bot.stdout!.on('data', (chunk) => (log += chunk));
    bot.stderr!.on('data', (chunk) => (stderr += chunk));
    await waitForHealth(port, Date.now() + 60_000);
    await discordStandIn.identified(30_000);
  }, 90_000);

  afterAll(async () => {
    if (bot && bot.exitCode === null) bot.kill('SIGKILL');
    await discordStandIn?.stop();
    await slackStandIn?.stop();
    if (dataDir) rmSync(dataDir, { recursive: true, force: true });
  });

  it('answers a Slack command at the response URL with the footer, and uploads the chart', async () => {
    const ack = await postSigned(`http://127.0.0.1:${port}/slack/events`, slashCommandForm(slackCommandName(), 'Kestrel Bench ICP', slackStandIn.responseUrl('start-1')), { secret });
    expect(ack.status).toBe(200);
    const answer = await slackStandIn.waitForCall((call) => call.path === '/respond/start-1', 30_000);
    expect(JSON.stringify(answer.body)).toContain(SAFETY_FOOTER.slice(0, 40));
    expect(JSON.stringify(answer.body)).toMatch(/Kestrel Bench ICP/);
    await slackStandIn.waitForCall((call) => call.path === '/api/files.completeUploadExternal', 30_000);
  });

  it('answers a Discord command by editing the deferred reply, with the picture attached', async () => {
    const { token } = discordStandIn.sendCommand(discordCommandName(), 'Kestrel Bench ICP');
    const edit = await discordStandIn.waitForCall((call) => call.method === 'PATCH' && call.path.includes(token), 30_000);
    expect(edit.status).toBe(200);
    expect(JSON.stringify(DiscordStandIn.payloadOf(edit))).toContain(SAFETY_FOOTER.slice(0, 40));
    expect(edit.body['files[0]']).toMatchObject({ fileName: 'mixing-48h.png' });
    // The deferral went over the HTTP/2 connection the receiver thread opened at start.
    const callback = discordStandIn.calls.find((call) => call.path.endsWith(`/${token}/callback`));
    expect(callback?.httpVersion).toBe('2.0');
  });

  it('serves Prometheus metrics made by the main thread on the receiver port', async () => {
    const text = await (await fetch(`http://127.0.0.1:${port}/metrics`)).text();
    expect(text).toMatch(/^# HELP lapsewatch_/m);
  });

  it('warmed the Slack receiver before it was ready: Bolt acknowledged every request it sent itself', () => {
    expect(log + stderr).toMatch(/slack receiver warmed up: 150 of 150 signed requests to itself acknowledged/);
  });

  it('stops cleanly on SIGTERM', async () => {
    const exited = new Promise<number | null>((resolve) => bot.once('exit', resolve));
    bot.kill('SIGTERM');
    expect(await exited).toBe(0);
    expect(stderr).not.toMatch(/"level":(50|60)/);
  });
});
