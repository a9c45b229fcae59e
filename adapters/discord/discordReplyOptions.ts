import type { InteractionEditReplyOptions } from 'discord.js';
import type { DiscordEncoding } from '../../src/render/encodeDiscord.ts';

/** An encoded message as discord.js reply options, images as PNG attachments the embed refers to. */
export function discordReplyOptions(encoded: DiscordEncoding): InteractionEditReplyOptions {
  return {
    content: encoded.content,
    embeds: encoded.embeds as InteractionEditReplyOptions['embeds'],
    components: encoded.components as InteractionEditReplyOptions['components'],
    allowedMentions: { parse: [] },
    files: encoded.files.map((file) => ({ attachment: Buffer.from(file.png), name: file.fileName, description: file.altText })),
  };
}
