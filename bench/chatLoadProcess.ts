/**
 * The chat-load benchmark's other side, in its own process so that the measured process holds only
 * the bot: the platform stand-in (Slack's Web API and response URLs, or Discord's REST API and
 * gateway) and the load generator that fires commands at the bot and times them. Prints its
 * addresses as one JSON line, then answers `load` and `stop` (see childLink.ts).
 *
 *   node --import tsx bench/chatLoadProcess.ts slack|discord
 *
 * Timing, all on this side of the wire:
 * - Slack: ack = the receiver's HTTP 200 to the signed slash command, timed in a thread of its own
 *   (slackLoadThread.ts) so that the stand-in's work cannot delay it; full = the response-URL post
 *   and, when that answer is posted in the channel (lookups and detail views carry a picture), the
 *   finished upload into the caller's channel.
 * - Discord: ack = the arrival of the deferred-reply callback at the stand-in (its head read, before
 *   the stand-in reads, records and answers it: that is the stand-in's work, not the bot's, and on
 *   one thread it would queue the acks of a burst behind each other); full = the edit of the
 *   original reply, which carries the embed and its attachment in one request.
 */
import { memorySampler, serveParent } from './childSide.ts';
import { startSlackStandIn, type SlackStandIn } from '../test/adapters/slackStandIn.ts';
import { Worker } from 'node:worker_threads';
import { pool } from '../src/jobPool.ts';
import { waitUntil } from './loadPacing.ts';
import type { Arrival, SlackLoadResult, SlackLoadSettings } from './slackLoadThread.ts';
import { standInApplicationId, startDiscordStandIn, type DiscordStandIn } from '../test/adapters/discordStandIn.ts';
import type { RecordedCall } from '../test/adapters/recordingServer.ts';

const LIFETIME_MS = 150_000;

export interface LoadRequest {
  /** Slash command (Slack, with its slash) or application command name (Discord). */
  commandName: string;
  /** Command texts, used in turn. */
  texts: string[];
  total: number;
  concurrency: number;
  deadlineMs: number;
  /** Untimed warm-up: one channel of its own, and indexes that mark the samples as not timed. */
  warmUp: boolean;
  /** Slack only: the receiver's URL and signing secret. */
  botUrl?: string;
  secret?: string;
}

export interface LoadSample {
  index: number;
  ackMs: number;
  fullMs: number;
}

export interface LoadAnswer {
  samples: LoadSample[];
  failures: number;
  firstFailure: string | null;
  wallMs: number;
  /** This process's CPU (stand-in and load generator), per answered command. */
  cpuMsPerCommand: number;
  peakRssMb: number;
}

type SendOne = (index: number, workerId: number, text: string, deadline: number) => Promise<LoadSample>;
/** A sender and the unsubscribe of the stand-in listener it timed through. */
type Sender = { send: SendOne; close: () => void };

function forgetBody(call: RecordedCall): void {
  call.raw = Buffer.alloc(0);
  call.headers = {};
}

function discordSender(standIn: DiscordStandIn, request: LoadRequest): Sender {
  const deferred = new Map<string, (at: number) => void>();
  const edited = new Map<string, (at: number) => void>();
  const stopArrivals = standIn.onArrival((_method, url) => {
    const callback = /\/interactions\/\d+\/([^/]+)\/callback(?:\?|$)/.exec(url);
    if (callback) deferred.get(callback[1]!)?.(performance.now());
  });
  const stopCalls = standIn.onCall((call) => {
    const edit = /\/webhooks\/\d+\/([^/]+)\/messages\/@original$/.exec(call.path);
    if (edit) edited.get(edit[1]!)?.(performance.now());
    forgetBody(call);
  });
  const send: SendOne = async (index, _workerId, text, deadline) => {
    let resolveAck!: (at: number) => void;
    let resolveFull!: (at: number) => void;
    const ack = new Promise<number>((resolve) => (resolveAck = resolve));
    const full = new Promise<number>((resolve) => (resolveFull = resolve));
    const t0 = performance.now();
    // Tokens are made by the stand-in; the waiters are registered before the event loop turns.
    const { token } = standIn.sendCommand(request.commandName, text);
    deferred.set(token, resolveAck);
    edited.set(token, resolveFull);
    try {
      const ackAt = await waitUntil(ack, deadline, `deferred reply for "${text}"`);
      const fullAt = await waitUntil(full, deadline, `edited reply for "${text}"`);
      return { index, ackMs: ackAt - t0, fullMs: fullAt - t0 };
    } finally {
      deferred.delete(token);
      edited.delete(token);
    }
  };
  return {
    send,
    close: () => {
      stopArrivals();
      stopCalls();
    },
  };
}

