import { randomUUID } from 'node:crypto';
import { hostname } from 'node:os';
import { resolve } from 'node:path';
import { createDiscordPoster } from '../../adapters/discord/discordPoster.ts';
import { startReceiverThread, type RunningReceiverThread } from '../../adapters/receiverThread/startReceiverThread.ts';
import { createSlackPoster } from '../../adapters/slack/slackPoster.ts';
import { slackCommandName } from '../../adapters/slack/slackCommandName.ts';
import { createTerminalPoster } from '../../adapters/terminal/terminalPoster.ts';
import { runTerminalSession } from '../../adapters/terminal/terminalSession.ts';
import { loadAppConfig } from '../config/appConfig.ts';
import type { ChannelPoster } from '../delivery/channelPoster.ts';
import { createOutboxSender } from '../delivery/outboxSender.ts';
import { createLogger } from '../observability/createLogger.ts';
import { startHealthServer, type RunningHealthServer } from '../observability/healthServer.ts';
import { processMetrics } from '../observability/processMetrics.ts';
import { storeHealthCheck, tickFreshnessCheck } from '../observability/storeHealthCheck.ts';
import { createCommandRouter } from '../router/createCommandRouter.ts';
import { createAlertCheckCycle, realAlertCheckDeps } from '../schedule/alertCheckCycle.ts';
import { createScheduler } from '../schedule/scheduler.ts';
import { createSummaryCycle, realSummaryDeps } from '../schedule/summaryCycle.ts';
import { openStore } from '../store/openStore.ts';
import { formatConfigProblem } from '../watch/rules/configProblem.ts';
import { loadRulesFile } from '../watch/rules/loadRules.ts';
import { ANSWER_THREAD_NICE } from './botRuntime.ts';
import { buildForecastSource } from './buildForecastSource.ts';
import { clockFromEnvironment } from './demoClock.ts';
import { readPlatformCredentials } from './platformCredentials.ts';
import { warmUpAssessment } from './warmUpAssessment.ts';

export interface StartOptions {
  environment: NodeJS.ProcessEnv;
  stdin: NodeJS.ReadableStream & { isTTY?: boolean };
  stdout: NodeJS.WritableStream & { isTTY?: boolean };
  stderr: NodeJS.WritableStream;
  configPath?: string;
}

/**
 * `npm start`: every adapter whose credentials are set, the scheduler and the outbox sender; the
 * terminal when no platform is configured. A bad config, rules file or store stops start-up with a
 * message naming what is wrong. Resolves to the exit code when the terminal session ends (scripted
 * input) or on SIGINT/SIGTERM.
 */
