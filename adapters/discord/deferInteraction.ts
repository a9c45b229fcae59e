import { InteractionResponseType } from 'discord.js';
import { retryAfterMs } from '../../src/forecast/retryPolicy.ts';
import { PACKAGE_VERSION } from '../../src/packageRoot.ts';
import type { Http2Origin } from '../http/http2Origin.ts';
import { nodeHttpFetch } from '../http/nodeHttpFetch.ts';

/** Discord's own API base, used when no other is configured. */
export const DISCORD_API_BASE = 'https://discord.com/api';
/** Discord's window for the first answer to an interaction (developer docs, "Receiving and Responding"). */
const ANSWER_WINDOW_MS = 3000;
/** Discord asks API clients to name themselves as DiscordBot (url, version) (developer docs, "API Reference": user agent). */
const USER_AGENT = `DiscordBot (https://lapsewatch.invalid, ${PACKAGE_VERSION})`;
/**
 * How long to wait for Discord's answer to the callback before giving the connection up. Past the
 * window the acknowledgement is worth nothing, but an answer that comes late may still mean Discord
 * took it, so a little more than the window is allowed before the question is dropped.
 */
export const DEFERRAL_TIMEOUT_MS = 5000;
/** Discord's error code for a second answer to one interaction (developer docs, "JSON Error Codes"; the number from memory). */
const ALREADY_ACKNOWLEDGED = 40060;
const DEFERRAL_BODY = JSON.stringify({ type: InteractionResponseType.DeferredChannelMessageWithSource });

export type DeferralOutcome = { ok: true } | { ok: false; reason: string };

/** What Discord's JSON error body may carry; read once per refusal. */
type ErrorBody = { message?: unknown; code?: unknown; retry_after?: unknown };

/** The refusal's JSON body, or {} when it has none. */
async function errorBody(response: Response): Promise<ErrorBody> {
  try {
    const body: unknown = await response.json();
    return typeof body === 'object' && body !== null ? (body as ErrorBody) : {};
  } catch {
    return {};
  }
}

/**
 * How long a 429 answer asks to wait, in ms: its JSON retry_after (seconds, fractions allowed),
 * else the Retry-After header (retryPolicy.ts reads it), else forever (no retry).
 */
function waitAsked(response: Response, body: ErrorBody): number {
  if (typeof body.retry_after === 'number' && Number.isFinite(body.retry_after)) return Math.max(0, body.retry_after * 1000);
  return retryAfterMs(response.headers.get('retry-after'), Date.now()) ?? Number.POSITIVE_INFINITY;
}

/** Discord's refusal in a line: the status and, when its JSON error body came, its message and code. */
function refusal(response: Response, body: ErrorBody): string {
  const status = `Discord answered ${response.status}`;
  if (typeof body.message !== 'string') return status;
  return `${status}: ${body.message}${typeof body.code === 'number' ? ` (code ${body.code})` : ''}`;
}

/**
 * Acknowledges an interaction with a deferred reply ("thinking…"), the answer to come as an edit
 * (answering/discordDeferredReply.ts). The callback is sent straight from the gateway packet, not
 * through discord.js's interaction and its REST client's per-route queue. (Making the interaction
 * structures is cheap, ~10 us each in a scratch loop; in 12 pairs of chat bench runs against the
 * old path the ack p99 did not measurably change.) It goes over `http2`'s connection when that is
 * up, else over HTTP/1.1. The interaction token is the credential, so no bot token is sent, as
 * discord.js does for this call. A 429 is waited out once when Discord's window still allows it;
 * a call with no answer is given up after `timeoutMs`.
 */
export async function deferInteraction(
  apiBase: string,
  interaction: { id: string; token: string },
  options: { receivedAtMs?: number; timeoutMs?: number; http2?: Http2Origin } = {},
): Promise<DeferralOutcome> {
  const receivedAtMs = options.receivedAtMs ?? Date.now();
  const url = `${apiBase}/v10/interactions/${interaction.id}/${encodeURIComponent(interaction.token)}/callback`;
  const init = { method: 'POST', headers: { 'content-type': 'application/json', 'user-agent': USER_AGENT }, body: DEFERRAL_BODY };
  // Dropped for the rest of this call once a stream on it has failed.
  let http2 = options.http2;
  http2?.open();
  let resent = false;
  let rateLimitWaited = false;
  for (;;) {
    let response: Response;
    const signal = AbortSignal.timeout(options.timeoutMs ?? DEFERRAL_TIMEOUT_MS);
    const viaHttp2 = http2?.ready() === true;
    try {
      response = viaHttp2 ? await http2!.fetch(url, { ...init, signal }) : await nodeHttpFetch(url, { ...init, signal });
    } catch (error) {
      // A stream the HTTP/2 connection lost under it (gone away, reset) is sent once more over
      // HTTP/1.1 while the window lasts; a callback that timed out is not.
      if (viaHttp2 && !signal.aborted && Date.now() < receivedAtMs + ANSWER_WINDOW_MS) {
        http2 = undefined;
        resent = true;
        continue;
      }
      return { ok: false, reason: error instanceof Error ? error.message : String(error) };
    }
    if (response.ok) return { ok: true };
    const body = await errorBody(response);
    // The lost stream had reached Discord after all: the interaction is acknowledged.
    if (resent && body.code === ALREADY_ACKNOWLEDGED) return { ok: true };
    if (response.status === 429 && !rateLimitWaited) {
      rateLimitWaited = true;
      const waitMs = waitAsked(response, body);
      if (Date.now() + waitMs < receivedAtMs + ANSWER_WINDOW_MS) {
        await new Promise((resolve) => setTimeout(resolve, waitMs));
        continue;
      }
    }
    return { ok: false, reason: refusal(response, body) };
  }
}
