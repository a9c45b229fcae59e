import type { App } from '@slack/bolt';
import { ACTION_IDS, type ActionId } from '../../src/render/message.ts';
import type { HandOff } from '../answering/answerJob.ts';

/** Button action ids are the router's ids, optionally with a ":suffix" that keeps them unique in one message. */
export const slackActionIdPattern = new RegExp(`^(${ACTION_IDS.join('|')})(?::.*)?$`);

export interface SlackListenerOptions {
  commandName: string;
  /** Takes the acknowledged question; the answer goes back later through the response URL. */
  handOff: HandOff;
}

/**
 * Acknowledge at once (Slack gives 3 s) and hand the question over with its response URL: the
 * listener does nothing else, so a burst of commands is acknowledged without waiting for answers.
 * Slack has no per-channel role for "manage channel", so any member may change what the channel
 * watches, as the router contract says.
 */
export function registerSlackListeners(app: App, options: SlackListenerOptions): void {
  const { commandName, handOff } = options;

  app.command(commandName, async ({ ack, command }) => {
    await ack();
    handOff({
      platform: 'slack',
      responseUrl: command.response_url,
      channelId: command.channel_id,
      ask: {
        kind: 'command',
        request: { platform: 'slack', teamId: command.team_id, channelId: command.channel_id, userId: command.user_id, text: command.text ?? '', canManageChannel: true },
      },
    });
  });

  app.action({ action_id: slackActionIdPattern }, async ({ ack, body, action, logger }) => {
    await ack();
    if (body.type !== 'block_actions' || action.type !== 'button' || !('action_id' in action)) return;
    if (!body.response_url) {
      logger.warn('a button press came without a response URL; not answered');
      return;
    }
    const actionId = slackActionIdPattern.exec(action.action_id)?.[1] as ActionId;
    const channelId = body.channel?.id ?? '';
    handOff({
      platform: 'slack',
      responseUrl: body.response_url,
      channelId,
      ask: {
        kind: 'action',
        request: { platform: 'slack', teamId: body.team?.id ?? '', channelId, userId: body.user.id, actionId, value: action.value ?? '', canManageChannel: true },
      },
    });
  });
}
