// The same module as the poster's REST client: discord.js's own copy is a different class (CJS build).
import { DiscordAPIError, HTTPError, RateLimitError } from '@discordjs/rest';
import type { PostOutcome } from '../../src/delivery/channelPoster.ts';

/**
 * Discord error codes that mean we cannot post in this channel any more: 10003 Unknown Channel,
 * 10004 Unknown Guild, 50001 Missing Access (bot removed or channel hidden from it), 50013
 * Missing Permissions (Send Messages taken away). The outbox stops posting there and logs it.
 */
const channelGoneCodes = new Set([10003, 10004, 50001, 50013]);

/** 50035 Invalid Form Body: for a message we encoded within limits, it means "too long". */
export function isInvalidFormBody(error: unknown): boolean {
  return error instanceof DiscordAPIError && error.code === 50035;
}

/** Turns a REST failure into what the outbox should do next. Never throws. */
export function discordPostOutcome(error: unknown): Exclude<PostOutcome, { ok: true }> {
  if (error instanceof RateLimitError) {
    return { ok: false, kind: 'rate-limited', retryAfterMs: Math.max(0, Math.ceil(error.retryAfter)), reason: `Discord rate limit on ${error.route}${error.global ? ' (global)' : ''}` };
  }
  if (error instanceof DiscordAPIError) {
    const code = typeof error.code === 'number' ? error.code : Number.NaN;
    if (channelGoneCodes.has(code)) return { ok: false, kind: 'channel-gone', reason: `Discord ${code}: ${error.message}` };
    if (error.status >= 500) return { ok: false, kind: 'retryable', reason: `Discord HTTP ${error.status}` };
    return { ok: false, kind: 'rejected', reason: `Discord ${error.code}: ${error.message}` };
  }
  if (error instanceof HTTPError) {
    return error.status >= 500
      ? { ok: false, kind: 'retryable', reason: `Discord HTTP ${error.status}` }
      : { ok: false, kind: 'rejected', reason: `Discord HTTP ${error.status}` };
  }
  // Timeouts (AbortError), refused connections, resets: the post may or may not have landed.
  return { ok: false, kind: 'retryable', reason: `network: ${error instanceof Error ? error.message : String(error)}` };
}
