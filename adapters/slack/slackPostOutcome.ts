import { WebAPIHTTPError, WebAPIPlatformError, WebAPIRateLimitedError, WebAPIRequestError } from '@slack/web-api';
import type { PostOutcome } from '../../src/delivery/channelPoster.ts';

/** Slack errors that mean the channel cannot take our posts any more (deleted, archived, bot removed). */
const channelGoneErrors = new Set(['channel_not_found', 'not_in_channel', 'is_archived', 'account_inactive', 'team_not_found', 'invalid_auth', 'token_revoked']);

/** Slack's own server-side hiccups, reported in a 200 body. */
const retryablePlatformErrors = new Set(['internal_error', 'fatal_error', 'service_unavailable', 'request_timeout', 'ratelimited']);

/** Turns a Web API failure into what the outbox should do next. Never throws. */
export function slackPostOutcome(error: unknown): Exclude<PostOutcome, { ok: true }> {
  if (error instanceof WebAPIRateLimitedError) {
    return { ok: false, kind: 'rate-limited', retryAfterMs: error.retryAfter * 1000, reason: `Slack rate limit: retry after ${error.retryAfter} s` };
  }
  if (error instanceof WebAPIPlatformError) {
    const code = error.data.error;
    if (channelGoneErrors.has(code)) return { ok: false, kind: 'channel-gone', reason: `Slack: ${code}` };
    if (retryablePlatformErrors.has(code)) return { ok: false, kind: 'retryable', reason: `Slack: ${code}` };
    return { ok: false, kind: 'rejected', reason: `Slack: ${code}` };
  }
  if (error instanceof WebAPIHTTPError) {
    return error.statusCode >= 500
      ? { ok: false, kind: 'retryable', reason: `Slack HTTP ${error.statusCode}` }
      : { ok: false, kind: 'rejected', reason: `Slack HTTP ${error.statusCode}` };
  }
  if (error instanceof WebAPIRequestError) {
    return { ok: false, kind: 'retryable', reason: `network: ${error.original?.message ?? error.message}` };
  }
  return { ok: false, kind: 'retryable', reason: error instanceof Error ? error.message : String(error) };
}

export function isMessageTooLong(error: unknown): boolean {
  return error instanceof WebAPIPlatformError && error.data.error === 'msg_too_long';
}
