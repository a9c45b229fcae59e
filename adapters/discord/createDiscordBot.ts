import { Client, Events, GatewayIntentBits, Partials } from 'discord.js';
import type { CommandRouter } from '../../src/router/routerTypes.ts';
import type { HandOff } from '../answering/answerJob.ts';
import { createAnswerDesk } from '../answering/createAnswerDesk.ts';
import { discordCommandName } from './commands.ts';
import { interactionRestOptions } from './interactionRestOptions.ts';
import type { DiscordEncoder } from './discordEncoder.ts';
import { createInteractionHandler } from './discordInteractions.ts';

/** The receiving side: the gateway client and its credentials. */
export interface DiscordReceiverOptions {
  token: string;
  /** Interactions for other applications (none should arrive) are ignored. */
  applicationId: string;
  /**
   * API base including "/api", e.g. "http://127.0.0.1:4000/api"; Discord's own when absent. The
   * gateway address is not configured separately: discord.js asks GET /gateway/bot on this base.
   */
  apiUrl?: string;
  log?: (level: 'warn' | 'error', text: string) => void;
  /** How long to wait for the gateway's READY. Default 30 s. */
  readyTimeoutMs?: number;
}

/** A receiver and the router answering in the same thread. */
export interface DiscordBotOptions extends DiscordReceiverOptions {
  router: CommandRouter;
  encode?: DiscordEncoder;
}

/** Where the adapter's warnings go when the caller gives no log. */
const logToConsole = (level: 'warn' | 'error', text: string): void => console[level](`[discord] ${text}`);

export interface RunningDiscordBot {
  client: Client;
  stop(): Promise<void>;
}

/** Builds the discord.js client with our interaction handler; `startDiscordReceiver` logs it in. */
export function createDiscordBot(options: DiscordReceiverOptions & { handOff: HandOff }): Client {
  // Interactions arrive without any privileged intent; Guilds keeps the channel cache useful.
  // Partials.Channel: a channel the cache lacks (a thread the client was not told of) is made from
  // the channel the interaction carries, so whether it is a thread is known (discordInteractions.ts).
  // This client only defers interactions; the answer edits the reply later through the
  // interaction's webhook token (see answering/).
  const client = new Client({ intents: [GatewayIntentBits.Guilds], partials: [Partials.Channel], rest: interactionRestOptions(options.apiUrl) });
  const log = options.log ?? logToConsole;
  const handle = createInteractionHandler({ commandName: discordCommandName(), handOff: options.handOff, log });
  client.on(Events.InteractionCreate, (interaction) => {
    if (interaction.applicationId !== options.applicationId) return;
    void handle(interaction);
  });
  client.on(Events.Error, (error) => log('error', `client error: ${error.message}`));
  return client;
}

/** Logs in and resolves once the gateway has said READY; each deferred question goes to `handOff`. */
export async function startDiscordReceiver(options: DiscordReceiverOptions & { handOff: HandOff }): Promise<RunningDiscordBot> {
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

/** Logs in with the router answering in this thread; `stop` lets answers under way finish. */
export async function startDiscordBot(options: DiscordBotOptions): Promise<RunningDiscordBot> {
  const log = options.log ?? logToConsole;
  const desk = createAnswerDesk({
    router: options.router,
    discord: { ...(options.apiUrl ? { apiUrl: options.apiUrl } : {}), ...(options.encode ? { encode: options.encode } : {}) },
    log,
  });
  const receiver = await startDiscordReceiver({ ...options, handOff: (job) => void desk.answer(job) });
  return {
    client: receiver.client,
    stop: async () => {
      await receiver.stop();
      await desk.idle();
    },
  };
}