export async function startLapsewatch(options: StartOptions): Promise<number> {
  const { environment } = options;
  const fail = (text: string) => {
    options.stderr.write(`lapsewatch: ${text}\n`);
    return 1;
  };
  const config = loadAppConfig(options.configPath, environment);
  if (!config.ok) return fail(config.error);
  const rules = await loadRulesFile();
  if (!rules.ok) return fail(rules.problems.map(formatConfigProblem).join('\n'));
  const clockSetting = clockFromEnvironment(environment);
  if (!clockSetting.ok) return fail(clockSetting.error);
  const { clock } = clockSetting;

  const credentials = readPlatformCredentials(environment);
  const terminalOnly = !credentials.slack && !credentials.discord;
  const workerId = `${hostname()}-${process.pid}-${randomUUID().slice(0, 8)}`;
  // In the terminal, logs would bury the answers: warnings only, on standard error.
  const logger = createLogger({
    base: { workerId },
    ...(terminalOnly ? { level: environment.LAPSEWATCH_LOG_LEVEL ?? 'warn', destination: process.stderr } : {}),
  });
  for (const warning of credentials.incomplete) logger.warn(warning);

  let store;
  try {
    store = await openStore({ url: config.config.store.url, baseDir: resolve(environment.LAPSEWATCH_DATA_DIR ?? '.'), onConnectionError: (error) => logger.warn({ err: error.message }, 'store connection dropped; the pool reconnects') });
  } catch (error) {
    return fail(error instanceof Error ? error.message : String(error));
  }

  const forecast = buildForecastSource(config.config.forecast, clock.nowMs);
  const localFooterLine = config.config.messages.localFooterLine;
  const commandName = slackCommandName();
  const router = createCommandRouter(
    {
      store,
      source: forecast.source,
      forecastHours: config.config.forecast.hours,
      findNamedPlace: forecast.findNamedPlace,
      suggestedPlaceNames: forecast.suggestedPlaceNames,
      channelDefaults: config.config.channelDefaults,
      defaultRules: rules.rules,
      commandPrefix: (platform) => (platform === 'terminal' ? '' : platform === 'discord' ? `${commandName} text:` : commandName),
      ...(localFooterLine !== undefined ? { localFooterLine } : {}),
      nowMs: clock.nowMs,
    },
    (error, what) => logger.error({ err: error instanceof Error ? error.message : String(error), what }, 'router fault'),
  );

  // Chat platforms bring crowds: several channels asking at once right after a restart. Compile the
  // core first, a turn of the event loop at a time, while the receivers start (the terminal's one
  // user would only wait for it).
  const warmUp = terminalOnly
    ? Promise.resolve()
    : warmUpAssessment().then(
        (done) => logger.info({ rounds: done.rounds, elapsedMs: Math.round(done.elapsedMs) }, 'assessment warmed up'),
        (error: unknown) => logger.warn({ err: error instanceof Error ? error.message : String(error) }, 'assessment warm-up failed; answers stay correct, the first ones slower'),
      );

  const metrics = processMetrics();
  metrics.setOutboxStatsSource(() => store.outbox.stats(clock.nowMs()));
  const posters: ChannelPoster[] = [createTerminalPoster(options.stdout)];
  let receivers: RunningReceiverThread | null = null;
  const httpPort = config.config.http.port;
  if (credentials.slack || credentials.discord) {
    // Bolt and discord.js run in a thread of their own that only acknowledges; the router answers here.
    try {
      receivers = await startReceiverThread({
        router,
        ...(credentials.slack ? { slack: { ...credentials.slack, port: httpPort } } : {}),
        ...(credentials.discord ? { discord: credentials.discord } : {}),
        textRoutes: [{ path: '/metrics', render: async () => ({ contentType: metrics.registry.contentType, body: await metrics.registry.metrics() }) }],
        log: (level, text) => logger[level](text),
        answerThreadNice: ANSWER_THREAD_NICE,
        answersAtOnce: config.config.chat.answersAtOnce,
      });
    } catch (error) {
      await store.close();
      return fail(`a chat platform did not start: ${error instanceof Error ? error.message : String(error)}`);
    }
    if (credentials.slack) {
      posters.push(createSlackPoster({ botToken: credentials.slack.botToken, ...(credentials.slack.apiUrl ? { apiUrl: credentials.slack.apiUrl } : {}), warn: (text) => logger.warn(text) }));
      logger.info({ mode: receivers.slack?.mode, port: receivers.slack?.port }, 'slack adapter started');
    }
    if (credentials.discord) {
      posters.push(createDiscordPoster({ token: credentials.discord.token, ...(credentials.discord.apiUrl ? { apiUrl: credentials.discord.apiUrl } : {}) }));
      logger.info('discord adapter started');
    }
  }

  const fetchSeries = forecast.source.fetchSeries.bind(forecast.source);
  const alertCheck = createAlertCheckCycle({
    store,
    deps: realAlertCheckDeps({
      fetchSeries,
      defaultRules: rules.rules,
      // A new run makes watched places due at once, and the cache lets go of the older run's series.
      ...(forecast.source.latestRunTime ? { latestRunTime: () => forecast.source.latestRunTime!() } : {}),
      ...(localFooterLine !== undefined ? { footerLocalLine: localFooterLine } : {}),
    }),
    workerId,
    logger,
    intervalMs: config.config.schedule.alertCheckEveryMinutes * 60_000,
    forecastHours: config.config.forecast.hours,
  });
  const summaries = createSummaryCycle({
    store,
    deps: realSummaryDeps({ fetchSeries, ...(localFooterLine !== undefined ? { footerLocalLine: localFooterLine } : {}) }),
    workerId,
    logger,
    forecastHours: config.config.forecast.hours,
  });
  const sender = createOutboxSender({ store, posters, workerId, logger, metrics, nowMs: clock.nowMs });
  const scheduler = createScheduler({
    clock,
    logger,
    metrics,
    steps: [
      { name: 'morning-summaries', run: (nowMs) => summaries.run(nowMs) },
      { name: 'alert-checks', run: (nowMs) => alertCheck.run(nowMs) },
    ],
    afterTick: () => sender.wake(),
  });

  // The platforms' receiver answers /healthz itself; without one, a health server takes the port
  // when it is asked for (the terminal alone needs none).
  let health: RunningHealthServer | null = null;
  if (!credentials.slack && (!terminalOnly || environment.LAPSEWATCH_HTTP_PORT)) {
    health = await startHealthServer({
      registry: metrics.registry,
      port: httpPort,
      checks: { store: storeHealthCheck(store, clock.nowMs), scheduler: tickFreshnessCheck(() => scheduler.lastTickAtMs, 5 * 60_000, clock.nowMs) },
    });
  }

  sender.start();
  scheduler.start();
  // The first tick at once, so a restarted process catches up without waiting a minute.
  void scheduler.tick(clock.nowMs());
  if (clockSetting.description) logger.warn(clockSetting.description);

  const shutDown = async () => {
    await warmUp;
    await scheduler.stop();
    await sender.stop();
    if (health) await health.close();
    await receivers?.stop().catch(() => {});
    await store.close();
  };

  if (terminalOnly) {
    await runTerminalSession({
      router,
      input: options.stdin,
      output: options.stdout,
      imageFolder: resolve(environment.LAPSEWATCH_DATA_DIR ?? '.', 'data', 'images'),
      firstCommand: forecast.suggestedPlaceNames[0] ?? 'help',
      // Scripted input may pause for scheduled messages to arrive (a demo with a fast clock).
      pause: (seconds) => new Promise((done) => setTimeout(done, seconds * 1000)),
      // Posts queued by the last commands go out before a scripted session ends.
      beforeExit: async () => {
        await scheduler.tick(clock.nowMs());
        await sender.sendOnce();
      },
    });
    await shutDown();
    return 0;
  }

  await new Promise<void>((done) => {
    process.once('SIGINT', done);
    process.once('SIGTERM', done);
  });
  logger.info('stopping');
  await shutDown();
  return 0;
}
