import { WebClient, LogLevel } from '@slack/web-api';
import type { ChannelPoster, ChannelTarget, PostOutcome } from '../../src/delivery/channelPoster.ts';
import type { Message } from '../../src/render/message.ts';
import { footerOf } from '../../src/render/safetyFooter.ts';
import { fitWithTail } from '../../src/render/textFit.ts';
import { slackClientBaseOptions } from './slackClientOptions.ts';
import { defaultSlackEncoder, type SlackEncoder } from './slackEncoder.ts';
import { isMessageTooLong, slackPostOutcome } from './slackPostOutcome.ts';
import { uploadSlackImages } from './uploadSlackImages.ts';

export interface SlackPosterOptions {
  botToken: string;
  /** Web API base, e.g. "http://127.0.0.1:4000/api/"; Slack's own when absent. */
  apiUrl?: string;
  encode?: SlackEncoder;
  /** Per-request timeout; a timeout is reported as retryable. Default 10 s. */
  timeoutMs?: number;
  /** Told when images could not follow a posted message (the post itself still counts). */
  warn?: (text: string) => void;
}

/** The smallest answer Slack takes: the headline and the footer, as plain text. */
const SHORT_TEXT_MAX = 1500;

function shortenedPayload(message: Message): { text: string } {
  return { text: fitWithTail(`${message.title}\n(shortened: ask for the full answer with the command)`, footerOf(message), SHORT_TEXT_MAX) };
}

/**
 * Posts alerts and summaries with chat.postMessage. The client's own retries and rate-limit
 * waiting are switched off (retries: 0, rejectRateLimitedCalls) so every failure comes straight
 * back as a PostOutcome and the outbox alone owns the retry policy.
 *
 * Slack has no client-side idempotency key for chat.postMessage, so `idempotencyKey` cannot be
 * passed on: the duplicate window is a crash between the post and the outbox's mark, in which
 * case the message is posted again (at least once, possibly twice).
 */
export function createSlackPoster(options: SlackPosterOptions): ChannelPoster {
  const client = new WebClient(options.botToken, {
    ...slackClientBaseOptions(options.apiUrl),
    retryConfig: { retries: 0 },
    rejectRateLimitedCalls: true,
    timeout: options.timeoutMs ?? 10_000,
    logLevel: LogLevel.ERROR,
  });
  const encode = options.encode ?? defaultSlackEncoder;
  const warn = options.warn ?? (() => {});

  async function postOnce(channel: string, payload: { text: string; blocks?: object[] }): Promise<string | null> {
    const result = await client.chat.postMessage({ channel, text: payload.text, ...(payload.blocks ? { blocks: payload.blocks as never } : {}) });
    return result.ts ?? null;
  }

  return {
    platform: 'slack',
    async post(target: ChannelTarget, message: Message, _idempotencyKey: string): Promise<PostOutcome> {
      let encoded;
      try {
        encoded = encode(message);
      } catch (error) {
        return { ok: false, kind: 'rejected', reason: `could not encode the message: ${String(error)}` };
      }
      let ts: string | null;
      try {
        ts = await postOnce(target.channelId, encoded);
      } catch (error) {
        if (!isMessageTooLong(error)) return slackPostOutcome(error);
        try {
          ts = await postOnce(target.channelId, shortenedPayload(message));
        } catch (again) {
          return slackPostOutcome(again);
        }
      }
      // The chart follows in the message's thread; losing it does not undo the post.
      const uploaded = await uploadSlackImages(client, target.channelId, encoded.files, ts ?? undefined);
      if (!uploaded.ok) warn(`images not attached in ${target.channelId}: ${uploaded.reason}`);
      return { ok: true, platformMessageId: ts };
    },
  };
}
