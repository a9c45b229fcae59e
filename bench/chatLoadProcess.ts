/**
 * The chat-load benchmark's other side, in its own process so that the measured process holds only
 * the bot: the platform stand-in (Slack's Web API and response URLs, or Discord's REST API and
 * gateway) and the load generator that fires commands at the bot and times them. Prints its
 * addresses as one JSON line, then answers `load` and `stop` (see childLink.ts).
 *
 *   node --import tsx bench/chatLoadProcess.ts slack|discord
 *
 * Timing, all on this side of the wire:
 * - Slack: ack = the receiver's HTTP 200 to the signed slash command; full = the response-URL post
 *   and, when that answer is posted in the channel (lookups and detail views carry a picture), the
 *   finished upload into the caller's channel.
 * - Discord: ack = the deferred-reply callback; full = the edit of the original reply, which
 *   carries the embed and its attachment in one request.
 */
import { memorySampler, serveParent } from './childSide.ts';
import { startSlackStandIn, type SlackStandIn } from '../test/adapters/slackStandIn.ts';
import { postSigned, slashCommandForm } from '../test/adapters/slackSigning.ts';
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

/** Runs `count` jobs, `concurrency` at a time (one job at a time per worker), stopping new ones at the deadline. */
async function pool(count: number, concurrency: number, deadline: number, job: (index: number, workerId: number) => Promise<void>): Promise<void> {
  let next = 0;
  const worker = async (_: unknown, workerId: number) => {
    while (next < count && Date.now() < deadline) await job(next++, workerId);
  };
  await Promise.all(Array.from({ length: concurrency }, worker));
}

function waitUntil<T>(promise: Promise<T>, deadline: number, what: string): Promise<T> {
  return Promise.race([promise, new Promise<T>((_, reject) => setTimeout(() => reject(new Error(`no ${what} before the deadline`)), Math.max(0, deadline - Date.now())).unref())]);
}

function forgetBody(call: RecordedCall): void {
  call.raw = Buffer.alloc(0);
  call.headers = {};
}

function slackSender(standIn: SlackStandIn, request: LoadRequest): Sender {
  const { botUrl, secret } = request;
  if (!botUrl || !secret) throw new Error('a Slack load needs botUrl and secret');
  const answered = new Map<string, (answer: { at: number; inChannel: boolean }) => void>();
  const uploaded = new Map<string, (at: number) => void>();
  const close = standIn.onCall((call) => {
    const at = performance.now();
    if (call.path.startsWith('/respond/')) answered.get(call.path.slice('/respond/'.length))?.({ at, inChannel: call.body?.response_type === 'in_channel' });
    if (call.path === '/api/files.completeUploadExternal') uploaded.get(call.body?.channel_id)?.(at);
    forgetBody(call);
  });
  // One channel per concurrent caller (20 incident channels asking again and again, as on a busy
  // fire): a caller waits for its answer before asking again, so an upload is matched by its channel.
  const send: SendOne = async (index, workerId, text, deadline) => {
    const key = request.warmUp ? `warm-up-${index}` : String(index);
    const channelId = request.warmUp ? 'CBENCHWARMUP' : `CBENCH${workerId}`;
    const responded = new Promise<{ at: number; inChannel: boolean }>((resolve) => answered.set(key, resolve));
    const imaged = new Promise<number>((resolve) => uploaded.set(channelId, resolve));
    const t0 = performance.now();
    const ack = await postSigned(botUrl, slashCommandForm(request.commandName, text, standIn.responseUrl(key), channelId), { secret });
    const ackAt = performance.now();
    if (ack.status !== 200) throw new Error(`ack ${ack.status}`);
    const response = await waitUntil(responded, deadline, `response-URL post for "${text}"`);
    answered.delete(key);
    // Answers for the whole channel are the ones with a picture; it follows as an upload.
    const fullAt = response.inChannel ? Math.max(response.at, await waitUntil(imaged, deadline, `upload for "${text}"`)) : response.at;
    return { index, ackMs: ackAt - t0, fullMs: fullAt - t0 };
  };
  return { send, close };
}

function discordSender(standIn: DiscordStandIn, request: LoadRequest): Sender {
  const deferred = new Map<string, (at: number) => void>();
  const edited = new Map<string, (at: number) => void>();
  const close = standIn.onCall((call) => {
    const callback = /\/interactions\/\d+\/([^/]+)\/callback$/.exec(call.path);
    if (callback) deferred.get(callback[1]!)?.(performance.now());
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
  return { send, close };
}

const platform = process.argv[2];
if (platform !== 'slack' && platform !== 'discord') throw new Error('usage: chatLoadProcess.ts slack|discord');
const memory = memorySampler();
const slack = platform === 'slack' ? await startSlackStandIn() : null;
const discord = platform === 'discord' ? await startDiscordStandIn() : null;

async function load(request: LoadRequest): Promise<LoadAnswer> {
  if (discord) await discord.identified(10_000);
  const sender = slack ? slackSender(slack, request) : discordSender(discord!, request);
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
