// Chat load on loopback: 200 slash commands at the Slack HTTP receiver and 200 interactions
// through the Discord stand-in gateway, 20 at a time. Prints acknowledgement and full-answer
// latency (median, p95, p99) and the share acknowledged inside Slack's and Discord's 3 s.
// Run: npx tsx bench/chatLoad.ts. Bounded: each platform stops at 25 s whatever happens.
import { cpus, loadavg } from 'node:os';
import { pathToFileURL } from 'node:url';
import { LogLevel } from '@slack/bolt';
import { startSlackApp } from '../adapters/slack/index.ts';
import { slackCommandName } from '../adapters/slack/slackCommandName.ts';
import { startDiscordBot } from '../adapters/discord/index.ts';
import { discordCommandName } from '../adapters/discord/commands.ts';
import type { CommandRouter } from '../src/router/routerTypes.ts';
import { RouterDouble } from '../test/adapters/routerDouble.ts';
import { startSlackStandIn } from '../test/adapters/slackStandIn.ts';
import { postSigned, slashCommandForm } from '../test/adapters/slackSigning.ts';
import { standInApplicationId, startDiscordStandIn } from '../test/adapters/discordStandIn.ts';

export interface ChatLoadOptions {
  /** The router under load; the test double (fixed answer with a PNG) until the real one is wired. */
  makeRouter?: () => CommandRouter;
  total?: number;
  concurrency?: number;
  /** Per-platform bound. */
  deadlineMs?: number;
  platforms?: Array<'slack' | 'discord'>;
  /** Whether the router's answers carry a PNG (the default double's do); Slack then waits for the upload too. */
  withImage?: boolean;
}

interface Sample {
  ackMs: number;
  fullMs: number;
}

const ACK_WINDOW_MS = 3_000;

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  const rank = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[rank]!;
}

function report(platform: string, total: number, samples: Sample[], failures: number, wallMs: number, cpu: NodeJS.CpuUsage): void {
  const acks = samples.map((s) => s.ackMs).sort((a, b) => a - b);
  const fulls = samples.map((s) => s.fullMs).sort((a, b) => a - b);
  const inWindow = samples.filter((s) => s.ackMs <= ACK_WINDOW_MS).length;
  const f = (n: number) => `${n.toFixed(1)} ms`;
  console.log(`${platform}: ${samples.length}/${total} answered, ${failures} failed, wall ${(wallMs / 1000).toFixed(2)} s`);
  console.log(`  acknowledgement  median ${f(percentile(acks, 50))}  p95 ${f(percentile(acks, 95))}  p99 ${f(percentile(acks, 99))}  max ${f(acks.at(-1) ?? Number.NaN)}`);
  console.log(`  full answer      median ${f(percentile(fulls, 50))}  p95 ${f(percentile(fulls, 95))}  p99 ${f(percentile(fulls, 99))}  max ${f(fulls.at(-1) ?? Number.NaN)}`);
  console.log(`  acknowledged inside 3 s: ${((100 * inWindow) / total).toFixed(1)} % (${inWindow}/${total})`);
  // Adapter, client library and stand-in share this one process: CPU per command, whatever the machine's load.
  console.log(`  process CPU per command (adapter + library + stand-in + load generator): ${((cpu.user + cpu.system) / 1000 / Math.max(1, samples.length)).toFixed(2)} ms`);
}

/** Runs `count` jobs, `concurrency` at a time, stopping new ones at the deadline. */
async function pool(count: number, concurrency: number, deadline: number, job: (index: number) => Promise<void>): Promise<void> {
  let next = 0;
  const worker = async () => {
    while (next < count && Date.now() < deadline) await job(next++);
  };
  await Promise.all(Array.from({ length: concurrency }, worker));
}

function waitUntil(promise: Promise<number>, deadline: number): Promise<number> {
  return Promise.race([promise, new Promise<number>((_, reject) => setTimeout(() => reject(new Error('deadline')), Math.max(0, deadline - Date.now())).unref())]);
}

