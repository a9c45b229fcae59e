import type { ActionId, Message } from '../render/message.ts';

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
  /**
   * Whether the bot may post in the channel, where the platform says so with the command
   * (Discord's app permissions); absent where it does not (Slack checks when it answers).
   */
  botCanPost?: boolean;
}

/** A button press coming back from a message. */
export interface ActionRequest {
  platform: Platform;
  teamId: string;
  channelId: string;
  userId: string;
  actionId: ActionId;
  value: string;
  canManageChannel: boolean;
  /** As for a command: where the platform says so with the press (Discord), else absent. */
  botCanPost?: boolean;
}

/** The router never throws: every outcome, including a user's mistake, is a message. */
export interface CommandRouter {
  handleCommand(request: CommandRequest): Promise<Message>;
  handleAction(request: ActionRequest): Promise<Message>;
}
