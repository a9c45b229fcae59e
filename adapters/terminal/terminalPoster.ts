import type { ChannelPoster, ChannelTarget, PostOutcome } from '../../src/delivery/channelPoster.ts';
import { encodeForTerminal } from '../../src/render/encodeTerminal.ts';
import type { Message } from '../../src/render/message.ts';

/**
 * Scheduled messages (morning summaries, alerts) for the terminal channel: printed where the user
 * is typing. Keys already printed in this process are not printed again, the terminal's own
 * client-side idempotency.
 */
export function createTerminalPoster(output: NodeJS.WritableStream & { isTTY?: boolean }): ChannelPoster {
  const printedKeys = new Set<string>();
  return {
    platform: 'terminal',
    async post(_target: ChannelTarget, message: Message, idempotencyKey: string): Promise<PostOutcome> {
      if (!printedKeys.has(idempotencyKey)) {
        printedKeys.add(idempotencyKey);
        output.write(`\n${encodeForTerminal(message, { color: output.isTTY === true })}\n`);
      }
      return { ok: true, platformMessageId: idempotencyKey };
    },
  };
}
