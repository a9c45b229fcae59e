// Chat load on loopback: 200 slash commands at the Slack HTTP receiver and 200 interactions
// through the Discord stand-in gateway, 20 at a time. Prints acknowledgement and full-answer
// latency (median, p95, p99) and the share acknowledged inside Slack's and Discord's 3 s, for the
// real command router (SQLite store, demo source behind the forecast cache, shipped rules, images on)
// and, side by side, for the router double (fixed answer with a tiny PNG), so the figures separate
// what the adapters cost from what the router and its pictures cost.
// Run: npx tsx bench/chatLoad.ts [--real-only]. Bounded: each run stops at its deadline whatever happens.
import { mkdtempSync, rmSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { pathToFileURL } from 'node:url';
import { LogLevel } from '@slack/bolt';
import { startSlackApp } from '../adapters/slack/index.ts';
import { slackCommandName } from '../adapters/slack/slackCommandName.ts';
import { startDiscordBot } from '../adapters/discord/index.ts';
import { discordCommandName } from '../adapters/discord/commands.ts';
import { buildForecastSource } from '../src/app/buildForecastSource.ts';
import { parseAppConfig } from '../src/config/appConfig.ts';
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
import { startSlackStandIn } from '../test/adapters/slackStandIn.ts';
import { postSigned, slashCommandForm } from '../test/adapters/slackSigning.ts';
import { standInApplicationId, startDiscordStandIn } from '../test/adapters/discordStandIn.ts';

type RouterKind = 'real' | 'double';
type PlatformName = 'slack' | 'discord';

export interface ChatLoadOptions {
  /** Which routers to load, in order; the real one first so the double's figures sit beside it. */
  routers?: RouterKind[];
  total?: number;
  concurrency?: number;
  /** Per-run bound (one router on one platform). */
  deadlineMs?: number;
  platforms?: PlatformName[];
}

interface Sample {
  /** Position in the run: the first `concurrency` commands are the ones that meet cold pictures. */
  index: number;
  ackMs: number;
  fullMs: number;
}

interface RunResult {
  router: RouterKind;
  platform: PlatformName;
  total: number;
  samples: Sample[];
  failures: number;
  wallMs: number;
  cpuMsPerCommand: number;
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
const commandText = (index: number): string => COMMAND_MIX[index % COMMAND_MIX.length]!;
/**
 * Untimed commands per run before the clock starts, as a bot that has been up a while has seen:
 * help, and a lookup and a detail view of a point none of the timed commands asks for. They load
 * the code paths (modules, JIT, the store's statements, the rasteriser and its fonts) but warm none
 * of the timed commands' forecasts, assessments or pictures: those meet their caches cold.
 */
const WARM_UP_COMMANDS = ['help', '44.30,-116.90', 'detail 44.30,-116.90 15'];

/** The real router as the app assembles it: SQLite in a temp folder, demo source behind the cache, shipped rules. */
async function realRouter(): Promise<RouterUnderLoad> {
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

/**
 * Passes every call through unchanged and notes what came back, keyed by channel: the Slack run
 * needs to know whether to wait for an upload, and the report says what was answered.
 */
class AnswerLog implements CommandRouter {
  readonly byChannel = new Map<string, Message>();
  readonly kinds = new Map<string, number>();
  images = 0;
  /** The rasteriser's counters when timing started (after the warm-up). */
  picturesAtStart = rasterizeCacheStats();

  constructor(private readonly inner: CommandRouter) {}

  async handleCommand(request: Parameters<CommandRouter['handleCommand']>[0]): Promise<Message> {
    const message = await this.inner.handleCommand(request);
    this.note(request.channelId, message);
    return message;
  }

  async handleAction(request: Parameters<CommandRouter['handleAction']>[0]): Promise<Message> {
    const message = await this.inner.handleAction(request);
    this.note(request.channelId, message);
    return message;
  }

  private note(channelId: string, message: Message): void {
    this.byChannel.set(channelId, message);
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

/** Runs `count` jobs, `concurrency` at a time (one job at a time per worker), stopping new ones at the deadline. */
async function pool(count: number, concurrency: number, deadline: number, job: (index: number, workerId: number) => Promise<void>): Promise<void> {
  let next = 0;
  const worker = async (_: unknown, workerId: number) => {
    while (next < count && Date.now() < deadline) await job(next++, workerId);
  };
  await Promise.all(Array.from({ length: concurrency }, worker));
}

function waitUntil(promise: Promise<number>, deadline: number): Promise<number> {
  return Promise.race([promise, new Promise<number>((_, reject) => setTimeout(() => reject(new Error('deadline')), Math.max(0, deadline - Date.now())).unref())]);
}

interface Measured {
  samples: Sample[];
  failures: number;
  wallMs: number;
  cpuMsPerCommand: number;
}

/** Times the pool and the process CPU it used (adapter, library, stand-in, router and load generator share this process). */
async function measure(options: Required<ChatLoadOptions>, job: (index: number, workerId: number, deadline: number) => Promise<Sample>): Promise<Measured> {
  const samples: Sample[] = [];
  let failures = 0;
  const started = performance.now();
  const cpuAtStart = process.cpuUsage();
  const deadline = Date.now() + options.deadlineMs;
  await pool(options.total, options.concurrency, deadline, async (index, workerId) => {
    try {
      samples.push(await job(index, workerId, deadline));
    } catch {
      failures += 1;
    }
  });
  const cpu = process.cpuUsage(cpuAtStart);
  return { samples, failures, wallMs: performance.now() - started, cpuMsPerCommand: (cpu.user + cpu.system) / 1000 / Math.max(1, samples.length) };
}

async function slackLoad(log: AnswerLog, options: Required<ChatLoadOptions>): Promise<Measured> {
  const secret = 'bench-signing-secret';
  const standIn = await startSlackStandIn();
  const slack = await startSlackApp({ router: log, botToken: 'xoxb-bench', signingSecret: secret, apiUrl: standIn.apiUrl, port: 0, host: '127.0.0.1', logLevel: LogLevel.ERROR });
  // The full answer is the response-URL post and, when the answer has a picture, the finished upload into the channel.
  const answered = new Map<string, (at: number) => void>();
  const uploaded = new Map<string, (at: number) => void>();
  standIn.onCall((call) => {
    if (call.path.startsWith('/respond/')) answered.get(call.path.slice('/respond/'.length))?.(performance.now());
    if (call.path === '/api/files.completeUploadExternal') uploaded.get(call.body?.channel_id)?.(performance.now());
  });
  const url = `http://127.0.0.1:${slack.port}/slack/events`;
  // One channel per concurrent caller (20 incident channels asking again and again, as on a busy
  // fire): a caller waits for its answer before asking again, so an upload is matched by its channel.
  const send = async (index: number, channelId: string, text: string, deadline: number): Promise<Sample> => {
    const key = index < 0 ? 'warm-up' : String(index);
    const responded = new Promise<number>((resolve) => answered.set(key, resolve));
    const imaged = new Promise<number>((resolve) => uploaded.set(channelId, resolve));
    const t0 = performance.now();
    const form = slashCommandForm(slackCommandName(), text, standIn.responseUrl(key), channelId);
    const ack = await postSigned(url, form, { secret });
    const ackAt = performance.now();
    if (ack.status !== 200) throw new Error(`ack ${ack.status}`);
    const respondedAt = await waitUntil(responded, deadline);
    // The router has answered by the time the response URL is posted; its log says whether a picture follows.
    const hasImage = (log.byChannel.get(channelId)?.images.length ?? 0) > 0;
    const fullAt = hasImage ? Math.max(respondedAt, await waitUntil(imaged, deadline)) : respondedAt;
    return { index, ackMs: ackAt - t0, fullMs: fullAt - t0 };
  };
  try {
    for (const text of WARM_UP_COMMANDS) await send(-1, 'CBENCHWARMUP', text, Date.now() + options.deadlineMs);
    log.startTiming();
    return await measure(options, (index, workerId, deadline) => send(index, `CBENCH${workerId}`, commandText(index), deadline));
  } finally {
    await slack.stop();
    await standIn.stop();
  }
}

async function discordLoad(log: AnswerLog, options: Required<ChatLoadOptions>): Promise<Measured> {
  const standIn = await startDiscordStandIn();
  const bot = await startDiscordBot({ router: log, token: 'bench.discord.token', applicationId: standInApplicationId, apiUrl: standIn.apiUrl, log: () => {} });
  const deferred = new Map<string, (at: number) => void>();
  const edited = new Map<string, (at: number) => void>();
  standIn.onCall((call) => {
    const callback = /\/interactions\/\d+\/([^/]+)\/callback$/.exec(call.path);
    if (callback) deferred.get(callback[1]!)?.(performance.now());
    const edit = /\/webhooks\/\d+\/([^/]+)\/messages\/@original$/.exec(call.path);
    if (edit) edited.get(edit[1]!)?.(performance.now());
  });
  const send = async (index: number, text: string, deadline: number): Promise<Sample> => {
    // Tokens are made by the stand-in; register the waiters under the token it will use.
    let resolveAck!: (at: number) => void;
    let resolveFull!: (at: number) => void;
    const ack = new Promise<number>((resolve) => (resolveAck = resolve));
    const full = new Promise<number>((resolve) => (resolveFull = resolve));
    const t0 = performance.now();
    const { token } = standIn.sendCommand(discordCommandName(), text);
    deferred.set(token, resolveAck);
    edited.set(token, resolveFull);
    const ackAt = await waitUntil(ack, deadline);
    // The edit carries the embed and its attachment in one request.
    const fullAt = await waitUntil(full, deadline);
    return { index, ackMs: ackAt - t0, fullMs: fullAt - t0 };
  };
  try {
    for (const text of WARM_UP_COMMANDS) await send(-1, text, Date.now() + options.deadlineMs);
    log.startTiming();
    return await measure(options, (index, _workerId, deadline) => send(index, commandText(index), deadline));
  } finally {
    await bot.stop();
    await standIn.stop();
  }
}

async function runOne(kind: RouterKind, platform: PlatformName, options: Required<ChatLoadOptions>): Promise<RunResult> {
  // Each run starts from the same state: a fresh store, the forecast cache warm, no finished picture held.
  resetRasterizeCache();
  const underLoad: RouterUnderLoad = kind === 'real' ? await realRouter() : { router: new RouterDouble({ withImage: true }), close: async () => {} };
  const log = new AnswerLog(underLoad.router);
  const loadAverage1m = loadavg()[0]!;
  try {
    const measured = platform === 'slack' ? await slackLoad(log, options) : await discordLoad(log, options);
    const stats = rasterizeCacheStats();
    const before = log.picturesAtStart;
    const pictures = kind === 'real' ? `; ${stats.rasterized - before.rasterized} rasterised, ${stats.hits - before.hits} from the PNG cache` : '';
    return { router: kind, platform, total: options.total, ...measured, loadAverage1m, answers: `${log.summary()}${pictures}` };
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

function printTable(results: RunResult[], concurrency: number): void {
  const ms = (n: number) => (Number.isFinite(n) ? n.toFixed(1) : '-').padStart(7);
  const header = `${'platform'.padEnd(8)} ${'router'.padEnd(13)} │ ${'ack p50'.padStart(7)} ${'p95'.padStart(7)} ${'p99'.padStart(7)} ${'max'.padStart(7)} ${'<3 s'.padStart(6)} │ ${'full p50'.padStart(8)} ${'p95'.padStart(7)} ${'p99'.padStart(7)} │ ${'ok/total'.padStart(8)} ${'wall s'.padStart(6)} ${'CPU ms/cmd'.padStart(10)} ${'load 1m'.padStart(7)}`;
  console.log(`\n${header}\n${'─'.repeat(header.length)}`);
  const row = (platform: string, label: string, samples: Sample[], total: number, rest: string) => {
    const acks = samples.map((s) => s.ackMs).sort((a, b) => a - b);
    const fulls = samples.map((s) => s.fullMs).sort((a, b) => a - b);
    const inWindow = samples.filter((s) => s.ackMs <= ACK_WINDOW_MS).length;
    console.log(
      `${platform.padEnd(8)} ${label.padEnd(13)} │ ${ms(percentile(acks, 50))} ${ms(percentile(acks, 95))} ${ms(percentile(acks, 99))} ${ms(acks.at(-1) ?? Number.NaN)} ${`${((100 * inWindow) / total).toFixed(1)}%`.padStart(6)} │ ${ms(percentile(fulls, 50)).padStart(8)} ${ms(percentile(fulls, 95))} ${ms(percentile(fulls, 99))} │ ${`${samples.length}/${total}`.padStart(8)} ${rest}`,
    );
  };
  for (const r of results) {
    row(r.platform, r.router, r.samples, r.total, `${(r.wallMs / 1000).toFixed(2).padStart(6)} ${r.cpuMsPerCommand.toFixed(2).padStart(10)} ${r.loadAverage1m.toFixed(2).padStart(7)}`);
    // The same run without its first wave, which is where the few cold pictures are rasterised.
    row('', `  after ${concurrency}`, r.samples.filter((s) => s.index >= concurrency), r.total - concurrency, '');
  }
  console.log('(milliseconds; "<3 s" is the share of all commands acknowledged inside 3 s, failures counting as not acknowledged;');
  console.log(` "after ${concurrency}" is the same run without its first ${concurrency} commands, i.e. once every picture has been made)`);
  console.log('Goals: every ack inside 3 s, ack p99 < 50 ms, full-answer p95 < 300 ms with the picture.');
  for (const r of results) console.log(`  ${r.platform} ${r.router}: ${r.failures} failed; answers: ${r.answers}`);
}

export async function runChatLoadBench(options: ChatLoadOptions = {}): Promise<void> {
  const settings: Required<ChatLoadOptions> = {
    routers: options.routers ?? ['real', 'double'],
    total: options.total ?? 200,
    concurrency: options.concurrency ?? 20,
    deadlineMs: options.deadlineMs ?? 18_000,
    platforms: options.platforms ?? ['slack', 'discord'],
  };
  console.log(`chat load: ${settings.total} commands per platform and router, ${settings.concurrency} at a time, loopback, forecast cache warm, images on`);
  console.log(`  command mix (repeats): ${COMMAND_MIX.map((text) => `"${text}"`).join(', ')}`);
  console.log(`  channels: Slack one per concurrent caller (${settings.concurrency}), Discord the stand-in guild's one; untimed first: ${WARM_UP_COMMANDS.map((text) => `"${text}"`).join(', ')} (a point no timed command asks)`);
  // Latency on a shared machine says as much about its load as about us: print the load beside it.
  console.log(`  machine: ${cpus().length} CPUs, load average ${loadavg().map((n) => n.toFixed(2)).join(' / ')}`);
  console.log('pictures (median; rasterising runs on the event loop, so it delays every acknowledgement behind it):');
  await printPictureFigures();
  const results: RunResult[] = [];
  for (const platform of settings.platforms) {
    for (const kind of settings.routers) results.push(await runOne(kind, platform, settings));
  }
  printTable(results, settings.concurrency);
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  await runChatLoadBench(process.argv.includes('--real-only') ? { routers: ['real'] } : {});
  // Stand-in servers and clients may leave handles open; the figures are printed, so leave.
  process.exit(0);
}