const platform = process.argv[2];
if (platform !== 'slack' && platform !== 'discord') throw new Error('usage: chatLoadProcess.ts slack|discord');
const memory = memorySampler();
const slack = platform === 'slack' ? await startSlackStandIn() : null;
const discord = platform === 'discord' ? await startDiscordStandIn() : null;
// The timing side decodes no uploaded picture and keeps no request: its event loop stays free to
// time acknowledgements, and its heap small.
(slack ?? discord)!.skipMultipartBodies();
(slack ?? discord)!.keepNoCalls();

let generatorThread: Promise<Worker> | null = null;

/** Started once, before the first (untimed) load, so no timed load pays for its start-up. */
function slackGenerator(): Promise<Worker> {
  generatorThread ??= new Promise((resolve, reject) => {
    // Through the same bootstrap as the receiver thread: a worker does not inherit tsx from --import.
    const worker = new Worker(new URL('../src/threads/workerBootstrap.mjs', import.meta.url), {
      workerData: { entry: new URL('./slackLoadThread.ts', import.meta.url).href },
    });
    worker.once('message', () => resolve(worker));
    worker.once('error', reject);
    worker.unref();
  });
  return generatorThread;
}

/**
 * Slack: the load generator runs in its own thread (slackLoadThread.ts) and this thread, the
 * stand-in's, forwards when each answer and upload arrived.
 */
async function slackLoad(standIn: SlackStandIn, request: LoadRequest): Promise<SlackLoadResult> {
  const { botUrl, secret } = request;
  if (!botUrl || !secret) throw new Error('a Slack load needs botUrl and secret');
  const settings: SlackLoadSettings = {
    botUrl, secret, commandName: request.commandName, texts: request.texts, total: request.total, concurrency: request.concurrency,
    deadlineMs: request.deadlineMs, warmUp: request.warmUp, responseUrlPrefix: standIn.responseUrl(''),
  };
  const generator = await slackGenerator();
  const close = standIn.onCall((call) => {
    const atMs = performance.timeOrigin + performance.now();
    let arrival: Arrival | null = null;
    if (call.path.startsWith('/respond/')) arrival = { kind: 'respond', key: call.path.slice('/respond/'.length), atMs, inChannel: call.body?.response_type === 'in_channel' };
    if (call.path === '/api/files.completeUploadExternal') arrival = { kind: 'uploaded', channelId: String(call.body?.channel_id), atMs };
    if (arrival) generator.postMessage(arrival);
    forgetBody(call);
  });
  try {
    const finished = new Promise<SlackLoadResult>((resolve, reject) => {
      generator.once('message', resolve);
      generator.once('error', reject);
    });
    generator.postMessage({ kind: 'run', settings });
    return await finished;
  } finally {
    close();
  }
}

async function load(request: LoadRequest): Promise<LoadAnswer> {
  if (slack) {
    const generator = slackGenerator();
    await generator;
    memory.reset();
    const started = performance.now();
    const cpuAtStart = process.cpuUsage();
    const result = await slackLoad(slack, request);
    const cpu = process.cpuUsage(cpuAtStart);
    return { ...result, wallMs: performance.now() - started, cpuMsPerCommand: (cpu.user + cpu.system) / 1000 / Math.max(1, result.samples.length), peakRssMb: memory.peakRssMb() };
  }
  await discord!.identified(10_000);
  const sender = discordSender(discord!, request);
  const samples: LoadSample[] = [];
  let failures = 0;
  let firstFailure: string | null = null;
  memory.reset();
  const started = performance.now();
  const cpuAtStart = process.cpuUsage();
  const deadline = Date.now() + request.deadlineMs;
  await pool(request.total, request.concurrency, deadline, async (index, workerId) => {
    try {
      samples.push(await sender.send(index, workerId, request.texts[index % request.texts.length]!, deadline));
    } catch (error) {
      failures += 1;
      firstFailure ??= error instanceof Error ? error.message : String(error);
    }
  });
  const cpu = process.cpuUsage(cpuAtStart);
  sender.close();
  return { samples, failures, firstFailure, wallMs: performance.now() - started, cpuMsPerCommand: (cpu.user + cpu.system) / 1000 / Math.max(1, samples.length), peakRssMb: memory.peakRssMb() };
}

serveParent(
  { apiUrl: (slack ?? discord)!.apiUrl, applicationId: standInApplicationId, pid: process.pid },
  async (request) => {
    if (request.cmd !== 'load') throw new Error(`unknown request ${JSON.stringify(request.cmd)}`);
    return { ...(await load(request as unknown as LoadRequest)) };
  },
  async () => {
    memory.stop();
    await (slack ?? discord)!.stop();
  },
  LIFETIME_MS,
);
