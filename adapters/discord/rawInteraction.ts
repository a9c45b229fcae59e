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
function channelPostPermissions(inThread: boolean): bigint[] {
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

/** Invented ids for the warm-up's payloads (no real guild, channel or user). */
const WARM_UP_GUILD = '1000000000000000001';
const WARM_UP_CHANNEL = '1000000000000000002';
const WARM_UP_USER = '1000000000000000003';

/** An INTERACTION_CREATE as Discord sends it, for the warm-up: our command, or a press of one of our buttons. */
function warmUpPayload(round: number, ours: { applicationId: string; commandName: string }): object {
  const base = {
    id: String(1000000000000000100n + BigInt(round)),
    token: `warm-up-${round}`,
    application_id: ours.applicationId,
    version: 1,
    guild_id: WARM_UP_GUILD,
    channel_id: WARM_UP_CHANNEL,
    channel: { id: WARM_UP_CHANNEL, type: round % 3 === 0 ? ChannelType.PublicThread : ChannelType.GuildText, guild_id: WARM_UP_GUILD, name: 'warm-up', permissions: '52224' },
    member: { user: { id: WARM_UP_USER, username: 'warm-up', discriminator: '0', global_name: null, avatar: null }, roles: [], joined_at: new Date(0).toISOString(), deaf: false, mute: false, flags: 0, permissions: '2064' },
    app_permissions: '52224',
    locale: 'en-US',
    guild_locale: 'en-US',
    entitlements: [],
    context: 0,
  };
  return round % 2 === 0
    ? { ...base, type: InteractionType.ApplicationCommand, data: { id: '1000000000000000009', name: ours.commandName, type: CHAT_INPUT_COMMAND, options: [{ name: discordTextOptionName, type: 3, value: `warm-up ${round}` }] } }
    : { ...base, type: InteractionType.MessageComponent, data: { custom_id: `mute-rule:warm-up-${round}`, component_type: BUTTON_COMPONENT } };
}

/** Payloads the warm-up reads: zod compiles a schema's fast path on first use and V8 optimises it over the next few dozen calls. */
export const RAW_INTERACTION_WARM_UP_ROUNDS = 64;

/**
 * Reads invented payloads (commands and button presses, alternately) before the first real one,
 * so that the first burst of interactions after a start does not meet a cold reader. Measured
 * with a scratch script in fresh processes: cold, the first read took 5.7-7.9 ms and the next
 * thirty mostly 40-430 us each; after these 64 reads (16-18 ms, once, at start) the next thirty
 * took 19-89 us. Nothing is sent or handed on. Returns how many were read as ours.
 */
export function warmUpRawInteractionReader(ours: { applicationId: string; commandName: string }, rounds: number = RAW_INTERACTION_WARM_UP_ROUNDS): number {
  let read = 0;
  for (let round = 0; round < rounds; round += 1) if (readRawInteraction(warmUpPayload(round, ours), ours)) read += 1;
  return read;
}
