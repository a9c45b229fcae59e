import { Client, Events, GatewayIntentBits } from 'discord.js';
import type { CommandRouter } from '../../src/router/routerTypes.ts';
import type { HandOff } from '../answering/answerJob.ts';
import { createAnswerDesk } from '../answering/createAnswerDesk.ts';
import { discordCommandName } from './commands.ts';
import { discordRestBase } from './fetchRequest.ts';
import { HTTP2_ORIGIN_TIMINGS, Http2Origin } from '../http/http2Origin.ts';
import { deferInteraction, DISCORD_API_BASE } from './deferInteraction.ts';
import type { DiscordEncoder } from './discordEncoder.ts';
import { readRawInteraction, warmUpRawInteractionReader } from './rawInteraction.ts';

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
  /**
   * Interaction callbacks go as streams of one HTTP/2 connection kept open to the API's origin
   * (adapters/http/http2Origin.ts), each over HTTP/1.1 while it is not up. Default true; false
   * sends every callback over HTTP/1.1 (the chat bench compares the two).
   */
  callbacksOverHttp2?: boolean;
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

/** The receiving side's parts: the client, and the connection its interaction callbacks go over. */
export interface DiscordReceiverParts {
  client: Client;
  callbacks: Http2Origin | null;
}

/** Builds the discord.js client that reads our interactions; `startDiscordReceiver` logs it in. */
export function createDiscordBot(options: DiscordReceiverOptions & { handOff: HandOff }): DiscordReceiverParts {
  // Interactions arrive without any intent. Guilds stays: discord.js says ready once the guilds
  // READY lists have arrived, which without it takes its 15 s guild timeout.
  const client = new Client({ intents: [GatewayIntentBits.Guilds], rest: discordRestBase(options.apiUrl) });
  const log = options.log ?? logToConsole;
  const apiBase = options.apiUrl ?? DISCORD_API_BASE;
  const ours = { applicationId: options.applicationId, commandName: discordCommandName() };
  // Opened now, so that it is up before the first interaction: a burst of them then opens no
  // connection each (8 alternating pairs of the chat bench: Discord ack p99 12.4-23.7 ms, against
  // 22.4-62.0 with a connection per callback).
  const apiOrigin = new URL(apiBase).origin;
  const callbacks =
    options.callbacksOverHttp2 === false
      ? null
      : new Http2Origin(apiOrigin, HTTP2_ORIGIN_TIMINGS, (reason) => log('warn', `interaction callbacks go over HTTP/1.1 for now: no HTTP/2 to ${apiOrigin} (${reason})`));
  callbacks?.open();
  // Before the first real interaction: a cold reader cost the first burst after a start several ms.
  warmUpRawInteractionReader(ours);
  // Interactions are read from the gateway packet itself (Events.Raw, which discord.js emits for
  // every dispatch before it builds its own structures; not in its typed events, so the wire tests
  // in test/adapters/discordGateway.test.ts are what hold it) and deferred at once: Discord gives
  // 3 s to answer, the forecast may take longer. The answer later edits the deferred reply through
  // the interaction's token (answering/). Never throws into discord.js.
  client.on(Events.Raw, (packet: { t?: unknown; d?: unknown }) => {
    if (packet.t !== 'INTERACTION_CREATE') return;
    const interaction = readRawInteraction(packet.d, ours);
    if (!interaction) return;
    void deferInteraction(apiBase, interaction, callbacks ? { http2: callbacks } : {}).then((deferred) => {
      // Expired (more than 3 s late), a deleted channel, Discord down: nothing to tell the user through.
      if (!deferred.ok) return log('warn', `interaction ${interaction.id} not acknowledged: ${deferred.reason}`);
      options.handOff({ platform: 'discord', ask: interaction.ask, applicationId: interaction.applicationId, interactionToken: interaction.token });
    });
  });
  client.on(Events.Error, (error) => log('error', `client error: ${error.message}`));
  return { client, callbacks };
}

/** Logs in and resolves once the gateway has said READY; each deferred question goes to `handOff`. */
export async function startDiscordReceiver(options: DiscordReceiverOptions & { handOff: HandOff }): Promise<RunningDiscordBot> {
  const { client, callbacks } = createDiscordBot(options);
  const destroy = async (): Promise<void> => {
    callbacks?.close();
    await client.destroy();
  };
  let timer: NodeJS.Timeout | undefined;
  const ready = new Promise<void>((resolve, reject) => {
    timer = setTimeout(() => reject(new Error('Discord gateway did not become ready in time')), options.readyTimeoutMs ?? 30_000);
    client.once(Events.ClientReady, () => resolve());
  });
  try {
    // Together, so a failed login does not leave the ready timeout rejecting unobserved.
    await Promise.all([client.login(options.token), ready]);
  } catch (error) {
    await destroy();
    throw error;
  } finally {
    clearTimeout(timer);
  }
  return { client, stop: destroy };
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
