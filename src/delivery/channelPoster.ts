import type { Message } from '../render/message.ts';
import type { Platform } from '../router/routerTypes.ts';

/** Where a message goes: a channel on one platform. */
export interface ChannelTarget {
  platform: Platform;
  /** Workspace or guild id ('' where the platform needs none). */
  teamId: string;
  channelId: string;
}

export type PostOutcome =
  | { ok: true; platformMessageId: string | null }
  /** The platform asked us to wait (HTTP 429); retry after this many milliseconds. */
  | { ok: false; kind: 'rate-limited'; retryAfterMs: number; reason: string }
  /** 5xx, timeout or network fault: retry with backoff. */
  | { ok: false; kind: 'retryable'; reason: string }
  /** The channel is gone or the bot was removed: stop posting there. */
  | { ok: false; kind: 'channel-gone'; reason: string }
  /** Anything else the platform refused; not retried. */
  | { ok: false; kind: 'rejected'; reason: string };

/**
 * Posts one message to one channel. Implementations never throw; they shorten a message that is
 * too long for the platform rather than have it refused. `idempotencyKey` is passed to the platform
 * where it supports a client-side key (Discord's nonce with enforce_nonce), so a retried post after
 * a crash is not shown twice.
 */
export interface ChannelPoster {
  readonly platform: Platform;
  post(target: ChannelTarget, message: Message, idempotencyKey: string): Promise<PostOutcome>;
}
