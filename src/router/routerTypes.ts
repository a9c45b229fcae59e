import type { Message } from '../render/message.ts';

export type Platform = 'slack' | 'discord' | 'terminal';

/** A command as an adapter hands it over: the text after the slash command's name. */
export interface CommandRequest {
  platform: Platform;
  /** Workspace or guild id; '' for the terminal. */
  teamId: string;
  channelId: string;
  userId: string;
  text: string;
  /** The user may change what the channel watches (Discord: Manage Channels; Slack: any member). */
  canManageChannel: boolean;
}

/** A button press coming back from a message. */
export interface ActionRequest {
  platform: Platform;
  teamId: string;
  channelId: string;
  userId: string;
  actionId: 'mute-rule' | 'show-detail';
  value: string;
  canManageChannel: boolean;
}

/** What a caller may ask of the router beside the answer itself. */
export interface AnswerHooks {
  /**
   * Called at most once, while the answer's picture is still being drawn, with the answer without
   * it: an adapter can post the text at once and send the picture when the full answer resolves.
   * Not called when the picture is ready already.
   */
  textReady?: (textOnly: Message) => void;
}

/** The router never throws: every outcome, including a user's mistake, is a message. */
export interface CommandRouter {
  handleCommand(request: CommandRequest, hooks?: AnswerHooks): Promise<Message>;
  handleAction(request: ActionRequest, hooks?: AnswerHooks): Promise<Message>;
}
