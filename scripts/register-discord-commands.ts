// Registers Lapsewatch's Discord command: `npx tsx scripts/register-discord-commands.ts`.
// Needs DISCORD_TOKEN and DISCORD_APPLICATION_ID; DISCORD_GUILD_ID for one guild (else global);
// DISCORD_API_URL to use another API base (tests, proxies).
import { z } from 'zod';
import { registerDiscordCommands } from '../adapters/discord/registerCommands.ts';

const envSchema = z.object({
  DISCORD_TOKEN: z.string().min(1, 'set DISCORD_TOKEN to the bot token from the Discord developer portal'),
  DISCORD_APPLICATION_ID: z.string().regex(/^\d+$/, 'set DISCORD_APPLICATION_ID to the application id (digits)'),
  DISCORD_GUILD_ID: z.string().regex(/^\d+$/, 'DISCORD_GUILD_ID must be a guild id (digits)').optional(),
  DISCORD_API_URL: z.url('DISCORD_API_URL must be a URL such as https://discord.com/api').optional(),
});

const env = envSchema.safeParse(Object.fromEntries(Object.entries(process.env).filter(([, v]) => v !== '')));
if (!env.success) {
  for (const issue of env.error.issues) console.error(`${issue.path.join('.')}: ${issue.message}`);
  process.exitCode = 2;
} else {
  try {
    const result = await registerDiscordCommands({
      token: env.data.DISCORD_TOKEN,
      applicationId: env.data.DISCORD_APPLICATION_ID,
      ...(env.data.DISCORD_GUILD_ID ? { guildId: env.data.DISCORD_GUILD_ID } : {}),
      ...(env.data.DISCORD_API_URL ? { apiUrl: env.data.DISCORD_API_URL } : {}),
    });
    console.log(`registered /${result.names.join(', /')} (${result.scope === 'guild' ? `guild ${env.data.DISCORD_GUILD_ID}` : 'global'})`);
  } catch (error) {
    console.error(`registration failed: ${error instanceof Error ? error.message : String(error)}`);
    process.exitCode = 1;
  }
}
