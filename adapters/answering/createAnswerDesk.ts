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

export interface AnswerDeskOptions {
  router: CommandRouter;
  /** Needed for Slack answers with images (files are uploaded with the bot token). */
  slack?: { botToken: string; apiUrl?: string; encode?: SlackEncoder };
  discord?: { apiUrl?: string; encode?: DiscordEncoder };
  log: (level: 'warn' | 'error', text: string) => void;
  /** Per HTTP call of an answer. Default 10 s. */
  timeoutMs?: number;
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
 */
export function createAnswerDesk(options: AnswerDeskOptions): AnswerDesk {
  const { router, log } = options;
  const timeoutMs = options.timeoutMs ?? 10_000;
  const slackEncode = options.slack?.encode ?? defaultSlackEncoder;
  const discordEncode = options.discord?.encode ?? defaultDiscordEncoder;
  const slackClient = options.slack ? new WebClient(options.slack.botToken, answerClientOptions(options.slack.apiUrl, timeoutMs)) : null;
  const discordRest = new REST({ ...interactionRestOptions(options.discord?.apiUrl), timeout: timeoutMs });
  const underWay = new Set<Promise<void>>();

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

  return {
    answer(job) {
      const pending = answerOnce(job).finally(() => underWay.delete(pending));
      underWay.add(pending);
      return pending;
    },
    async idle() {
      while (underWay.size > 0) await Promise.allSettled([...underWay]);
    },
  };
}
