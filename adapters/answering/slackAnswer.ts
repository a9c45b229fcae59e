import type { WebClient } from '@slack/web-api';
import type { Message } from '../../src/render/message.ts';
import { buildMessage } from '../../src/render/safetyFooter.ts';
import type { SlackEncoding } from '../../src/render/encodeSlack.ts';
import type { SlackEncoder } from '../slack/slackEncoder.ts';
import { slackAppName } from '../slack/slackCommandName.ts';
import { slackPostOutcome } from '../slack/slackPostOutcome.ts';
import { uploadSlackImages } from '../slack/uploadSlackImages.ts';
import { postToResponseUrl } from './slackResponseUrl.ts';

export interface SlackAnswerContext {
  responseUrl: string;
  channelId: string;
  /** Null without a bot token: no upload, no post as the bot. */
  client: WebClient | null;
  encode: SlackEncoder;
  timeoutMs: number;
  log: (level: 'warn' | 'error', text: string) => void;
}

/** Errors and help go only to the person who asked; answers about a place go to the whole channel. */
function slackVisibilityOf(message: Message): 'ephemeral' | 'in_channel' {
  return message.kind === 'error' || message.kind === 'help' ? 'ephemeral' : 'in_channel';
}

async function respond(context: SlackAnswerContext, message: Message, encoded: SlackEncoding = context.encode(message)): Promise<void> {
  const { text, blocks } = encoded;
  await postToResponseUrl(context.responseUrl, { response_type: slackVisibilityOf(message), replace_original: false, text, blocks }, context.timeoutMs);
}

/**
 * Told to the asker alone when the bot cannot post in the channel (a private channel it was never
 * invited to, say): the response URL works there, the bot's own posts do not. With the answer's
 * footer, so a local footer line stays.
 */
function cannotPostMessage(answer: Message, what: 'alerts' | 'chart', reason: string): Message {
  const invite = `\`/invite @${slackAppName()}\``;
  const title =
    what === 'alerts'
      ? `Lapsewatch cannot post in this channel (${reason}), so its alerts and morning summaries would not arrive. Invite it (${invite}), then give the command again.`
      : `The chart is not attached: Lapsewatch cannot post in this channel (${reason}). Invite it (${invite}) for charts, alerts and morning summaries here.`;
  return { ...buildMessage({ kind: 'error', title, sections: [] }), footer: answer.footer };
}

/**
 * One Slack answer. An answer that turned on posts to the channel (a watch, a summary time) is posted as the bot,
 * into the channel, as its alerts will be: if Slack refuses that because the bot cannot post there,
 * the answer goes through the response URL and the asker is told how to fix it, at once rather
 * than by alerts that never come. Other answers go through the response URL, their pictures
 * uploaded into the channel after them.
 */
export async function deliverSlackAnswer(context: SlackAnswerContext, message: Message): Promise<void> {
  const { client, channelId, log } = context;
  const encoded = context.encode(message);
  if (message.postsToChannel && client) {
    try {
      await client.chat.postMessage({ channel: channelId, text: encoded.text, blocks: encoded.blocks as never });
      return;
    } catch (error) {
      const outcome = slackPostOutcome(error);
      await respond(context, message, encoded);
      if (outcome.kind === 'channel-gone') await respond(context, cannotPostMessage(message, 'alerts', outcome.reason));
      else log('warn', `answer in ${channelId} posted through the response URL: ${outcome.reason}`);
      return;
    }
  }
  await respond(context, message, encoded);
  const { files } = encoded;
  if (slackVisibilityOf(message) !== 'in_channel' || files.length === 0) return;
  if (!client) {
    log('warn', `images not attached in ${channelId}: no Slack bot token to upload with`);
    return;
  }
  const uploaded = await uploadSlackImages(client, channelId, files);
  if (uploaded.ok) return;
  log('warn', `images not attached in ${channelId}: ${uploaded.reason}`);
  if (uploaded.channelGone) await respond(context, cannotPostMessage(message, 'chart', uploaded.reason));
}
