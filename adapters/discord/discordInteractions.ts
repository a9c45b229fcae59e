import { PermissionFlagsBits, type ButtonInteraction, type ChatInputCommandInteraction, type Interaction } from 'discord.js';
import { parseDiscordCustomId } from '../../src/render/encodeDiscord.ts';
import type { Ask, HandOff } from '../answering/answerJob.ts';
import { discordTextOptionName } from './commands.ts';

export interface InteractionHandlerOptions {
  commandName: string;
  /** Takes the deferred question; the answer comes later as an edit of the deferred reply. */
  handOff: HandOff;
  log: (level: 'warn' | 'error', text: string) => void;
}

/**
 * What the bot's own posts in a channel need: alerts and summaries are embeds, some with a chart.
 * In a thread, Discord asks for Send Messages in Threads instead of Send Messages.
 */
export function channelPostPermissions(inThread: boolean): bigint[] {
  return [PermissionFlagsBits.ViewChannel, inThread ? PermissionFlagsBits.SendMessagesInThreads : PermissionFlagsBits.SendMessages, PermissionFlagsBits.EmbedLinks, PermissionFlagsBits.AttachFiles];
}

/** Only members who may manage the channel may change what it watches (Administrator included). */
function canManage(interaction: ChatInputCommandInteraction | ButtonInteraction): boolean {
  return interaction.memberPermissions?.has(PermissionFlagsBits.ManageChannels) ?? false;
}

/**
 * Whether the bot may post its alerts here. Discord sends the app's permissions in this channel
 * with every interaction: no request needed. Whether the channel is a thread comes from the cache
 * the Guilds intent keeps, or from the channel the interaction carries (Partials.Channel,
 * createDiscordBot.ts); one that is in neither (its guild unknown) is judged as a channel.
 */
function botCanPostHere(interaction: ChatInputCommandInteraction | ButtonInteraction): { botCanPost?: boolean } {
  const inThread = interaction.channel?.isThread() ?? false;
  const botCanPost = interaction.appPermissions?.has(channelPostPermissions(inThread));
  return botCanPost === undefined ? {} : { botCanPost };
}

function whoAndWhere(interaction: ChatInputCommandInteraction | ButtonInteraction) {
  return {
    platform: 'discord' as const,
    teamId: interaction.guildId ?? '',
    channelId: interaction.channelId,
    userId: interaction.user.id,
    canManageChannel: canManage(interaction),
    ...botCanPostHere(interaction),
  };
}

/** The question an interaction asks, or null for one that is not ours. */
function askOf(interaction: Interaction, commandName: string): { interaction: ChatInputCommandInteraction | ButtonInteraction; ask: Ask } | null {
  if (interaction.isChatInputCommand()) {
    if (interaction.commandName !== commandName) return null;
    const text = interaction.options.getString(discordTextOptionName) ?? '';
    return { interaction, ask: { kind: 'command', request: { ...whoAndWhere(interaction), text } } };
  }
  if (interaction.isButton()) {
    const parsed = parseDiscordCustomId(interaction.customId);
    if (!parsed) return null;
    return { interaction, ask: { kind: 'action', request: { ...whoAndWhere(interaction), actionId: parsed.actionId, value: parsed.value } } };
  }
  return null;
}

/**
 * Defers at once (Discord gives 3 s to answer an interaction, the forecast may take longer) and
 * hands the question over with the interaction's token, through which the answer later edits the
 * deferred reply. Never throws into discord.js.
 */
export function createInteractionHandler(options: InteractionHandlerOptions): (interaction: Interaction) => Promise<void> {
  const { commandName, handOff, log } = options;
  return async (incoming) => {
    const found = askOf(incoming, commandName);
    if (!found) return;
    const { interaction, ask } = found;
    try {
      await interaction.deferReply();
    } catch (error) {
      // Expired (more than 3 s late), a deleted channel, Discord down: nothing to tell the user through.
      log('warn', `interaction ${interaction.id} not acknowledged: ${error instanceof Error ? error.message : String(error)}`);
      return;
    }
    handOff({ platform: 'discord', ask, applicationId: interaction.applicationId, interactionToken: interaction.token });
  };
}
