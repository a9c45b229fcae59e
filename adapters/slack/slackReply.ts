import type { RespondFn } from '@slack/bolt';
import type { WebClient } from '@slack/web-api';
import type { Message } from '../../src/render/message.ts';
import type { SlackEncoder } from './slackEncoder.ts';
import { uploadSlackImages } from './uploadSlackImages.ts';

export interface SlackReplyContext {
  respond: RespondFn;
  client: WebClient;
  channelId: string;
  encode: SlackEncoder;
  warn: (text: string) => void;
}

/** Errors and help go only to the person who asked; answers about a place go to the whole channel. */
function visibilityOf(message: Message): 'ephemeral' | 'in_channel' {
  return message.kind === 'error' || message.kind === 'help' ? 'ephemeral' : 'in_channel';
}

/**
 * Answers through the response URL (valid for 30 minutes after the command), which works even
 * where the bot is not a member; the images follow as a file upload into the channel.
 */
export async function replyInSlack(message: Message, context: SlackReplyContext): Promise<void> {
  const { text, blocks, files } = context.encode(message);
  const responseType = visibilityOf(message);
  await context.respond({ response_type: responseType, replace_original: false, text, blocks: blocks as never });
  if (responseType === 'in_channel' && files.length > 0) {
    const uploaded = await uploadSlackImages(context.client, context.channelId, files);
    if (!uploaded.ok) context.warn(`images not attached in ${context.channelId}: ${uploaded.reason}`);
  }
}
