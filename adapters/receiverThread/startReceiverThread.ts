import { setPriority } from 'node:os';
import type { Worker } from 'node:worker_threads';
import { startModuleWorker } from '../../src/threads/moduleWorker.ts';
import { niceOfThisThread } from './threadNice.ts';
import type { CommandRouter } from '../../src/router/routerTypes.ts';
import { createAnswerDesk } from '../answering/createAnswerDesk.ts';
import type { DiscordReceiverOptions } from '../discord/createDiscordBot.ts';
import type { SlackReceiverOptions } from '../slack/createSlackApp.ts';
import type { FromReceiver, LogLevelName, ReceiverThreadSettings, TextRoute, ToReceiver } from './receiverMessages.ts';

export interface ReceiverThreadOptions {
  router: CommandRouter;
  slack?: Omit<SlackReceiverOptions, 'extraRoutes'>;
  discord?: Omit<DiscordReceiverOptions, 'log'>;
  /** GET routes on the Slack receiver's port whose text this thread makes (e.g. /metrics). */
  textRoutes?: TextRoute[];
  log: (level: LogLevelName, text: string) => void;
  /** How long start-up may take (Bolt listening, Discord READY). Default 40 s. */
  readyTimeoutMs?: number;
  /**
   * Nice value for the calling (answering) thread once the receiver thread runs, so that under CPU
   * contention the kernel runs acknowledgements first. Linux nice values are per thread; the
   * receiver thread keeps the process's. Absent: unchanged.
   */
  answerThreadNice?: number;
  /** Answers this thread works on at once (createAnswerDesk's default when absent). */
  answersAtOnce?: number;
}

export interface RunningReceiverThread {
  /** The running thread's Slack receiver (a restarted thread asked for port 0 gets a new one). */
  readonly slack: { mode: 'http' | 'socket'; port: number } | null;
  readonly discord: boolean;
  /** The receiver thread's V8 heap in use once it was ready, MB. */
  readonly heapUsedAtReadyMb: number;
  /** The running receiver thread's nice value when it became ready (null where unknown). */
  readonly receiverNice: number | null;
  /** How many times the thread has been restarted after dying. */
  restarts(): number;
  /** The thread now running (for its id and, in tests, to end it as a crash would). */
  currentWorker(): Worker;
  /** Stops the receivers, waits for answers under way, and gives the answering thread its priority back. */
  stop(): Promise<void>;
}

const RESTARTS_PER_MINUTE = 5;

/**
 * setpriority(PRIO_PROCESS, 0) acts on the calling thread alone on Linux; elsewhere it may act on
 * the process. Returns the nice value to go back to, or null when nothing was changed.
 */
function lowerThisThread(nice: number, log: ReceiverThreadOptions['log']): number | null {
  const before = niceOfThisThread();
  if (before === null || nice <= before) return null;
  try {
    setPriority(0, nice);
    return before;
  } catch (error) {
    log('warn', `could not lower the answering thread's priority: ${error instanceof Error ? error.message : String(error)}`);
    return null;
  }
}

function newReceiverWorker(settings: ReceiverThreadSettings): Worker {
  return startModuleWorker(import.meta.url, 'receiverWorker', { settings });
}

/**
 * Runs the Slack and Discord receivers in a thread of their own and answers here: the receiver
 * thread acknowledges every command at once and hands it over; this thread asks the router and
 * delivers the answer over HTTP (answering/createAnswerDesk.ts). The router, store, forecast cache
 * and rendering stay in this thread with the scheduler, so nothing is loaded or cached twice.
 * A receiver thread that dies after start-up is restarted (at most 5 times a minute, then logged
 * as given up); questions it had acknowledged were already handed over.
 */
