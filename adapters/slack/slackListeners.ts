import type { App } from '@slack/bolt';
import type { CommandRouter } from '../../src/router/routerTypes.ts';
import { askRouter } from './askRouter.ts';
import type { SlackEncoder } from './slackEncoder.ts';
import { replyInSlack, type SlackReplyContext } from './slackReply.ts';

/** Button action ids are the router's ids, optionally with a ":suffix" that keeps them unique in one message. */
export const slackActionIdPattern = /^(mute-rule|show-detail)(?::.*)?$/;

/** An expired response URL (30 min) or Slack being down is logged; there is no one else to tell. */
async function replyOrLog(message: Parameters<typeof replyInSlack>[0], context: SlackReplyContext): Promise<void> {
  try {
    await replyInSlack(message, context);
  } catch (error) {
    context.warn(`answer not delivered in ${context.channelId}: ${error instanceof Error ? error.message : String(error)}`);
  }
}

export interface SlackListenerOptions {
  router: CommandRouter;
  commandName: string;
  encode: SlackEncoder;
}

/**
 * The whole Slack conversation: acknowledge at once (Slack gives 3 s), then ask the router and
 * answer through the response URL. Slack has no per-channel role for "manage channel", so any
 * member may change what the channel watches, as the router contract says.
 */
export function registerSlackListeners(app: App, options: SlackListenerOptions): void {
  const { router, commandName, encode } = options;

  app.command(commandName, async ({ ack, command, respond, client, logger }) => {
    await ack();
    const message = await askRouter(
      () =>
        router.handleCommand({
          platform: 'slack',
          teamId: command.team_id,
          channelId: command.channel_id,
          userId: command.user_id,
          text: command.text ?? '',
          canManageChannel: true,
        }),
      (error) => logger.error(`router failed on a command: ${String(error)}`),
    );
    await replyOrLog(message, { respond, client, channelId: command.channel_id, encode, warn: (t) => logger.warn(t) });
  });

  app.action({ action_id: slackActionIdPattern }, async ({ ack, body, action, respond, client, logger }) => {
    await ack();
    if (body.type !== 'block_actions' || action.type !== 'button' || !('action_id' in action)) return;
    const actionId = slackActionIdPattern.exec(action.action_id)?.[1] as 'mute-rule' | 'show-detail';
    const channelId = body.channel?.id ?? '';
    const message = await askRouter(
      () =>
        router.handleAction({
          platform: 'slack',
          teamId: body.team?.id ?? '',
          channelId,
          userId: body.user.id,
          actionId,
          value: action.value ?? '',
          canManageChannel: true,
        }),
      (error) => logger.error(`router failed on a button: ${String(error)}`),
    );
    await replyOrLog(message, { respond, client, channelId, encode, warn: (t) => logger.warn(t) });
  });
}
