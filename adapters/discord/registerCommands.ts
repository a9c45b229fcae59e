import { REST, Routes } from 'discord.js';
import { discordCommandDefinitions } from './commands.ts';
import { discordRestBase } from './fetchRequest.ts';

export interface RegisterCommandsOptions {
  token: string;
  applicationId: string;
  /** Register for one guild (shows at once); globally when absent (may take up to an hour). */
  guildId?: string;
  /** API base including "/api", e.g. "http://127.0.0.1:4000/api"; Discord's own when absent. */
  apiUrl?: string;
}

export interface RegisterCommandsResult {
  scope: 'guild' | 'global';
  names: string[];
}

/** Replaces the application's commands with ours (a bulk PUT, so removed commands disappear). */
export async function registerDiscordCommands(options: RegisterCommandsOptions): Promise<RegisterCommandsResult> {
  const rest = new REST({ ...discordRestBase(options.apiUrl), retries: 1 }).setToken(options.token);
  const route = options.guildId
    ? Routes.applicationGuildCommands(options.applicationId, options.guildId)
    : Routes.applicationCommands(options.applicationId);
  const definitions = discordCommandDefinitions();
  await rest.put(route, { body: definitions });
  return { scope: options.guildId ? 'guild' : 'global', names: definitions.map((d) => d.name) };
}
