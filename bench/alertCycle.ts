/**
 * One alert-check cycle at scale: 1,000 channels (half Slack, half Discord) watching 200 invented
 * places, five channels a place, on the embedded SQLite store; the watches were checked an hour
 * before, so every crossing goes to every channel as an alert of its own. Three processes, so that each figure
 * belongs to one of them:
 *  - this one seeds the store (channels and watches, untimed) and prints;
 *  - the stand-ins (standInsProcess.ts): the Open-Meteo stand-in on 127.0.0.1 with 50 ms of latency
 *    per request and invented demo data, and the Slack and Discord API stand-ins;
 *  - the bot (alertCycleBot.ts), started as `npm start` starts it with both platforms configured:
 *    the compiled build when current, BOT_NODE_FLAGS, the router in the main thread and the Slack
 *    and Discord receivers (idle) in their own thread. It runs the cycle (real HTTP source and forecast cache), delivers the queue
 *    through the real posters, runs a second cycle on the same model run, and reports its memory.
 * Prints wall time, provider requests (goal: at most one per place and model run) and the bot's rss
 * high-water mark (the kernel's VmHWM, which counts start-up too), also after the bot has answered
 * lookups and detail views with their pictures (the picture thread). Goals: under 30 s, at most 200
 * requests, under 200 MB. Bounded: gives up after 300 s; the children stop themselves after 300 s.
 *
 *   npm run bench alerts
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { compiledBuildIsCurrent } from '../bin/compiledBuild.mjs';
import { BOT_ENVIRONMENT } from '../src/app/botRuntime.ts';
import type { AlertCheckReport } from '../src/schedule/alertCheckCycle.ts';
import { locationKeyOf } from '../src/store/storeKeys.ts';
import { openTempSqliteStore } from '../test/delivery/deliveryFixtures.ts';
import { standInApplicationId } from '../test/adapters/discordStandIn.ts';
import { botNodeFlagsForBench, startChild } from './childLink.ts';

interface StandInsHello {
  forecastBaseUrl: string;
  runInitialisationSeconds: number;
  slackApiUrl: string;
  discordApiUrl: string;
}

interface StandInsStats {
  forecastRequests: number;
  metaRequests: number;
  slackPosts: number;
  discordPosts: number;
  platformErrors: number;
  peakRssMb: number;
  peakHeapUsedMb: number;
}

const CHANNELS = Number(process.env.LAPSEWATCH_BENCH_CHANNELS ?? 1_000);
const PLACES = Number(process.env.LAPSEWATCH_BENCH_PLACES ?? 200);
const progress = (text: string): void => void process.stderr.write(`alertCycle bench: ${text}\n`);
const LATENCY_MS = 50;
const BUDGET_MS = 300_000;
const GOALS = { wallSeconds: 30, requests: PLACES, rssMb: 200 };
/** Lookups (a 48-hour chart each) and detail views (a skew-T each) answered after the cycles. */
const LOOKUPS = 20;
const DETAIL_VIEWS = 5;

/** Invented points on a 0.25° grid over the interior West: distinct on the cache's 0.1° grid. */
function inventedPlaces(): Array<{ name: string; latitudeDeg: number; longitudeDeg: number }> {
  return Array.from({ length: PLACES }, (_, i) => ({
    name: `Bench Point ${String(i + 1).padStart(3, '0')} (invented)`,
    latitudeDeg: 42 + Math.floor(i / 20) * 0.25,
    longitudeDeg: -120 + (i % 20) * 0.25,
  }));
}

interface BotMemory {
  rssHighWaterMb: number | null;
  sampledPeakRssMb: number;
  peakHeapUsedMb: number;
  rssMb: number;
  heapUsedMb: number;
}

interface BotHello {
  rssAtStartMb: number;
  rssOpenedMb: number;
  rssReceiversMb: number;
  receiverHeapMb: number;
  execArgv: string[];
  compiled: boolean;
}

/** The bot runs from the compiled build, as after `npm ci`; a stale or missing one is rebuilt first. */
function ensureCompiledBuild(): void {
  if (compiledBuildIsCurrent()) return;
  progress('the compiled build is missing or older than the sources: running `npm run build` first');
  const built = spawnSync(process.execPath, [fileURLToPath(new URL('../scripts/build.mjs', import.meta.url))], { stdio: 'inherit' });
  if (built.status !== 0) progress('the build failed; the bot runs its TypeScript through tsx (its memory figures are then higher)');
}

