import type { ActionRequest, CommandRequest } from '../../src/router/routerTypes.ts';

/** What the person asked: a command's text or a button press. */
export type Ask = { kind: 'command'; request: CommandRequest } | { kind: 'action'; request: ActionRequest };

/**
 * A question already acknowledged on its platform, with what is needed to answer it later over
 * plain HTTP. Plain data only (no clients, no functions), so it can cross to another thread.
 */
export type AnswerJob =
  | {
      platform: 'slack';
      ask: Ask;
      /** Slack's response URL for this command or button (valid 30 minutes). */
      responseUrl: string;
      channelId: string;
    }
  | {
      platform: 'discord';
      ask: Ask;
      applicationId: string;
      /** The interaction's token: the deferred reply is edited through it (valid 15 minutes). */
      interactionToken: string;
    };

/** Where a receiver hands an acknowledged question; it must return at once (the answer comes later). */
export type HandOff = (job: AnswerJob) => void;
