// Chat load on loopback: 200 slash commands at the Slack HTTP receiver and 200 interactions
// through the Discord stand-in gateway, 20 at a time. Prints acknowledgement and full-answer
// latency (median, p95, p99) and the share acknowledged inside Slack's and Discord's 3 s, for the
// real command router (SQLite store, demo source behind the forecast cache, shipped rules, images on)
// and, side by side, for the router double (fixed answer with a tiny PNG), so the figures separate
// what the adapters cost from what the router and its pictures cost. The platform stand-ins and the
// load generator run in a child process (chatLoadProcess.ts), so this process holds only the bot
// (the Bolt app or the discord.js client, and the router): its CPU and memory are the bot's. The
// child still shares the bot's cores, so the Slack generator is a bare HTTP client
// (keepAliveCaller.ts) that takes as little of them as it can.
// Each is run twice: with the receivers in their own worker thread, as `npm start` runs them, and
// with everything in one thread, so the two sit side by side.
// The Slack receiver makes its start-up warm-up (adapters/slack/warmUpSlackReceiver.ts) before the
// clock, as under npm start.
// Run: npx tsx bench/chatLoad.ts [--real-only] (LAPSEWATCH_BENCH_OPEN_CONNECTIONS=1: Slack's
// connections opened before the clock, see openConnectionsFirst; LAPSEWATCH_BENCH_SLACK_WARM_UP=N:
// another number of warm-up requests, 0 for none). Bounded: each run stops at its deadline whatever
// happens, and the child stops itself after 150 s.
import { mkdtempSync, rmSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { LogLevel } from '@slack/bolt';
import { startSlackApp } from '../adapters/slack/index.ts';
import { slackCommandName } from '../adapters/slack/slackCommandName.ts';
import { startDiscordBot } from '../adapters/discord/index.ts';
import { WARM_UP_ROUNDS, warmUpAssessment } from '../src/app/warmUpAssessment.ts';
import { startReceiverThread } from '../adapters/receiverThread/startReceiverThread.ts';
import { describeWarmUp, RECEIVER_WARM_UP_REQUESTS } from '../adapters/slack/warmUpSlackReceiver.ts';
import { discordCommandName } from '../adapters/discord/commands.ts';
import { ANSWER_THREAD_NICE } from '../src/app/botRuntime.ts';
import { buildForecastSource } from '../src/app/buildForecastSource.ts';
import { parseAppConfig } from '../src/config/appConfig.ts';
import { DEFAULT_ANSWERS_AT_ONCE } from '../src/config/answersAtOnce.ts';
import { DEMO_PLACES } from '../src/forecast/demoPlaces.ts';
import { drawMixingChartSvg } from '../src/render/mixingChart.ts';
import { PngCache } from '../src/render/pngCache.ts';
import { rasterizeCacheStats, rasterizeSvgToPng, resetRasterizeCache } from '../src/render/rasterizePng.ts';
import { drawSkewTSvg } from '../src/render/skewTDiagram.ts';
import { assessSeries } from '../src/watch/assessSeries.ts';
import type { Message } from '../src/render/message.ts';
import { createCommandRouter } from '../src/router/createCommandRouter.ts';
import type { CommandRouter } from '../src/router/routerTypes.ts';
import { openStore } from '../src/store/openStore.ts';
import { loadRulesFile } from '../src/watch/rules/loadRules.ts';
import { RouterDouble } from '../test/adapters/routerDouble.ts';
import { nodeFlagsFromEnvironment, startChild, type ChildLink } from './childLink.ts';
import { memorySampler } from './childSide.ts';
import type { LoadAnswer, LoadRequest } from './chatLoadProcess.ts';

type RouterKind = 'real' | 'double';
/** Where the receivers run: their own worker thread (as `npm start` runs them) or the router's thread. */
type Threading = 'receiver-thread' | 'same-thread';
type PlatformName = 'slack' | 'discord';

export interface ChatLoadOptions {
  /** Which routers to load, in order; the real one first so the double's figures sit beside it. */
  routers?: RouterKind[];
  total?: number;
  concurrency?: number;
  /** Per-run bound (one router on one platform). */
  deadlineMs?: number;
  platforms?: PlatformName[];
  threadings?: Threading[];
}

interface Sample {
  /** Position in the run: the first `concurrency` commands are the ones that meet cold pictures. */
  index: number;
  ackMs: number;
  fullMs: number;
}

interface RunResult extends Measured {
  router: RouterKind;
  threading: Threading;
  platform: PlatformName;
  total: number;
  loadAverage1m: number;
  /** What the router answered: kinds and pictures, so a run of error replies cannot pass for a fast one. */
  answers: string;
}

/** A router under load, with whatever it holds open. */
interface RouterUnderLoad {
  router: CommandRouter;
  close: () => Promise<void>;
}

const ACK_WINDOW_MS = 3_000;
// The demo source's clock is fixed, like the router tests', so that "detail … 15" is always inside
// the 48 hours and every run sees the same invented forecast.
const NOW_MS = Date.parse('2026-08-14T15:00:00Z');
const HOUR_MS = 3_600_000;
const FORECAST_HOURS = 48;

/** The command mix: lookups of the three demo places and one detail view (skew-T) in five. */
const COMMAND_MIX = ['Kestrel Bench ICP', 'Sawback Lookout', 'Alder Sink', 'detail Kestrel Bench ICP 15', 'Sawback Lookout'];
/**
 * Untimed commands per run before the clock starts, as a bot that has been up a while has seen:
 * help, and a lookup and a detail view of a point none of the timed commands asks for. They load
 * the code paths (modules, JIT, the store's statements, the rasteriser and its fonts) but warm none
 * of the timed commands' forecasts, assessments or pictures: those meet their caches cold. Before
 * them, each run makes the same assessment warm-up `npm start` makes when a chat platform is
 * configured (src/app/warmUpAssessment.ts), so the first run in this process is not the only one
 * that meets the core uncompiled.
 */
const WARM_UP_COMMANDS = ['help', '44.30,-116.90', 'detail 44.30,-116.90 15'];

/** The real router as the app assembles it: SQLite in a temp folder, demo source behind the cache, shipped rules. */
async function realRouter(): Promise<RouterUnderLoad> {
  await warmUpAssessment();
  const folder = mkdtempSync(join(tmpdir(), 'lapsewatch-bench-'));
  const store = await openStore({ url: `sqlite:${join(folder, 'store.db')}` });
  const config = parseAppConfig({}, 'bench');
  if (!config.ok) throw new Error(config.error);
  const source = buildForecastSource(config.config.forecast, () => NOW_MS);
  const rules = await loadRulesFile();
  if (!rules.ok) throw new Error(JSON.stringify(rules.problems));
  // Warm the forecast cache with exactly the locations the router will ask for (named demo places).
  const window = { startTime: new Date(Math.floor(NOW_MS / HOUR_MS) * HOUR_MS).toISOString(), hours: FORECAST_HOURS };
  for (const place of DEMO_PLACES) {
    const warmed = await source.source.fetchSeries({ latitude: place.latitude, longitude: place.longitude, name: place.name, elevationM: place.elevationM }, window);
    if (!warmed.ok) throw new Error(`could not warm the forecast cache: ${warmed.error.message}`);
  }
  const router = createCommandRouter(
    {
      store,
      source: source.source,
      forecastHours: FORECAST_HOURS,
      findNamedPlace: source.findNamedPlace,
      suggestedPlaceNames: source.suggestedPlaceNames,
      channelDefaults: { unitSystem: config.config.channelDefaults.unitSystem, summaryLocalTime: config.config.channelDefaults.summaryLocalTime },
      defaultRules: rules.rules,
      commandPrefix: (platform) => (platform === 'slack' ? slackCommandName() : platform === 'discord' ? `/${discordCommandName()}` : ''),
      nowMs: () => NOW_MS,
    },
    (error, what) => console.error(`  router fault (${what}): ${String(error)}`),
  );
  return {
    router,
    close: async () => {
      await store.close();
      rmSync(folder, { recursive: true, force: true });
    },
  };
}

/** Passes every call through unchanged and notes what came back, so the report says what was answered. */
class AnswerLog implements CommandRouter {
  readonly kinds = new Map<string, number>();
  images = 0;
  /** The rasteriser's counters when timing started (after the warm-up). */
  picturesAtStart = rasterizeCacheStats();

  constructor(private readonly inner: CommandRouter) {}

  async handleCommand(request: Parameters<CommandRouter['handleCommand']>[0]): Promise<Message> {
    const message = await this.inner.handleCommand(request);
    this.note(message);
    return message;
  }

  async handleAction(request: Parameters<CommandRouter['handleAction']>[0]): Promise<Message> {
    const message = await this.inner.handleAction(request);
    this.note(message);
    return message;
  }

  private note(message: Message): void {
    this.kinds.set(message.kind, (this.kinds.get(message.kind) ?? 0) + 1);
    this.images += message.images.length;
  }

  /** Forgets the warm-up: from here on only timed commands are counted. */
  startTiming(): void {
    this.kinds.clear();
    this.images = 0;
    this.picturesAtStart = rasterizeCacheStats();
  }

  summary(): string {
    return `${[...this.kinds].map(([kind, count]) => `${count} ${kind}`).join(', ')}; ${this.images} images`;
  }
}

function percentile(sorted: number[], p: number): number {
  if (sorted.length === 0) return Number.NaN;
  const rank = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[rank]!;
}

interface Measured {
  samples: Sample[];
  failures: number;
  wallMs: number;
  /** This process's CPU (the bot alone) per answered command. */
  cpuMsPerCommand: number;
  /** This process's rss high-water mark during the timed commands (sampled every 25 ms). */
  botPeakRssMb: number;
  /** The child's CPU (stand-in and load generator) per answered command, for comparison. */
  childCpuMsPerCommand: number;
  firstFailure: string | null;
}

/**
 * The untimed warm-up, then the timed commands, both fired by the child; the bot's CPU and memory
 * are read here, around the timed part only.
 */
async function driveLoad(
  child: ChildLink,
  log: AnswerLog,
  options: Required<ChatLoadOptions>,
  base: Omit<LoadRequest, 'texts' | 'total' | 'concurrency' | 'deadlineMs' | 'warmUp'>,
  openConnections = false,
): Promise<Measured> {
  const askTimeoutMs = options.deadlineMs + 10_000;
  const warm = await child.ask<LoadAnswer>({ cmd: 'load', ...base, texts: WARM_UP_COMMANDS, total: WARM_UP_COMMANDS.length, concurrency: 1, deadlineMs: options.deadlineMs, warmUp: true }, askTimeoutMs);
  if (warm.failures > 0) throw new Error(`warm-up failed: ${warm.firstFailure}`);
  if (openConnections) {
    // One untimed "help" per caller, at once: each leaves a keep-alive connection open for its timed commands.
    const opened = await child.ask<LoadAnswer>({ cmd: 'load', ...base, texts: ['help'], total: options.concurrency, concurrency: options.concurrency, deadlineMs: options.deadlineMs, warmUp: true }, askTimeoutMs);
    if (opened.failures > 0) throw new Error(`opening connections failed: ${opened.firstFailure}`);
  }
  log.startTiming();
  const memory = memorySampler(25);
  const cpuAtStart = process.cpuUsage();
  const timed = await child.ask<LoadAnswer>(
    { cmd: 'load', ...base, texts: COMMAND_MIX, total: options.total, concurrency: options.concurrency, deadlineMs: options.deadlineMs, warmUp: false },
    askTimeoutMs,
  );
  const cpu = process.cpuUsage(cpuAtStart);
  const botPeakRssMb = memory.peakRssMb();
  memory.stop();
  return {
    samples: timed.samples,
    failures: timed.failures,
    wallMs: timed.wallMs,
    cpuMsPerCommand: (cpu.user + cpu.system) / 1000 / Math.max(1, timed.samples.length),
    botPeakRssMb,
    childCpuMsPerCommand: timed.cpuMsPerCommand,
    firstFailure: timed.firstFailure,
  };
}

/**
 * LAPSEWATCH_BENCH_OPEN_CONNECTIONS=1: the Slack callers open their keep-alive connections to the
 * receiver before the clock, as behind a proxy that keeps its upstream connections, instead of the
 * first timed burst opening 20 at once. Off by default: new connections are the harder case, and
 * the one the goals are held to (Discord's interactions all come over the one gateway connection).
 */
function openConnectionsFirst(): boolean {
  return process.env.LAPSEWATCH_BENCH_OPEN_CONNECTIONS === '1';
}

/** As npm start sets it; LAPSEWATCH_BENCH_ANSWER_NICE=N tries another (printed in the header). */
function answerThreadNice(): number {
  const tried = process.env.LAPSEWATCH_BENCH_ANSWER_NICE;
  return tried === undefined ? ANSWER_THREAD_NICE : Number(tried);
}

/**
 * Node flags of the load side (the stand-ins and the load generator, chatLoadProcess.ts). Discord's
 * acks are timed there, on the stand-in's thread, so a stall of that thread is counted as the bot's.
 * A scratch trace (each ack's times on both sides of the wire, and the load side's GC) found, with
 * Node's default flags, clusters of acks timed 30-50 ms late that the bot had sent within 1 ms, in 5
 * of 7 runs, beside scavenges of 5-22 ms; with a 1 MB semi-space (as the bot has) no such cluster in
 * 17 runs, the slowest acks all in the first burst. LAPSEWATCH_BENCH_LOAD_SIDE_FLAGS="..." tries
 * others ("" for none).
 */
const LOAD_SIDE_NODE_FLAGS = ['--max-semi-space-size=1'];
function loadSideNodeFlags(): readonly string[] {
  return nodeFlagsFromEnvironment('LAPSEWATCH_BENCH_LOAD_SIDE_FLAGS', LOAD_SIDE_NODE_FLAGS);
}

/** As npm start warms the Slack receiver; LAPSEWATCH_BENCH_SLACK_WARM_UP=N tries another (0: none). */
function slackWarmUpRequests(): number {
  const tried = process.env.LAPSEWATCH_BENCH_SLACK_WARM_UP;
  return tried === undefined ? RECEIVER_WARM_UP_REQUESTS : Number(tried);
}

/**
 * As npm start sends Discord's interaction callbacks: over one HTTP/2 connection opened at start
 * (adapters/http/http2Origin.ts). LAPSEWATCH_BENCH_DISCORD_HTTP1=1 sends each over HTTP/1.1, as
 * before, for comparison.
 */
function discordCallbacksOverHttp2(): boolean {
  return process.env.LAPSEWATCH_BENCH_DISCORD_HTTP1 !== '1';
}

/** The receiver's own warm-up, as it reported it: printed under the table. */
const receiverWarmUps: string[] = [];

const THREAD_LOG = (level: string, text: string): void => {
  if (text.includes('receiver warmed up')) receiverWarmUps.push(text);
  else if (level !== 'info') console.error(`  receiver thread ${level}: ${text}`);
};

async function slackLoad(log: AnswerLog, options: Required<ChatLoadOptions>, threading: Threading): Promise<Measured> {
  const secret = 'bench-signing-secret';
  const child = await startChild('chatLoadProcess.ts', ['slack'], 30_000, { nodeFlags: loadSideNodeFlags() });
  try {
    const receiver = { botToken: 'xoxb-bench', signingSecret: secret, apiUrl: String(child.hello.apiUrl), port: 0, host: '127.0.0.1', logLevel: LogLevel.ERROR, warmUpRequests: slackWarmUpRequests() };
    const running =
      threading === 'same-thread'
        ? await startSlackApp({ router: log, ...receiver })
        : await startReceiverThread({ router: log, slack: receiver, log: THREAD_LOG, answerThreadNice: answerThreadNice() });
    if ('warmUp' in running && running.warmUp) receiverWarmUps.push(describeWarmUp(running.warmUp));
    const port = 'port' in running ? running.port : running.slack!.port;
    try {
      return await driveLoad(child, log, options, { commandName: slackCommandName(), botUrl: `http://127.0.0.1:${port}/slack/events`, secret }, openConnectionsFirst());
    } finally {
      await running.stop();
    }
  } finally {
    await child.stop();
  }
}

async function discordLoad(log: AnswerLog, options: Required<ChatLoadOptions>, threading: Threading): Promise<Measured> {
  const child = await startChild('chatLoadProcess.ts', ['discord'], 30_000, { nodeFlags: loadSideNodeFlags() });
  try {
    const receiver = {
      token: 'bench.discord.token',
      applicationId: String(child.hello.applicationId),
      apiUrl: String(child.hello.apiUrl),
      callbacksOverHttp2: discordCallbacksOverHttp2(),
    };
    const running =
      threading === 'same-thread'
        ? await startDiscordBot({ router: log, ...receiver, log: () => {} })
        : await startReceiverThread({ router: log, discord: receiver, log: THREAD_LOG, answerThreadNice: answerThreadNice() });
    try {
      return await driveLoad(child, log, options, { commandName: discordCommandName() });
    } finally {
      await running.stop();
    }
  } finally {
    await child.stop();
  }
}

async function runOne(kind: RouterKind, platform: PlatformName, threading: Threading, options: Required<ChatLoadOptions>): Promise<RunResult> {
  // Each run starts from the same state: a fresh store, the forecast cache warm, no finished picture held.
  resetRasterizeCache();
  const underLoad: RouterUnderLoad = kind === 'real' ? await realRouter() : { router: new RouterDouble({ withImage: true }), close: async () => {} };
  const log = new AnswerLog(underLoad.router);
  const loadAverage1m = loadavg()[0]!;
  try {
    const measured = platform === 'slack' ? await slackLoad(log, options, threading) : await discordLoad(log, options, threading);
    const stats = rasterizeCacheStats();
    const before = log.picturesAtStart;
    const pictures = kind === 'real' ? `; ${stats.rasterized - before.rasterized} rasterised, ${stats.hits - before.hits} from the PNG cache` : '';
    return { router: kind, threading, platform, total: options.total, ...measured, loadAverage1m, answers: `${log.summary()}${pictures}` };
  } finally {
    await underLoad.close();
  }
}

function median(values: number[]): number {
  return percentile([...values].sort((x, y) => x - y), 50);
}

/** One picture rasterised from scratch (a fresh cache each time) against the same picture from the cache, in ms. */
function timeRasterizing(svg: string, coldRuns: number, warmRuns: number): { coldMs: number; cachedMs: number; bytes: number } {
  const cold: number[] = [];
  let bytes = 0;
  for (let run = 0; run < coldRuns; run += 1) {
    const t0 = performance.now();
    const result = rasterizeSvgToPng(svg, new PngCache({ maxEntries: 1, maxBytes: 1 << 24 }));
    cold.push(performance.now() - t0);
    if (result.ok) bytes = result.png.byteLength;
  }
  const cache = new PngCache({ maxEntries: 4, maxBytes: 1 << 24 });
  rasterizeSvgToPng(svg, cache);
  const cached: number[] = [];
  for (let run = 0; run < warmRuns; run += 1) {
    const t0 = performance.now();
    rasterizeSvgToPng(svg, cache);
    cached.push(performance.now() - t0);
  }
  return { coldMs: median(cold), cachedMs: median(cached), bytes };
}

/** The two pictures of the demo's first place, as the router draws them: what one rasterisation costs, and what a cache hit costs. */
async function printPictureFigures(): Promise<void> {
  const config = parseAppConfig({}, 'bench');
  if (!config.ok) throw new Error(config.error);
  const source = buildForecastSource(config.config.forecast, () => NOW_MS);
  const place = DEMO_PLACES[0]!;
  const fetched = await source.source.fetchSeries(
    { latitude: place.latitude, longitude: place.longitude, name: place.name, elevationM: place.elevationM },
    { startTime: new Date(Math.floor(NOW_MS / HOUR_MS) * HOUR_MS).toISOString(), hours: FORECAST_HOURS },
  );
  if (!fetched.ok) throw new Error(fetched.error.message);
  const series = assessSeries(fetched.series, { keepAnalysis: true });
  const hour = series.hours.find((candidate) => candidate.coupled) ?? series.hours[0]!;
  const pictures = [
    ['48-hour chart', drawMixingChartSvg(series, { units: 'metric' })],
    ['skew-T', drawSkewTSvg(hour.analysis!, { units: 'metric', timeZone: series.timeZone, invented: series.invented })],
  ] as const;
  for (const [name, svg] of pictures) {
    const figures = timeRasterizing(svg, 3, 100);
    console.log(
      `  ${name.padEnd(13)} rasterised ${figures.coldMs.toFixed(1).padStart(6)} ms  from the PNG cache ${figures.cachedMs.toFixed(3)} ms  (${Math.round(figures.coldMs / figures.cachedMs)}x; ${(figures.bytes / 1024).toFixed(0)} kB, load 1m ${loadavg()[0]!.toFixed(2)})`,
    );
  }
}

/** "real, own thread": the router, and where the receivers ran. */
function runLabel(r: RunResult): string {
  return `${r.router}, ${r.threading === 'receiver-thread' ? 'own thread' : 'same thread'}`;
}

function printTable(results: RunResult[], concurrency: number): void {
  const ms = (n: number) => (Number.isFinite(n) ? n.toFixed(1) : '-').padStart(7);
  const header = `${'platform'.padEnd(8)} ${'router, receivers'.padEnd(22)} │ ${'ack p50'.padStart(7)} ${'p95'.padStart(7)} ${'p99'.padStart(7)} ${'max'.padStart(7)} ${'<3 s'.padStart(6)} │ ${'full p50'.padStart(8)} ${'p95'.padStart(7)} ${'p99'.padStart(7)} │ ${'ok/total'.padStart(8)} ${'wall s'.padStart(6)} ${'bot CPU ms/cmd'.padStart(14)} ${'load 1m'.padStart(7)}`;
  console.log(`\n${header}\n${'─'.repeat(header.length)}`);
  const row = (platform: string, label: string, samples: Sample[], total: number, rest: string) => {
    const acks = samples.map((s) => s.ackMs).sort((a, b) => a - b);
    const fulls = samples.map((s) => s.fullMs).sort((a, b) => a - b);
    const inWindow = samples.filter((s) => s.ackMs <= ACK_WINDOW_MS).length;
    console.log(
      `${platform.padEnd(8)} ${label.padEnd(22)} │ ${ms(percentile(acks, 50))} ${ms(percentile(acks, 95))} ${ms(percentile(acks, 99))} ${ms(acks.at(-1) ?? Number.NaN)} ${`${((100 * inWindow) / total).toFixed(1)}%`.padStart(6)} │ ${ms(percentile(fulls, 50)).padStart(8)} ${ms(percentile(fulls, 95))} ${ms(percentile(fulls, 99))} │ ${`${samples.length}/${total}`.padStart(8)} ${rest}`,
    );
  };
  for (const r of results) {
    row(r.platform, runLabel(r), r.samples, r.total, `${(r.wallMs / 1000).toFixed(2).padStart(6)} ${r.cpuMsPerCommand.toFixed(2).padStart(14)} ${r.loadAverage1m.toFixed(2).padStart(7)}`);
    // The same run without its first wave, which is where the few cold pictures are rasterised.
    row('', `  after ${concurrency}`, r.samples.filter((s) => s.index >= concurrency), r.total - concurrency, '');
  }
  console.log('(milliseconds; "<3 s" is the share of all commands acknowledged inside 3 s, failures counting as not acknowledged;');
  console.log(` "after ${concurrency}" is the same run without its first ${concurrency} commands, i.e. once every picture has been made)`);
  console.log('Goals: every ack inside 3 s, ack p99 < 50 ms, full-answer p95 < 300 ms with the picture.');
  for (const line of receiverWarmUps) console.log(`  ${line} (before the clock, as npm start does)`);
  for (const r of results) {
    const failed = r.failures > 0 ? ` (first: ${r.firstFailure})` : '';
    console.log(`  ${r.platform} ${runLabel(r)}: ${r.failures} failed${failed}; answers: ${r.answers}; bot rss high-water ${r.botPeakRssMb.toFixed(0)} MB; stand-in + load generator ${r.childCpuMsPerCommand.toFixed(2)} CPU ms/cmd (child process, not the bot's)`);
  }
}

export async function runChatLoadBench(options: ChatLoadOptions = {}): Promise<void> {
  const settings: Required<ChatLoadOptions> = {
    routers: options.routers ?? ['real', 'double'],
    total: options.total ?? 200,
    concurrency: options.concurrency ?? 20,
    deadlineMs: options.deadlineMs ?? 18_000,
    platforms: options.platforms ?? ['slack', 'discord'],
    threadings: options.threadings ?? ['receiver-thread', 'same-thread'],
  };
  console.log(`chat load: ${settings.total} commands per platform and router, ${settings.concurrency} at a time, loopback, forecast cache warm, images on`);
  console.log(`  command mix (repeats): ${COMMAND_MIX.map((text) => `"${text}"`).join(', ')}`);
  console.log(
    openConnectionsFirst()
      ? `  Slack connections: opened before the clock, one per caller, and kept alive (LAPSEWATCH_BENCH_OPEN_CONNECTIONS=1)`
      : `  Slack connections: the first timed burst opens ${settings.concurrency} at once, then they are kept alive (LAPSEWATCH_BENCH_OPEN_CONNECTIONS=1 opens them before the clock)`,
  );
  console.log(
    discordCallbacksOverHttp2()
      ? '  Discord callbacks: streams of one HTTP/2 connection opened at start, as npm start (LAPSEWATCH_BENCH_DISCORD_HTTP1=1 sends each over HTTP/1.1)'
      : '  Discord callbacks: each over HTTP/1.1, a burst opening a connection per callback (LAPSEWATCH_BENCH_DISCORD_HTTP1=1)',
  );
  console.log(`  channels: Slack one per concurrent caller (${settings.concurrency}), Discord the stand-in guild's one; untimed first: ${WARM_UP_COMMANDS.map((text) => `"${text}"`).join(', ')} (a point no timed command asks), after npm start's assessment warm-up (${WARM_UP_ROUNDS} invented series)`);
  // Latency on a shared machine says as much about its load as about us: print the load beside it.
  console.log(`  Slack receiver's start-up warm-up: ${slackWarmUpRequests()} signed requests to itself (npm start: ${RECEIVER_WARM_UP_REQUESTS}; LAPSEWATCH_BENCH_SLACK_WARM_UP=N tries another)`);
  console.log(`  machine: ${cpus().length} CPUs, load average ${loadavg().map((n) => n.toFixed(2)).join(' / ')}`);
  console.log(`  bot process ${process.pid} (this one, TypeScript through tsx): node ${process.execArgv.filter((flag) => flag !== '--import' && flag !== 'tsx').join(' ') || '(no flags)'}, MALLOC_ARENA_MAX=${process.env.MALLOC_ARENA_MAX ?? '(unset)'}; with the receivers in their own thread the answering thread runs at nice ${answerThreadNice()} (npm start: ${ANSWER_THREAD_NICE}); answers worked on ${DEFAULT_ANSWERS_AT_ONCE} at once (npm start: chat.answersAtOnce, default ${DEFAULT_ANSWERS_AT_ONCE})`);
  console.log(`  load side (stand-ins and load generator, another process): node ${loadSideNodeFlags().join(' ') || '(no flags)'} (LAPSEWATCH_BENCH_LOAD_SIDE_FLAGS tries others)`);
  console.log('pictures (median, drawn here on this thread; answers have them drawn on the picture thread, src/render/rasterThread.ts):');
  await printPictureFigures();
  const results: RunResult[] = [];
  for (const platform of settings.platforms) {
    for (const kind of settings.routers) {
      for (const threading of settings.threadings) results.push(await runOne(kind, platform, threading, settings));
    }
  }
  printTable(results, settings.concurrency);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  await runChatLoadBench(process.argv.includes('--real-only') ? { routers: ['real'] } : {});
  // Stand-in servers and clients may leave handles open; the figures are printed, so leave.
  process.exit(0);
}
