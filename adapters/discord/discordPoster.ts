// @discordjs/rest alone: loading all of discord.js costs a sender process seconds at start-up.
import { REST } from '@discordjs/rest';
import { Routes, type APIMessage } from 'discord-api-types/v10';
import type { ChannelPoster, ChannelTarget, PostOutcome } from '../../src/delivery/channelPoster.ts';
import type { DiscordEncoding } from '../../src/render/encodeDiscord.ts';
import type { Message } from '../../src/render/message.ts';
import { footerOf } from '../../src/render/safetyFooter.ts';
import { fitWithTail } from '../../src/render/textFit.ts';
import { defaultDiscordEncoder, type DiscordEncoder } from './discordEncoder.ts';
import { discordPostOutcome, isInvalidFormBody } from './discordPostOutcome.ts';
import { discordRestBase } from './fetchRequest.ts';
import { nonceFromKey } from './nonceFromKey.ts';
import { discordSendData } from './discordSendData.ts';

export interface DiscordPosterOptions {
  token: string;
  /** API base including "/api"; Discord's own when absent. */
  apiUrl?: string;
  encode?: DiscordEncoder;
  /** Per-request timeout; a timeout is reported as retryable. Default 10 s. */
  timeoutMs?: number;
}

type Body = Record<string, unknown>;

function fullBody(encoded: DiscordEncoding, nonce: string): Body {
  return {
    content: encoded.content,
    embeds: encoded.embeds,
    components: encoded.components,
    allowed_mentions: encoded.allowed_mentions,
    attachments: encoded.files.map((file, index) => ({ id: index, filename: file.fileName, description: file.altText })),
    nonce,
    enforce_nonce: true,
  };
}

/** The smallest answer Discord takes: headline and footer as plain content, same nonce. */
function shortBody(message: Message, nonce: string): Body {
  return {
    content: fitWithTail(`**${message.title}**\n(shortened: ask for the full answer with the command)`, footerOf(message), 2000),
    allowed_mentions: { parse: [] },
    nonce,
    enforce_nonce: true,
  };
}

/**
 * Posts alerts and summaries with POST /channels/{id}/messages. The idempotency key travels as
 * `nonce` with `enforce_nonce: true`: a repeat inside Discord's nonce window (a few minutes) gets
 * the first message back instead of a second post. Outside that window a crash between post and
 * mark can still post twice.
 *
 * @discordjs/rest's own policy is switched off so each outcome comes back to the outbox at once:
 * `retries: 0` (no silent retry of 5xx or network errors) and `rejectOnRateLimit` always, which
 * turns both a 429 and a known-exhausted bucket into a RateLimitError instead of a sleep.
 */
export function createDiscordPoster(options: DiscordPosterOptions): ChannelPoster {
  const rest = new REST({
    ...discordRestBase(options.apiUrl),
    retries: 0,
    rejectOnRateLimit: () => true,
    offset: 0,
    timeout: options.timeoutMs ?? 10_000,
  }).setToken(options.token);
  const encode = options.encode ?? defaultDiscordEncoder;

  async function send(channelId: string, body: Body, encoded?: DiscordEncoding): Promise<string | null> {
    const sent = (await rest.post(Routes.channelMessages(channelId), discordSendData(body, encoded?.files ?? []))) as APIMessage;
    return sent?.id ?? null;
  }

  return {
    platform: 'discord',
    async post(target: ChannelTarget, message: Message, idempotencyKey: string): Promise<PostOutcome> {
      const nonce = nonceFromKey(idempotencyKey);
      let encoded: DiscordEncoding;
      try {
        encoded = encode(message);
      } catch (error) {
        return { ok: false, kind: 'rejected', reason: `could not encode the message: ${String(error)}` };
      }
      try {
        return { ok: true, platformMessageId: await send(target.channelId, fullBody(encoded, nonce), encoded) };
      } catch (error) {
        if (!isInvalidFormBody(error)) return discordPostOutcome(error);
      }
      try {
        return { ok: true, platformMessageId: await send(target.channelId, shortBody(message, nonce)) };
      } catch (again) {
        return discordPostOutcome(again);
      }
    },
  };
}
