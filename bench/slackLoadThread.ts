/**
 * The Slack load generator, in a thread of its own inside the chat-load child process: it signs and
 * sends the slash commands and times the receiver's acknowledgements, while the child's main thread
 * runs the Slack stand-in (response URLs, file uploads) and forwards the arrival time of each answer.
 * Apart, the stand-in's work on answers cannot delay the timing of acknowledgements. Times are epoch
 * milliseconds (performance.timeOrigin + performance.now()), comparable between the two threads.
 */
import { parentPort } from 'node:worker_threads';
import { signedFormHeaders, slashCommandForm } from '../test/adapters/slackSigning.ts';
import type { LoadRequest } from './chatLoadProcess.ts';
import { KeepAliveCaller } from './keepAliveCaller.ts';
import { pool } from '../src/jobPool.ts';
import { waitUntil } from './loadPacing.ts';

export type SlackLoadSettings = Required<Omit<LoadRequest, 'botUrl' | 'secret'>> & {
  botUrl: string;
  secret: string;
  /** The stand-in's response URL for a key, minus the key. */
  responseUrlPrefix: string;
};

/** Arrivals the stand-in's thread forwards. */
export type Arrival = { kind: 'respond'; key: string; atMs: number; inChannel: boolean } | { kind: 'uploaded'; channelId: string; atMs: number };

export interface SlackLoadResult {
  samples: Array<{ index: number; ackMs: number; fullMs: number }>;
  failures: number;
  firstFailure: string | null;
}

const nowMs = (): number => performance.timeOrigin + performance.now();

/**
 * One caller per concurrent worker, kept across loads: each holds its keep-alive connection, so a
 * connection opened by an untimed load (the warm-up's, or the one that opens them before the clock)
 * carries that caller's timed commands, and the others open theirs in the first timed burst.
 */
const callers = new Map<string, KeepAliveCaller>();

function callerFor(url: URL, workerId: number): KeepAliveCaller {
  // Each run starts a bot of its own on a port of its own.
  const key = `${url.host} ${workerId}`;
  let caller = callers.get(key);
  if (!caller) {
    caller = new KeepAliveCaller(url.hostname, Number(url.port));
    callers.set(key, caller);
  }
  return caller;
}

const answered = new Map<string, (answer: { atMs: number; inChannel: boolean }) => void>();
const uploaded = new Map<string, (atMs: number) => void>();

/** One load: `total` commands, `concurrency` callers. */
async function run(settings: SlackLoadSettings): Promise<SlackLoadResult> {
  const result: SlackLoadResult = { samples: [], failures: 0, firstFailure: null };
  const deadline = Date.now() + settings.deadlineMs;
  const url = new URL(settings.botUrl);
  // One channel per concurrent caller (20 incident channels asking again and again, as on a busy
  // fire): a caller waits for its answer before asking again, so an upload is matched by its channel.
  await pool(settings.total, settings.concurrency, deadline, async (index, workerId) => {
    const text = settings.texts[index % settings.texts.length]!;
    const key = settings.warmUp ? `warm-up-${index}` : String(index);
    const channelId = settings.warmUp ? 'CBENCHWARMUP' : `CBENCH${workerId}`;
    const responded = new Promise<{ atMs: number; inChannel: boolean }>((resolve) => answered.set(key, resolve));
    const imaged = new Promise<number>((resolve) => uploaded.set(channelId, resolve));
    try {
      const t0 = nowMs();
      const body = new URLSearchParams(slashCommandForm(settings.commandName, text, `${settings.responseUrlPrefix}${key}`, channelId)).toString();
      const ack = await callerFor(url, workerId).post(url.pathname, signedFormHeaders(body, { secret: settings.secret }), body);
      const ackAt = nowMs();
      if (ack.status !== 200) throw new Error(`ack ${ack.status}`);
      const response = await waitUntil(responded, deadline, `response-URL post for "${text}"`);
      // Answers for the whole channel are the ones with a picture; it follows as an upload.
      const fullAt = response.inChannel ? Math.max(response.atMs, await waitUntil(imaged, deadline, `upload for "${text}"`)) : response.atMs;
      result.samples.push({ index, ackMs: ackAt - t0, fullMs: fullAt - t0 });
    } catch (error) {
      result.failures += 1;
      result.firstFailure ??= error instanceof Error ? error.message : String(error);
    } finally {
      answered.delete(key);
    }
  });
  return result;
}

parentPort!.on('message', (message: Arrival | { kind: 'run'; settings: SlackLoadSettings }) => {
  if (message.kind === 'run') void run(message.settings).then((result) => parentPort!.postMessage(result));
  else if (message.kind === 'respond') answered.get(message.key)?.(message);
  else uploaded.get(message.channelId)?.(message.atMs);
});
parentPort!.postMessage('ready');
