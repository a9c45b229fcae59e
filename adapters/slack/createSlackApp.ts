import type { AddressInfo } from 'node:net';
import { createServer, type Server } from 'node:http';
import { App, LogLevel } from '@slack/bolt';
import type { CommandRouter } from '../../src/router/routerTypes.ts';
import type { HandOff } from '../answering/answerJob.ts';
import { createAnswerDesk } from '../answering/createAnswerDesk.ts';
import type { SlackEncoder } from './slackEncoder.ts';
import { answerClientOptions } from './slackClientOptions.ts';
import { registerSlackListeners } from './slackListeners.ts';
import { slackCommandName } from './slackCommandName.ts';
import { boltRoutes, healthRoute, routeListener, type ExtraRoute } from './healthRoute.ts';
import { ACTION_IDS } from '../../src/render/message.ts';
import { RECEIVER_WARM_UP_REQUESTS, warmUpFilter, warmUpResponseUrl, warmUpSlackReceiver, type ReceiverWarmUpResult } from './warmUpSlackReceiver.ts';

/** The receiving side: Bolt, its credentials and where it listens. */
export interface SlackReceiverOptions {
  botToken: string;
  /** HTTP mode: requests are verified with it (v0 HMAC, 5-minute window). */
  signingSecret?: string;
  /** Socket Mode: when given, Slack is reached over a WebSocket and no public URL is needed. */
  appToken?: string;
  /** Web API base, e.g. "http://127.0.0.1:4000/api/"; Slack's own when absent. */
  apiUrl?: string;
  /** Port of the HTTP receiver and of /healthz; 0 picks a free one. Default 3000. */
  port?: number;
  /** Interface to listen on. Default all interfaces. */
  host?: string;
  logLevel?: LogLevel;
  /** More GET routes on the same port beside /healthz (e.g. /metrics). */
  extraRoutes?: ExtraRoute[];
  /**
   * HTTP mode: signed requests the receiver sends itself before it resolves, so that the first
   * real commands meet compiled code (warmUpSlackReceiver.ts). Default RECEIVER_WARM_UP_REQUESTS;
   * 0 for none.
   */
  warmUpRequests?: number;
}

/** A receiver and the router answering in the same thread. */
export interface SlackAppOptions extends SlackReceiverOptions {
  router: CommandRouter;
  encode?: SlackEncoder;
  log?: (level: 'warn' | 'error', text: string) => void;
}

export interface RunningSlackApp {
  app: App;
  mode: 'http' | 'socket';
  /** The port /healthz (and, in HTTP mode, the Slack events endpoint) listens on. */
  port: number;
  /** What the start-up warm-up did, when there was one. */
  warmUp: ReceiverWarmUpResult | null;
  stop(): Promise<void>;
}

/** Bolt's default events path, where Slack posts commands and button presses in HTTP mode. */
const EVENTS_PATH = '/slack/events';

/** Socket Mode when an app token is given, else HTTP (which needs the signing secret). */
function slackMode(options: SlackReceiverOptions): 'http' | 'socket' {
  return options.appToken ? 'socket' : 'http';
}

/** Builds the Bolt app (HTTP or Socket Mode) with our listeners; `startSlackReceiver` runs it. */
export function createSlackApp(options: SlackReceiverOptions & { handOff: HandOff }): { app: App; mode: 'http' | 'socket' } {
  const mode = slackMode(options);
  if (mode === 'http' && !options.signingSecret) {
    throw new Error('Slack HTTP mode needs SLACK_SIGNING_SECRET (or set SLACK_APP_TOKEN for Socket Mode)');
  }
  const app = new App({
    token: options.botToken,
    logLevel: options.logLevel ?? LogLevel.WARN,
    clientOptions: answerClientOptions(options.apiUrl),
    // No conversation state is kept between commands: Bolt's in-memory store would run on every ack.
    convoStore: false,
    ...(mode === 'socket'
      ? { socketMode: true, appToken: options.appToken }
      : { signingSecret: options.signingSecret, customRoutes: boltRoutes([healthRoute, ...(options.extraRoutes ?? [])]) }),
  });
  registerSlackListeners(app, { commandName: slackCommandName(), handOff: options.handOff });
  return { app, mode };
}

function listenForRoutes(routes: ExtraRoute[], port: number, host: string | undefined): Promise<Server> {
  const server = createServer(routeListener(routes));
  return new Promise((resolve, reject) => {
    server.once('error', reject);
    server.listen({ port, ...(host ? { host } : {}) }, () => resolve(server));
  });
}

/**
 * Starts the receiver alone, handing each acknowledged question to `handOff`; resolves once it
 * listens (HTTP) or Slack has said hello (Socket Mode).
 */
export async function startSlackReceiver(options: SlackReceiverOptions & { handOff: HandOff }): Promise<RunningSlackApp> {
  // Only HTTP mode: Socket Mode's events come over Bolt's WebSocket, which the receiver cannot send itself.
  const warmUpRequests = slackMode(options) === 'http' ? (options.warmUpRequests ?? RECEIVER_WARM_UP_REQUESTS) : 0;
  const warmUpUrl = warmUpRequests > 0 ? warmUpResponseUrl() : null;
  const { app, mode } = createSlackApp({ ...options, handOff: warmUpUrl ? warmUpFilter(options.handOff, warmUpUrl) : options.handOff });
  const port = options.port ?? 3000;
  if (mode === 'http') {
    const server = (await app.start({ port, ...(options.host ? { host: options.host } : {}) })) as Server;
    const address = server.address() as AddressInfo;
    const warmUp =
      warmUpUrl === null
        ? null
        : await warmUpSlackReceiver({ address, path: EVENTS_PATH, signingSecret: options.signingSecret!, commandName: slackCommandName(), responseUrl: warmUpUrl, actionId: ACTION_IDS[0], requests: warmUpRequests });
    return { app, mode, port: address.port, warmUp, stop: () => app.stop() as Promise<void> };
  }
  // Socket Mode has no events endpoint; /healthz gets a small server of its own.
  const health = await listenForRoutes([healthRoute, ...(options.extraRoutes ?? [])], port, options.host);
  try {
    await app.start();
  } catch (error) {
    health.close();
    throw error;
  }
  return {
    app,
    mode,
    port: (health.address() as AddressInfo).port,
    warmUp: null,
    stop: async () => {
      await app.stop();
      await new Promise<void>((resolve) => health.close(() => resolve()));
    },
  };
}

/** Starts the receiver with the router answering in this thread; `stop` lets answers under way finish. */
export async function startSlackApp(options: SlackAppOptions): Promise<RunningSlackApp> {
  const desk = createAnswerDesk({
    router: options.router,
    slack: { botToken: options.botToken, ...(options.apiUrl ? { apiUrl: options.apiUrl } : {}), ...(options.encode ? { encode: options.encode } : {}) },
    log: options.log ?? ((level, text) => console[level](`[slack] ${text}`)),
  });
  const receiver = await startSlackReceiver({ ...options, handOff: (job) => void desk.answer(job) });
  return {
    ...receiver,
    stop: async () => {
      await receiver.stop();
      await desk.idle();
    },
  };
}
