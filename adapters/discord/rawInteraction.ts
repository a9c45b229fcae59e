import { ChannelType, InteractionType, PermissionFlagsBits, PermissionsBitField } from 'discord.js';
import { z } from 'zod';
import { parseDiscordCustomId } from '../../src/render/encodeDiscord.ts';
import type { Ask } from '../answering/answerJob.ts';
import { discordTextOptionName } from './commands.ts';

/** Discord's chat-input application command and button component kinds (API numbers). */
const CHAT_INPUT_COMMAND = 1;
const BUTTON_COMPONENT = 2;
const THREAD_TYPES: readonly number[] = [ChannelType.PublicThread, ChannelType.PrivateThread, ChannelType.AnnouncementThread];

const snowflake = z.string().regex(/^\d{1,20}$/);
/** A permission bitfield as Discord sends it: a decimal string. */
const permissionBits = z.string().regex(/^\d{1,40}$/);

/**
 * The part of an INTERACTION_CREATE payload we read (Discord developer docs, "Interactions":
 * interaction object), checked before anything is sent or handed on; other fields pass unread.
 */
const rawInteractionSchema = z.object({
  id: snowflake,
  token: z.string().min(1).max(1000),
  application_id: snowflake,
  type: z.number().int(),
  guild_id: snowflake.optional(),
  channel_id: snowflake.optional(),
  channel: z.object({ type: z.number().int() }).optional(),
  member: z.object({ permissions: permissionBits, user: z.object({ id: snowflake }) }).optional(),
  user: z.object({ id: snowflake }).optional(),
  app_permissions: permissionBits.optional(),
  data: z
    .object({
      name: z.string().optional(),
      type: z.number().int().optional(),
      options: z.array(z.object({ name: z.string(), type: z.number().int(), value: z.unknown().optional() })).optional(),
      custom_id: z.string().optional(),
      component_type: z.number().int().optional(),
    })
    .optional(),
});
type RawInteraction = z.infer<typeof rawInteractionSchema>;

/** An interaction that is ours: what to acknowledge it by, and the question it asks. */
export interface OurInteraction {
  id: string;
  token: string;
  applicationId: string;
  ask: Ask;
}

/**
 * What the bot's own posts in a channel need: alerts and summaries are embeds, some with a chart.
 * In a thread, Discord asks for Send Messages in Threads instead of Send Messages.
 */
export function channelPostPermissions(inThread: boolean): bigint[] {
  return [PermissionFlagsBits.ViewChannel, inThread ? PermissionFlagsBits.SendMessagesInThreads : PermissionFlagsBits.SendMessages, PermissionFlagsBits.EmbedLinks, PermissionFlagsBits.AttachFiles];
}

/**
 * Who asks and where, as the router needs it. Only members who may manage the channel may change
 * what it watches (Administrator counts, as PermissionsBitField.has treats it). Whether the bot
 * may post its alerts here comes from the app's permissions in this channel, which Discord sends
 * with every interaction, and from the type of the channel the interaction carries (a thread asks
 * for another permission); without them nothing is claimed.
 */
function whoAndWhere(raw: RawInteraction) {
  const memberPermissions = raw.member ? new PermissionsBitField(BigInt(raw.member.permissions)) : null;
  const appPermissions = raw.app_permissions === undefined ? null : new PermissionsBitField(BigInt(raw.app_permissions));
  const inThread = raw.channel !== undefined && THREAD_TYPES.includes(raw.channel.type);
  return {
    platform: 'discord' as const,
    teamId: raw.guild_id ?? '',
    channelId: raw.channel_id ?? '',
    userId: raw.member?.user.id ?? raw.user?.id ?? '',
    canManageChannel: memberPermissions?.has(PermissionFlagsBits.ManageChannels) ?? false,
    ...(appPermissions ? { botCanPost: appPermissions.has(channelPostPermissions(inThread)) } : {}),
  };
}

/**
 * Reads an INTERACTION_CREATE payload as the gateway sent it: our slash command or a press of one
 * of our buttons, for our application. Anything else (another application's, another command, a
 * payload missing what we need) is null and is left alone.
 */
export function readRawInteraction(payload: unknown, ours: { applicationId: string; commandName: string }): OurInteraction | null {
  const parsed = rawInteractionSchema.safeParse(payload);
  if (!parsed.success) return null;
  const raw = parsed.data;
  if (raw.application_id !== ours.applicationId || raw.channel_id === undefined) return null;
  const base = { id: raw.id, token: raw.token, applicationId: raw.application_id };
  if (raw.type === InteractionType.ApplicationCommand && raw.data?.type === CHAT_INPUT_COMMAND && raw.data.name === ours.commandName) {
    const option = raw.data.options?.find((candidate) => candidate.name === discordTextOptionName);
    const text = typeof option?.value === 'string' ? option.value : '';
    return { ...base, ask: { kind: 'command', request: { ...whoAndWhere(raw), text } } };
  }
  if (raw.type === InteractionType.MessageComponent && raw.data?.component_type === BUTTON_COMPONENT && raw.data.custom_id !== undefined) {
    const action = parseDiscordCustomId(raw.data.custom_id);
    if (!action) return null;
    return { ...base, ask: { kind: 'action', request: { ...whoAndWhere(raw), actionId: action.actionId, value: action.value } } };
  }
  return null;
}
