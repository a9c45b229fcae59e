import type { ChannelPoster, ChannelTarget, PostOutcome } from '../../src/delivery/channelPoster.ts';
import { encodeForTerminal } from '../../src/render/encodeTerminal.ts';
import type { Message } from '../../src/render/message.ts';

/**
 * Keys remembered: a repeat comes only from a post whose outbox mark was lost, soon after the post,
 * so the most recent few thousand are plenty and a long session does not grow without end.
 */
const REMEMBERED_KEYS = 5_000;

/**
 * Scheduled messages (morning summaries, alerts) for the terminal channel: printed where the user
 * is typing. Keys already printed in this process are not printed again, the terminal's own
 * client-side idempotency.
 */
export function createTerminalPoster(output: NodeJS.WritableStream & { isTTY?: boolean }, rememberedKeys: number = REMEMBERED_KEYS): ChannelPoster {
  // A Set iterates in insertion order, so its first key is the oldest.
  const printedKeys = new Set<string>();
  return {
    platform: 'terminal',
    async post(_target: ChannelTarget, message: Message, idempotencyKey: string): Promise<PostOutcome> {
      if (!printedKeys.has(idempotencyKey)) {
        printedKeys.add(idempotencyKey);
        if (printedKeys.size > rememberedKeys) printedKeys.delete(printedKeys.values().next().value as string);
        output.write(`\n${encodeForTerminal(message, { color: output.isTTY === true })}\n`);
      }
      return { ok: true, platformMessageId: idempotencyKey };
    },
  };
}
