export { createDiscordBot, startDiscordBot, startDiscordReceiver, type DiscordBotOptions, type DiscordReceiverOptions, type RunningDiscordBot } from './createDiscordBot.ts';
export { createDiscordPoster, type DiscordPosterOptions } from './discordPoster.ts';
export { discordCommandDefinitions, discordCommandName } from './commands.ts';
export { registerDiscordCommands, type RegisterCommandsOptions } from './registerCommands.ts';