export async function startReceiverThread(options: ReceiverThreadOptions): Promise<RunningReceiverThread> {
  const { log } = options;
  const desk = createAnswerDesk({
    router: options.router,
    ...(options.slack ? { slack: { botToken: options.slack.botToken, ...(options.slack.apiUrl ? { apiUrl: options.slack.apiUrl } : {}) } } : {}),
    ...(options.discord ? { discord: { ...(options.discord.apiUrl ? { apiUrl: options.discord.apiUrl } : {}) } } : {}),
    log,
    ...(options.answersAtOnce === undefined ? {} : { answersAtOnce: options.answersAtOnce }),
  });
  const routes = new Map((options.textRoutes ?? []).map((route) => [route.path, route]));
  const settings: ReceiverThreadSettings = { slack: options.slack ?? null, discord: options.discord ?? null, textRoutePaths: [...routes.keys()], nice: niceOfThisThread() };
  let stopping = false;
  let restartTimes: number[] = [];
  let restartCount = 0;
  let worker: Worker;

  function answerRoute(target: Worker, id: number, path: string): void {
    const route = routes.get(path);
    const reply = (message: ToReceiver) => target.postMessage(message);
    if (!route) {
      reply({ type: 'route-answer', id, status: 404, contentType: 'text/plain', body: 'not found\n' });
      return;
    }
    route.render().then(
      ({ contentType, body }) => reply({ type: 'route-answer', id, status: 200, contentType, body }),
      (error: unknown) => reply({ type: 'route-answer', id, status: 500, contentType: 'text/plain', body: `${String(error)}\n` }),
    );
  }

  /** Starts a thread and resolves with its ready message, or rejects with why it could not start. */
  function launch(): Promise<Extract<FromReceiver, { type: 'ready' }>> {
    const started = newReceiverWorker(settings);
    worker = started;
    let ready = false;
    return new Promise((resolve, reject) => {
      const timer = setTimeout(() => {
        reject(new Error('the chat receivers did not start in time'));
        void started.terminate();
      }, options.readyTimeoutMs ?? 40_000);
      started.on('message', (message: FromReceiver) => {
        switch (message.type) {
          case 'ready':
            ready = true;
            clearTimeout(timer);
            resolve(message);
            return;
          case 'failed':
            clearTimeout(timer);
            reject(new Error(message.error));
            void started.terminate();
            return;
          case 'job':
            void desk.answer(message.job);
            return;
          case 'log':
            log(message.level, message.text);
            return;
          case 'route':
            answerRoute(started, message.id, message.path);
            return;
          case 'stopped':
            return;
        }
      });
      started.on('error', (error) => {
        log('error', `chat receiver thread failed: ${error.message}`);
        if (!ready) {
          clearTimeout(timer);
          reject(error);
        }
      });
      started.on('exit', (code) => {
        if (!ready || stopping || worker !== started) return;
        restartAfterDeath(code);
      });
    });
  }

  function restartAfterDeath(code: number): void {
    const nowMs = Date.now();
    restartTimes = restartTimes.filter((at) => nowMs - at < 60_000);
    if (restartTimes.length >= RESTARTS_PER_MINUTE) {
      log('error', `chat receiver thread exited (code ${code}) ${RESTARTS_PER_MINUTE} times in a minute; not restarting: commands go unanswered, scheduled posts continue`);
      return;
    }
    restartTimes.push(nowMs);
    restartCount += 1;
    log('error', `chat receiver thread exited (code ${code}); restarting it`);
    launch().then(
      (again) => {
        current = again;
        log('warn', 'chat receiver thread restarted');
      },
      (error: unknown) => log('error', `chat receiver thread could not restart: ${error instanceof Error ? error.message : String(error)}`),
    );
  }

  let current = await launch();
  const niceBefore = options.answerThreadNice === undefined ? null : lowerThisThread(options.answerThreadNice, log);
  return {
    get slack() {
      return current.slack;
    },
    get discord() {
      return current.discord;
    },
    get heapUsedAtReadyMb() {
      return current.heapUsedMb;
    },
    get receiverNice() {
      return current.nice;
    },
    restarts: () => restartCount,
    currentWorker: () => worker,
    async stop() {
      stopping = true;
      const current = worker;
      const exited = new Promise<void>((resolve) => current.once('exit', () => resolve()));
      current.postMessage({ type: 'stop' } satisfies ToReceiver);
      const timer = setTimeout(() => void current.terminate(), 10_000);
      await exited;
      clearTimeout(timer);
      await desk.idle();
      if (niceBefore !== null) {
        // Going back up needs privilege (CAP_SYS_NICE) unless the limit allows it; at worst it stays low.
        try {
          setPriority(0, niceBefore);
        } catch {
          /* the thread keeps the lower priority */
        }
      }
    },
  };
}
