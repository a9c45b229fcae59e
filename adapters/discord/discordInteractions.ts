import { PermissionFlagsBits, type ButtonInteraction, type ChatInputCommandInteraction, type Interaction } from 'discord.js';
import type { ActionRequest, CommandRouter } from '../../src/router/routerTypes.ts';
import type { Message } from '../../src/render/message.ts';
import { parseDiscordCustomId } from '../../src/render/encodeDiscord.ts';
import { askRouter } from '../slack/askRouter.ts';
import { discordTextOptionName } from './commands.ts';
import type { DiscordEncoder } from './discordEncoder.ts';
import { discordReplyOptions } from './discordReplyOptions.ts';

export interface InteractionHandlerOptions {
  router: CommandRouter;
  commandName: string;
  encode: DiscordEncoder;
  log: (level: 'warn' | 'error', text: string) => void;
}

/** Only members who may manage the channel may change what it watches (Administrator included). */
function canManage(interaction: ChatInputCommandInteraction | ButtonInteraction): boolean {
  return interaction.memberPermissions?.has(PermissionFlagsBits.ManageChannels) ?? false;
}

function whoAndWhere(interaction: ChatInputCommandInteraction | ButtonInteraction) {
  return {
    platform: 'discord' as const,
    teamId: interaction.guildId ?? '',
    channelId: interaction.channelId,
    userId: interaction.user.id,
    canManageChannel: canManage(interaction),
  };
}

/**
 * Defers at once (Discord gives 3 s to answer an interaction, the forecast may take longer), asks
 * the router, then edits the deferred reply into the answer. Never throws into discord.js.
 */
export function createInteractionHandler(options: InteractionHandlerOptions): (interaction: Interaction) => Promise<void> {
  const { router, commandName, encode, log } = options;

  async function answer(interaction: ChatInputCommandInteraction | ButtonInteraction, ask: () => Promise<Message>): Promise<void> {
    await interaction.deferReply();
    const message = await askRouter(ask, (error) => log('error', `router failed: ${String(error)}`));
    await interaction.editReply(discordReplyOptions(encode(message)));
  }

  return async (interaction) => {
    try {
      if (interaction.isChatInputCommand()) {
        if (interaction.commandName !== commandName) return;
        const text = interaction.options.getString(discordTextOptionName) ?? '';
        await answer(interaction, () => router.handleCommand({ ...whoAndWhere(interaction), text }));
        return;
      }
      if (interaction.isButton()) {
        const parsed = parseDiscordCustomId(interaction.customId);
        if (!parsed) return;
        const request: ActionRequest = { ...whoAndWhere(interaction), actionId: parsed.actionId, value: parsed.value };
        await answer(interaction, () => router.handleAction(request));
      }
    } catch (error) {
      // Expired tokens (more than 15 min), a deleted channel, Discord down: nothing to tell the user through.
      log('warn', `interaction ${interaction.id} not answered: ${error instanceof Error ? error.message : String(error)}`);
    }
  };
}
