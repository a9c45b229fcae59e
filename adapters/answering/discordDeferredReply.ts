import type { REST } from '@discordjs/rest';
import { Routes } from 'discord-api-types/v10';
import type { DiscordEncoding } from '../../src/render/encodeDiscord.ts';
import { discordSendData } from '../discord/discordSendData.ts';

/**
 * Turns a deferred interaction reply into the answer: PATCH of the original response through the
 * interaction's webhook (application id + interaction token), the same call discord.js makes for
 * `editReply`. The token is the credential, so no bot token is sent (`auth: false`).
 */
export async function editDeferredReply(rest: REST, applicationId: string, interactionToken: string, encoded: DiscordEncoding): Promise<void> {
  const body = {
    content: encoded.content,
    embeds: encoded.embeds,
    components: encoded.components,
    allowed_mentions: encoded.allowed_mentions,
    attachments: encoded.files.map((file, index) => ({ id: index, filename: file.fileName, description: file.altText })),
  };
  await rest.patch(Routes.webhookMessage(applicationId, interactionToken, '@original'), { auth: false, ...discordSendData(body, encoded.files) });
}
