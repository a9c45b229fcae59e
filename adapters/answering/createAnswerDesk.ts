import { REST } from '@discordjs/rest';
import { WebClient } from '@slack/web-api';
import type { Message } from '../../src/render/message.ts';
import type { CommandRouter } from '../../src/router/routerTypes.ts';
import { defaultDiscordEncoder, type DiscordEncoder } from '../discord/discordEncoder.ts';
import { interactionRestOptions } from '../discord/interactionRestOptions.ts';
import { askRouter } from '../slack/askRouter.ts';
import { answerClientOptions } from '../slack/slackClientOptions.ts';
import { defaultSlackEncoder, type SlackEncoder } from '../slack/slackEncoder.ts';
import type { AnswerJob, Ask } from './answerJob.ts';
import { editDeferredReply } from './discordDeferredReply.ts';
import { deliverSlackAnswer } from './slackAnswer.ts';
import { DEFAULT_ANSWERS_AT_ONCE } from '../../src/config/answersAtOnce.ts';
import { ConcurrencyLimit } from '../../src/delivery/concurrencyLimit.ts';

/**
 * Longest an answer keeps its place among those at once. The limit is for work on this thread; an
 * answer still going after this is waiting on something else (a forecast source, a far platform,
 * a store that stopped answering), so it goes on uncounted and the next one starts. Measured:
 * - in the chat bench (CPU-bound, loopback), one answer of about 800 per run held its place this
 *   long (three runs), so there the limit holds;
 * - 18 lookups of places not cached at once, the forecast stand-in answering after 800 ms (a
 *   scratch script, warm second rounds): last answer after 1.39 s with 250 ms, 2.74 s with 1 s,
 *   1.05 s with no limit; after 300 ms: 0.88 s, 1.26 s, 0.53 s. The first answers came sooner
 *   with the limit than without.
 */
export const ANSWER_PLACE_HELD_MS = 250;

export interface AnswerDeskOptions {
  router: CommandRouter;
  /** Needed for Slack answers with images (files are uploaded with the bot token). */
  slack?: { botToken: string; apiUrl?: string; encode?: SlackEncoder };
  discord?: { apiUrl?: string; encode?: DiscordEncoder };
  log: (level: 'warn' | 'error', text: string) => void;
  /** Per HTTP call of an answer. Default 10 s. */
  timeoutMs?: number;
  /**
   * How many answers are worked on at once (router and delivery); the rest wait in arrival order.
   * Default DEFAULT_ANSWERS_AT_ONCE.
   */
  answersAtOnce?: number;
  /** Default ANSWER_PLACE_HELD_MS (tests set their own). */
  placeHeldMs?: number;
}

export interface AnswerDesk {
  /** Asks the router and delivers the answer; never rejects (a failure is logged). */
  answer(job: AnswerJob): Promise<void>;
  /** Resolves when every answer under way has been delivered or has failed. */
  idle(): Promise<void>;
}

/**
 * Answers acknowledged questions: asks the router, then delivers over plain HTTP, whichever thread
 * acknowledged them. Slack: slackAnswer.ts (the response URL, which works even where the bot is not
 * a member, with pictures uploaded after; a watch posted as the bot). Discord: an edit of the
 * deferred reply.
 *
 * A few answers at a time, the rest queued in arrival order: on this one thread, a burst answered
 * all at once interleaves, so every answer holds its message, pictures and connection until nearly
 * all are done, and the first asked waits as long as the last. In turn, the first asked is answered
 * first and the thread holds the work of a few answers at a time. Measured (figures in
 * src/config/answersAtOnce.ts): lower full-answer latencies, lower Discord acknowledgement
 * latencies, usually less CPU per command; Slack's acknowledgements no better, often a little
 * slower; the process's peak memory in the chat bench did not change measurably. The price:
 * a burst of answers that each wait on the network (lookups of places not yet cached) is let
 * through a few at a time, a wave every 250 ms at worst (ANSWER_PLACE_HELD_MS has the figures);
 * where that matters, raise `chat.answersAtOnce`.
 */
export function createAnswerDesk(options: AnswerDeskOptions): AnswerDesk {
  const { router, log } = options;
  const timeoutMs = options.timeoutMs ?? 10_000;
  const slackEncode = options.slack?.encode ?? defaultSlackEncoder;
  const discordEncode = options.discord?.encode ?? defaultDiscordEncoder;
  const slackClient = options.slack ? new WebClient(options.slack.botToken, answerClientOptions(options.slack.apiUrl, timeoutMs)) : null;
  const discordRest = new REST({ ...interactionRestOptions(options.discord?.apiUrl), timeout: timeoutMs });
  const underWay = new Set<Promise<void>>();
  const atOnce = new ConcurrencyLimit(options.answersAtOnce ?? DEFAULT_ANSWERS_AT_ONCE);
  const placeHeldMs = options.placeHeldMs ?? ANSWER_PLACE_HELD_MS;

  function ask(question: Ask): Promise<Message> {
    return askRouter(
      () => (question.kind === 'command' ? router.handleCommand(question.request) : router.handleAction(question.request)),
      (error) => log('error', `router failed on a ${question.kind}: ${String(error)}`),
    );
  }

  async function deliver(job: AnswerJob, message: Message): Promise<void> {
    if (job.platform === 'discord') {
      await editDeferredReply(discordRest, job.applicationId, job.interactionToken, discordEncode(message));
      return;
    }
    await deliverSlackAnswer({ responseUrl: job.responseUrl, channelId: job.channelId, client: slackClient, encode: slackEncode, timeoutMs, log }, message);
  }

  async function answerOnce(job: AnswerJob): Promise<void> {
    const message = await ask(job.ask);
    try {
      await deliver(job, message);
    } catch (error) {
      // An expired response URL or token, a deleted channel, the platform down: nobody else to tell.
      log('warn', `answer not delivered on ${job.platform} (${job.ask.request.channelId}): ${error instanceof Error ? error.message : String(error)}`);
    }
  }

  /** The answer, holding one of the places at once until it is done or `placeHeldMs` has passed. */
  async function answerInTurn(job: AnswerJob): Promise<void> {
    let work: Promise<void> = Promise.resolve();
    await atOnce.run(async () => {
      work = answerOnce(job);
      let timer: NodeJS.Timeout | undefined;
      await Promise.race([work, new Promise<void>((resolve) => (timer = setTimeout(resolve, placeHeldMs)))]);
      clearTimeout(timer);
    });
    await work;
  }

  return {
    answer(job) {
      const pending = answerInTurn(job).finally(() => underWay.delete(pending));
      underWay.add(pending);
      return pending;
    },
    async idle() {
      while (underWay.size > 0) await Promise.allSettled([...underWay]);
    },
  };
}
