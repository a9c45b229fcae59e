import { Client, Events, GatewayIntentBits } from 'discord.js';
import type { CommandRouter } from '../../src/router/routerTypes.ts';
import { discordCommandName } from './commands.ts';
import { fetchRequest } from './fetchRequest.ts';
import { defaultDiscordEncoder, type DiscordEncoder } from './discordEncoder.ts';
import { createInteractionHandler } from './discordInteractions.ts';

export interface DiscordBotOptions {
  router: CommandRouter;
  token: string;
  /** Interactions for other applications (none should arrive) are ignored. */
  applicationId: string;
  /**
   * API base including "/api", e.g. "http://127.0.0.1:4000/api"; Discord's own when absent. The
   * gateway address is not configured separately: discord.js asks GET /gateway/bot on this base.
   */
  apiUrl?: string;
  encode?: DiscordEncoder;
  log?: (level: 'warn' | 'error', text: string) => void;
  /** How long to wait for the gateway's READY. Default 30 s. */
  readyTimeoutMs?: number;
}

export interface RunningDiscordBot {
  client: Client;
  stop(): Promise<void>;
}

/** A ceiling for our own client-side queue, far above any burst an incident channel produces. */
const INTERACTION_REPLIES_PER_SECOND = 1000;

/** Builds the discord.js client with our interaction handler; `startDiscordBot` logs it in. */
export function createDiscordBot(options: DiscordBotOptions): Client {
  // Interactions arrive without any privileged intent; Guilds keeps the channel cache useful.
  // This client only answers interactions (deferral, then an edit of the original reply through the
  // interaction's webhook token), and Discord's interaction endpoints are not bound to the bot's
  // global rate limit (Discord developer docs, "Receiving and Responding": endpoints). The
  // library's client-side 50 requests/s default would queue replies for no reason under a burst;
  // per-route limits and 429 answers are still honoured. Channel posts go through the outbox's
  // poster, a separate REST client that keeps the default.
  const client = new Client({
    intents: [GatewayIntentBits.Guilds],
    rest: { makeRequest: fetchRequest, globalRequestsPerSecond: INTERACTION_REPLIES_PER_SECOND, ...(options.apiUrl ? { api: options.apiUrl } : {}) },
  });
  const log = options.log ?? ((level, text) => console[level](`[discord] ${text}`));
  const handle = createInteractionHandler({
    router: options.router,
    commandName: discordCommandName(),
    encode: options.encode ?? defaultDiscordEncoder,
    log,
  });
  client.on(Events.InteractionCreate, (interaction) => {
    if (interaction.applicationId !== options.applicationId) return;
    void handle(interaction);
  });
  client.on(Events.Error, (error) => log('error', `client error: ${error.message}`));
  return client;
}

/** Logs in and resolves once the gateway has said READY. */
export async function startDiscordBot(options: DiscordBotOptions): Promise<RunningDiscordBot> {
  const client = createDiscordBot(options);
  let timer: NodeJS.Timeout | undefined;
  const ready = new Promise<void>((resolve, reject) => {
    timer = setTimeout(() => reject(new Error('Discord gateway did not become ready in time')), options.readyTimeoutMs ?? 30_000);
    client.once(Events.ClientReady, () => resolve());
  });
  try {
    // Together, so a failed login does not leave the ready timeout rejecting unobserved.
    await Promise.all([client.login(options.token), ready]);
  } catch (error) {
    await client.destroy();
    throw error;
  } finally {
    clearTimeout(timer);
  }
  return { client, stop: () => client.destroy() };
}