async function slackLoad(options: Required<ChatLoadOptions>): Promise<void> {
  const withImage = options.withImage;
  const secret = 'bench-signing-secret';
  const standIn = await startSlackStandIn();
  const slack = await startSlackApp({ router: options.makeRouter(), botToken: 'xoxb-bench', signingSecret: secret, apiUrl: standIn.apiUrl, port: 0, host: '127.0.0.1', logLevel: LogLevel.ERROR });
  // The full answer is the response-URL post and, with an image, the finished upload into the channel.
  const answered = new Map<string, (at: number) => void>();
  const uploaded = new Map<string, (at: number) => void>();
  standIn.onCall((call) => {
    if (call.path.startsWith('/respond/')) answered.get(call.path.slice('/respond/'.length))?.(performance.now());
    if (call.path === '/api/files.completeUploadExternal') uploaded.get(call.body?.channel_id)?.(performance.now());
  });
  const url = `http://127.0.0.1:${slack.port}/slack/events`;
  const samples: Sample[] = [];
  let failures = 0;
  const started = performance.now();
  const cpuAtStart = process.cpuUsage();
  const deadline = Date.now() + options.deadlineMs;
  try {
    await pool(options.total, options.concurrency, deadline, async (index) => {
      const id = `bench-${index}`;
      const channelId = `CBENCH${index}`;
      const responded = new Promise<number>((resolve) => answered.set(id, resolve));
      const imaged = new Promise<number>((resolve) => uploaded.set(channelId, resolve));
      const t0 = performance.now();
      try {
        const form = slashCommandForm(slackCommandName(), `44.${index}N,121.3W`, standIn.responseUrl(id), channelId);
        const ack = await postSigned(url, form, { secret });
        const ackAt = performance.now();
        if (ack.status !== 200) throw new Error(`ack ${ack.status}`);
        const fullAt = Math.max(await waitUntil(responded, deadline), withImage ? await waitUntil(imaged, deadline) : 0);
        samples.push({ ackMs: ackAt - t0, fullMs: fullAt - t0 });
      } catch {
        failures += 1;
      }
    });
  } finally {
    report('Slack HTTP receiver', options.total, samples, failures, performance.now() - started, process.cpuUsage(cpuAtStart));
    await slack.stop();
    await standIn.stop();
  }
}

async function discordLoad(options: Required<ChatLoadOptions>): Promise<void> {
  const standIn = await startDiscordStandIn();
  const bot = await startDiscordBot({ router: options.makeRouter(), token: 'bench.discord.token', applicationId: standInApplicationId, apiUrl: standIn.apiUrl, log: () => {} });
  const deferred = new Map<string, (at: number) => void>();
  const edited = new Map<string, (at: number) => void>();
  standIn.onCall((call) => {
    const callback = /\/interactions\/\d+\/([^/]+)\/callback$/.exec(call.path);
    if (callback) deferred.get(callback[1]!)?.(performance.now());
    const edit = /\/webhooks\/\d+\/([^/]+)\/messages\/@original$/.exec(call.path);
    if (edit) edited.get(edit[1]!)?.(performance.now());
  });
  const samples: Sample[] = [];
  let failures = 0;
  const started = performance.now();
  const cpuAtStart = process.cpuUsage();
  const deadline = Date.now() + options.deadlineMs;
  try {
    await pool(options.total, options.concurrency, deadline, async (index) => {
      // Tokens are made by the stand-in; register the waiters under the token it will use.
      let resolveAck!: (at: number) => void;
      let resolveFull!: (at: number) => void;
      const ack = new Promise<number>((resolve) => (resolveAck = resolve));
      const full = new Promise<number>((resolve) => (resolveFull = resolve));
      const t0 = performance.now();
      const { token } = standIn.sendCommand(discordCommandName(), `44.${index}N,121.3W`);
      deferred.set(token, resolveAck);
      edited.set(token, resolveFull);
      try {
        const ackAt = await waitUntil(ack, deadline);
        const fullAt = await waitUntil(full, deadline);
        samples.push({ ackMs: ackAt - t0, fullMs: fullAt - t0 });
      } catch {
        failures += 1;
      }
    });
  } finally {
    report('Discord gateway interactions', options.total, samples, failures, performance.now() - started, process.cpuUsage(cpuAtStart));
    await bot.stop();
    await standIn.stop();
  }
}

export async function runChatLoadBench(options: ChatLoadOptions = {}): Promise<void> {
  const settings: Required<ChatLoadOptions> = {
    makeRouter: options.makeRouter ?? (() => new RouterDouble({ withImage: options.withImage ?? true })),
    withImage: options.withImage ?? true,
    total: options.total ?? 200,
    concurrency: options.concurrency ?? 20,
    deadlineMs: options.deadlineMs ?? 25_000,
    platforms: options.platforms ?? ['slack', 'discord'],
  };
  console.log(`chat load: ${settings.total} commands per platform, ${settings.concurrency} at a time, loopback`);
  // Latency on a shared machine says as much about its load as about us: print the load beside it.
  console.log(`  machine: ${cpus().length} CPUs, load average ${loadavg().map((n) => n.toFixed(1)).join(' / ')}`);
  if (settings.platforms.includes('slack')) await slackLoad(settings);
  if (settings.platforms.includes('discord')) await discordLoad(settings);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  await runChatLoadBench();
}
