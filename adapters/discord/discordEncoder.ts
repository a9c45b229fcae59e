import type { Message } from '../../src/render/message.ts';
import { encodeForDiscord, type DiscordEncoding } from '../../src/render/encodeDiscord.ts';

/** What the Discord adapter needs from the renderer: content fallback, embeds, buttons, images. */
export type DiscordEncoder = (message: Message) => DiscordEncoding;

export const defaultDiscordEncoder: DiscordEncoder = encodeForDiscord;
