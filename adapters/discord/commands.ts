import { ApplicationCommandOptionType, ApplicationCommandType, InteractionContextType, type RESTPostAPIChatInputApplicationCommandsJSONBody } from 'discord.js';
import { slackCommandDescription, slackCommandName } from '../slack/slackCommandName.ts';

/** The one text option: what follows the command, handed to the router exactly as Slack's text is. */
export const discordTextOptionName = 'text';

/** Same name as the Slack slash command (read from the Slack manifest), without the slash. */
export function discordCommandName(): string {
  return slackCommandName().slice(1);
}

/**
 * Lapsewatch's application command: one top-level command with one free-text option, so the
 * router parses the same text on both platforms and a new subcommand needs no re-registration.
 */
export function discordCommandDefinitions(): RESTPostAPIChatInputApplicationCommandsJSONBody[] {
  return [
    {
      type: ApplicationCommandType.ChatInput,
      name: discordCommandName(),
      description: slackCommandDescription().slice(0, 100),
      contexts: [InteractionContextType.Guild],
      options: [
        {
          type: ApplicationCommandOptionType.String,
          name: discordTextOptionName,
          description: 'LAT,LON or a saved place, or "help" for the list of commands',
          required: false,
          max_length: 500,
        },
      ],
    },
  ];
}
