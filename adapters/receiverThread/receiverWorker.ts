/**
 * The receiver thread: Bolt and the discord.js gateway client, and nothing else. It acknowledges
 * (Slack's ack, Discord's deferral) and hands each question to the main thread, which asks the
 * router and answers over HTTP. With no router, store or rendering here, this thread's event loop
 * is free when a command arrives, so acknowledgements do not wait behind answers.
 */
import type { IncomingMessage, ServerResponse } from 'node:http';
import { setPriority } from 'node:os';
import { getHeapStatistics } from 'node:v8';
import { parentPort, workerData } from 'node:worker_threads';
import { startDiscordReceiver, type RunningDiscordBot } from '../discord/createDiscordBot.ts';
import { startSlackReceiver, type RunningSlackApp } from '../slack/createSlackApp.ts';
import type { HandOff } from '../answering/answerJob.ts';
import type { FromReceiver, ReceiverThreadSettings, ToReceiver } from './receiverMessages.ts';
import { niceOfThisThread } from './threadNice.ts';
import { describeWarmUp, type ReceiverWarmUpResult } from '../slack/warmUpSlackReceiver.ts';

const port = parentPort!;
const settings = workerData.settings as ReceiverThreadSettings;
const send = (message: FromReceiver): void => port.postMessage(message);
const handOff: HandOff = (job) => send({ type: 'job', job });

/**
 * A receiver thread started after the main thread lowered its priority (a restart after a crash)
 * inherits the lower priority, and its acknowledgements would wait behind answers: go back to the
 * receivers' own. Raising a priority needs privilege (CAP_SYS_NICE, or RLIMIT_NICE); without it
 * the thread says so and runs on at the lower one.
 */
function restoreReceiverNice(): number | null {
  const now = niceOfThisThread();
  if (now === null || settings.nice === null || now <= settings.nice) return now;
  try {
    setPriority(0, settings.nice);
    return settings.nice;
  } catch (error) {
    send({ type: 'log', level: 'warn', text: `chat receiver thread runs at nice ${now}, not ${settings.nice}: ${error instanceof Error ? error.message : String(error)}` });
    return now;
  }
}
const receiverNice = restoreReceiverNice();

let nextRouteId = 1;
const routeAnswers = new Map<number, (answer: Extract<ToReceiver, { type: 'route-answer' }>) => void>();

/** A GET route answered by the main thread (it holds the metrics registry). */
function mainThreadRoute(path: string) {
  return {
    path,
    handler: (_request: IncomingMessage, response: ServerResponse) => {
      const id = nextRouteId++;
      const timer = setTimeout(() => {
        routeAnswers.delete(id);
        response.writeHead(503, { 'content-type': 'text/plain' }).end('main thread did not answer\n');
      }, 5_000);
      routeAnswers.set(id, (answer) => {
        clearTimeout(timer);
        response.writeHead(answer.status, { 'content-type': answer.contentType }).end(answer.body);
      });
      send({ type: 'route', id, path });
    },
  };
}

/** Into the start-up log: a warm-up that went wrong is a warning (the receiver works, its first answers slower). */
function reportWarmUp(result: ReceiverWarmUpResult | null): void {
  if (result) send({ type: 'log', level: result.acknowledged === result.sent ? 'info' : 'warn', text: describeWarmUp(result) });
}

let slack: RunningSlackApp | null = null;
let discord: RunningDiscordBot | null = null;

async function stopAll(): Promise<void> {
  await Promise.allSettled([slack?.stop(), discord?.stop()]);
}

port.on('message', (message: ToReceiver) => {
  if (message.type === 'route-answer') {
    routeAnswers.get(message.id)?.(message);
    routeAnswers.delete(message.id);
    return;
  }
  void stopAll().then(() => {
    send({ type: 'stopped' });
    port.close();
  });
});

try {
  if (settings.slack) {
    slack = await startSlackReceiver({ ...settings.slack, extraRoutes: settings.textRoutePaths.map(mainThreadRoute), handOff });
    reportWarmUp(slack.warmUp);
  }
  if (settings.discord) {
    discord = await startDiscordReceiver({ ...settings.discord, handOff, log: (level, text) => send({ type: 'log', level, text }) });
  }
  send({ type: 'ready', slack: slack ? { mode: slack.mode, port: slack.port } : null, discord: discord !== null, heapUsedMb: getHeapStatistics().used_heap_size / 2 ** 20, nice: receiverNice });
} catch (error) {
  await stopAll();
  send({ type: 'failed', error: error instanceof Error ? error.message : String(error) });
  port.close();
}