export async function runAlertCycleBench(): Promise<void> {
  ensureCompiledBuild();
  const guard = setTimeout(() => {
    console.error(`alertCycle bench: over its ${BUDGET_MS / 1000} s budget, stopping`);
    process.exit(1);
  }, BUDGET_MS);
  guard.unref();
  const standIns = await startChild('standInsProcess.ts', [String(LATENCY_MS)], 30_000);
  const hello = standIns.hello as unknown as StandInsHello;
  const stats = (): Promise<StandInsStats> => standIns.ask<StandInsStats>({ cmd: 'stats' }, 10_000);
  let bot: Awaited<ReturnType<typeof startChild>> | null = null;
  try {
    // The model run the stand-in reports, plus 7 h: the run is out and current.
    const nowMs = hello.runInitialisationSeconds * 1000 + 7 * 3_600_000;
    const seedStartedAtMs = performance.now();
    const { store, url: storeUrl } = await openTempSqliteStore('bench-alert-cycle');
    const places = inventedPlaces();
    for (let i = 0; i < CHANNELS; i += 1) {
      const onSlack = i % 2 === 0;
      const channel = await store.channels.ensureChannel(
        onSlack ? { platform: 'slack', teamId: 'T0INVENTED', channelId: `C0BENCH${i}` } : { platform: 'discord', teamId: '1100000000000000003', channelId: String(1500000000000000000n + BigInt(i)) },
        { unitSystem: onSlack ? 'us' : 'metric', summaryLocalTime: null },
        nowMs,
      );
      const place = places[i % PLACES]!;
      await store.watches.addWatch(channel.id, { placeName: place.name, latitudeDeg: place.latitudeDeg, longitudeDeg: place.longitudeDeg, createdBy: 'U0BENCH' }, nowMs);
    }
    // Established watches, last checked an hour ago: the cycle tells each crossing to each channel on
    // its own (the heavy case). A watch's first check would send one digest per channel instead.
    for (const place of places) {
      await store.watches.markAlertChecked(locationKeyOf(place.latitudeDeg, place.longitudeDeg), nowMs - 3_600_000);
    }
    await store.close();
    const seedSeconds = (performance.now() - seedStartedAtMs) / 1000;
    progress(`seeded in ${seedSeconds.toFixed(1)} s`);

    bot = await startChild('alertCycleBot.ts', [storeUrl, hello.forecastBaseUrl, hello.slackApiUrl, hello.discordApiUrl, String(nowMs), standInApplicationId], 30_000, { preferCompiled: true, nodeFlags: botNodeFlagsForBench(), environment: BOT_ENVIRONMENT });
    const botHello = bot.hello as unknown as BotHello;
    const requestsBefore = (await stats()).forecastRequests;
    const cycle = await bot.ask<{ report: AlertCheckReport; seconds: number; memory: BotMemory; resident: Record<string, number>; retainedHeapMb: number }>({ cmd: 'cycle' }, 120_000);
    const requests = (await stats()).forecastRequests - requestsBefore;
    progress(`cycle done in ${cycle.seconds.toFixed(1)} s`);
    const delivered = await bot.ask<{ delivery: { posted: number; left: number; seconds: number; budgetSeconds: number }; memory: BotMemory; retainedHeapMb: number }>({ cmd: 'deliver' }, 120_000);
    // A second cycle on the same model run, after the interval: the cache answers, the provider hears nothing.
    const again = await bot.ask<{ report: AlertCheckReport; memory: BotMemory }>({ cmd: 'cycle-again' }, 120_000);
    // Then crews ask while the bot runs: lookups and detail views with their pictures (the picture thread starts).
    const lookups = await bot.ask<{ lookups: { asked: number; withPicture: number; seconds: number }; memory: BotMemory; resident: Record<string, number> }>({ cmd: 'lookups', points: places.slice(0, LOOKUPS), details: DETAIL_VIEWS }, 120_000);
    const childStats = await stats();
    const requestsSecondCycle = childStats.forecastRequests - requestsBefore - requests;
    const received = childStats.slackPosts + childStats.discordPosts;
    const { report } = cycle;
    const { delivery } = delivered;
    const cycleRssMb = cycle.memory.rssHighWaterMb ?? cycle.memory.sampledPeakRssMb;
    const overallRssMb = again.memory.rssHighWaterMb ?? again.memory.sampledPeakRssMb;
    const withPicturesRssMb = lookups.memory.rssHighWaterMb ?? lookups.memory.sampledPeakRssMb;

    const verdict = (met: boolean): string => (met ? 'MET' : 'MISSED');
    console.log(`Alert-check cycle: ${CHANNELS} channels watching ${PLACES} invented places, forecast stand-in at ${LATENCY_MS} ms per request, SQLite store`);
    console.log(`  bot process ${bot.pid}: ${botHello.compiled ? 'compiled build (dist/)' : 'TypeScript through tsx (no current build: run `npm run build`)'}, node ${botHello.execArgv.join(' ') || '(no flags)'}, ${Object.entries(BOT_ENVIRONMENT).map(([name, value]) => `${name}=${value}`).join(' ')}`);
    console.log(`  stand-ins (forecast, Slack, Discord) in process ${standIns.pid}; seeding in this process ${process.pid}; neither counts as the bot's`);
    console.log(`  seeding channels and watches (not timed)   ${seedSeconds.toFixed(1)} s`);
    console.log(`  cycle: fetch, assess, crossings, queue     ${cycle.seconds.toFixed(2)} s  (places checked ${report.placesChecked}, crossings recorded ${report.crossingsRecorded}, messages queued ${report.messagesQueued})`);
    console.log(`  delivery to the platform stand-ins         ${delivery.seconds.toFixed(2)} s  (posted ${delivery.posted}, ${(delivery.posted / delivery.seconds).toFixed(0)}/s; stand-ins received ${received}; still queued ${delivery.left}; budget ${delivery.budgetSeconds} s)`);
    console.log(`  wall time, cycle                           ${cycle.seconds.toFixed(2)} s  (goal < ${GOALS.wallSeconds} s) ${verdict(cycle.seconds < GOALS.wallSeconds)}`);
    console.log(`  provider requests                          ${requests}  (goal <= ${GOALS.requests}, one per place and model run) ${verdict(requests <= GOALS.requests)}`);
    console.log(`  provider requests, 2nd cycle same run      ${requestsSecondCycle}  (places checked ${again.report.placesChecked})`);
    console.log(`  bot rss high-water mark, start + cycle     ${cycleRssMb.toFixed(0)} MB  (goal < ${GOALS.rssMb} MB) ${verdict(cycleRssMb < GOALS.rssMb)}`);
    console.log(`  bot rss high-water mark, + delivery + 2nd  ${overallRssMb.toFixed(0)} MB  (goal < ${GOALS.rssMb} MB) ${verdict(overallRssMb < GOALS.rssMb)}`);
    console.log(`  bot rss high-water mark, + ${lookups.lookups.asked} answers with pictures ${withPicturesRssMb.toFixed(0)} MB  (the ${GOALS.rssMb} MB goal is the cycle's; pictures add the picture thread: ${withPicturesRssMb < GOALS.rssMb ? 'under it' : `${(withPicturesRssMb - GOALS.rssMb).toFixed(0)} MB over it`})  (${LOOKUPS} lookups and ${DETAIL_VIEWS} detail views of watched places, 4 at a time, ${lookups.lookups.withPicture} with a picture, ${lookups.lookups.seconds.toFixed(2)} s; rss after ${lookups.memory.rssMb.toFixed(0)} MB)`);
    console.log(`  bot rss at start / store open / receivers up / after cycle ${botHello.rssAtStartMb.toFixed(0)} / ${botHello.rssOpenedMb.toFixed(0)} / ${botHello.rssReceiversMb.toFixed(0)} / ${cycle.memory.rssMb.toFixed(0)} MB  (high-water: kernel VmHWM; sampled every 25 ms ${again.memory.sampledPeakRssMb.toFixed(0)} MB; receiver thread's heap at start ${botHello.receiverHeapMb.toFixed(0)} MB)`);
    console.log(`  bot resident after the cycle, by kind      ${Object.entries(cycle.resident).map(([kind, value]) => `${kind} ${value.toFixed(0)}`).join(', ')} MB`);
    console.log(`  bot resident after the answers, by kind    ${Object.entries(lookups.resident).map(([kind, value]) => `${kind} ${value.toFixed(0)}`).join(', ')} MB`);
    console.log(`  bot heap used: peak cycle / peak overall   ${cycle.memory.peakHeapUsedMb.toFixed(0)} / ${again.memory.peakHeapUsedMb.toFixed(0)} MB`);
    console.log(`  bot heap retained after a full GC          ${cycle.retainedHeapMb.toFixed(0)} MB after the cycle, ${delivered.retainedHeapMb.toFixed(0)} MB after delivery (the rest of each peak was garbage not yet collected)`);
    console.log(`  stand-ins' process, rss / heap high-water  ${childStats.peakRssMb.toFixed(0)} / ${childStats.peakHeapUsedMb.toFixed(0)} MB  (not the bot's)`);
  } finally {
    clearTimeout(guard);
    await bot?.stop();
    await standIns.stop();
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) {
  await runAlertCycleBench();
}
