import { randomUUID } from 'node:crypto';
import { request } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { HandOff } from '../answering/answerJob.ts';
import { pool } from '../../src/jobPool.ts';
import { slackSignedFormHeaders } from './slackSignature.ts';

/**
 * V8 runs a code path slowly (interpreted, then baseline code) until it has run it often enough to
 * compile it. A receiver just started meets its first commands with Bolt's request path, Node's
 * HTTP server and our listener all cold: on the chat bench the first burst of 20 commands on new
 * connections was acknowledged in up to 53 ms with a router that answers at once, against 10–18 ms
 * for the later ones. So at start, before it says it is ready, the HTTP receiver sends itself
 * signed requests over loopback, each on a new connection as a proxy without keep-alive would send
 * them. Bolt verifies and acknowledges them like any other; the listener drops them instead of
 * handing them over (warmUpFilter). Measured with `LAPSEWATCH_BENCH_SLACK_WARM_UP=0` against the
 * default in the chat bench (bench/chatLoad.ts).
 */
export const RECEIVER_WARM_UP_REQUESTS = 150;

/** Requests in flight at once: a burst, as the first crowd of commands brings, not a flood. */
const AT_ONCE = 10;
/** The whole warm-up gives up after this; the receiver works either way. */
const TIME_LIMIT_MS = 10_000;
/** Every fifth is a button press, so the action listener is warmed too. */
const BUTTON_EVERY = 5;

export interface ReceiverWarmUpResult {
  sent: number;
  /** Answered 200, as a real request would be. */
  acknowledged: number;
  elapsedMs: number;
  /** The first thing that went wrong, if anything did. */
  firstProblem: string | null;
}

/** The start-up log line. */
export function describeWarmUp(result: ReceiverWarmUpResult): string {
  const problem = result.firstProblem ? `; first problem: ${result.firstProblem}` : '';
  return `slack receiver warmed up: ${result.acknowledged} of ${result.sent} signed requests to itself acknowledged in ${Math.round(result.elapsedMs)} ms${problem}`;
}

/**
 * Where warm-up requests are answered: nowhere. Each receiver start makes its own (a random path
 * under the reserved .invalid domain, RFC 6761), so no real request can carry it, and nothing
 * could be posted to it if one did.
 */
export function warmUpResponseUrl(): string {
  return `https://lapsewatch-warm-up.invalid/${randomUUID()}`;
}

/** Hands every job over except the warm-up's own. */
export function warmUpFilter(handOff: HandOff, responseUrl: string): HandOff {
  return (job) => {
    if (job.platform === 'slack' && job.responseUrl === responseUrl) return;
    handOff(job);
  };
}

export interface ReceiverWarmUpOptions {
  /** Where the receiver listens (its server's address). */
  address: AddressInfo;
  /** Bolt's events path. */
  path: string;
  signingSecret: string;
  commandName: string;
  /** From warmUpResponseUrl(); the filter in front of the hand-off drops what carries it. */
  responseUrl: string;
  actionId: string;
  requests: number;
}

/**
 * The listening address as a client reaches it. A wildcard is reached on IPv4 loopback: Node's
 * default "::" listener takes IPv4 too (dual stack), while "::1" can be unreachable where IPv6 is
 * switched off, as in many containers.
 */
function loopbackFor(address: AddressInfo): string {
  return address.address === '0.0.0.0' || address.address === '::' ? '127.0.0.1' : address.address;
}

/** Form bodies as Slack posts them, with invented ids that name the warm-up. */
function warmUpBody(index: number, options: ReceiverWarmUpOptions): string {
  const common = { team_id: 'T0WARMUP', channel_id: 'C0WARMUP', user_id: 'U0WARMUP' };
  if (index % BUTTON_EVERY === BUTTON_EVERY - 1) {
    const payload = {
      type: 'block_actions',
      team: { id: common.team_id, domain: 'warm-up' },
      user: { id: common.user_id, username: 'warm-up', team_id: common.team_id },
      api_app_id: 'A0WARMUP',
      token: 'unused',
      trigger_id: `warm-up.${index}`,
      channel: { id: common.channel_id, name: 'warm-up' },
      response_url: options.responseUrl,
      actions: [{ type: 'button', action_id: options.actionId, block_id: 'warm-up', value: 'warm-up', text: { type: 'plain_text', text: 'warm-up' }, action_ts: '0.0' }],
    };
    return new URLSearchParams({ payload: JSON.stringify(payload) }).toString();
  }
  return new URLSearchParams({
    token: 'unused',
    ...common,
    team_domain: 'warm-up',
    channel_name: 'warm-up',
    user_name: 'warm-up',
    command: options.commandName,
    text: 'help',
    api_app_id: 'A0WARMUP',
    response_url: options.responseUrl,
    trigger_id: `warm-up.${index}`,
  }).toString();
}

/** One signed POST on a connection of its own; resolves with null when answered 200, else what went wrong. */
function postOnce(host: string, port: number, path: string, body: string, secret: string, deadlineMs: number): Promise<string | null> {
  return new Promise((resolve) => {
    const sent = request(
      {
        host,
        port,
        path,
        method: 'POST',
        agent: false,
        timeout: Math.max(1, deadlineMs - Date.now()),
        headers: { ...slackSignedFormHeaders(secret, body), 'content-length': Buffer.byteLength(body) },
      },
      (response) => {
        response.resume();
        response.on('end', () => resolve(response.statusCode === 200 ? null : `answered ${response.statusCode}`));
        response.on('error', (error) => resolve(error.message));
      },
    );
    sent.on('timeout', () => sent.destroy(new Error('timed out')));
    sent.on('error', (error) => resolve(error.message));
    sent.end(body);
  });
}

/** Sends the warm-up requests, AT_ONCE in flight, until done or the time limit; never throws. */
export async function warmUpSlackReceiver(options: ReceiverWarmUpOptions): Promise<ReceiverWarmUpResult> {
  const startedMs = performance.now();
  const deadlineMs = Date.now() + TIME_LIMIT_MS;
  const host = loopbackFor(options.address);
  const result: ReceiverWarmUpResult = { sent: 0, acknowledged: 0, elapsedMs: 0, firstProblem: null };
  await pool(options.requests, AT_ONCE, deadlineMs, async (index) => {
    result.sent += 1;
    const problem = await postOnce(host, options.address.port, options.path, warmUpBody(index, options), options.signingSecret, deadlineMs);
    if (problem === null) result.acknowledged += 1;
    else result.firstProblem ??= problem;
  });
  result.elapsedMs = performance.now() - startedMs;
  return result;
}
