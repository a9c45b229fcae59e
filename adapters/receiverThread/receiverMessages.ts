import type { DiscordReceiverOptions } from '../discord/createDiscordBot.ts';
import type { SlackReceiverOptions } from '../slack/createSlackApp.ts';
import type { AnswerJob } from '../answering/answerJob.ts';

/** What the receiver thread is started with: plain data (workerData). */
export interface ReceiverThreadSettings {
  slack: Omit<SlackReceiverOptions, 'extraRoutes'> | null;
  discord: Omit<DiscordReceiverOptions, 'log'> | null;
  /** GET paths on the Slack receiver's port answered by the main thread (e.g. /metrics). */
  textRoutePaths: string[];
  /**
   * The nice value the receivers run at: the main thread's before it lowered its own. A thread
   * started later (a restart) inherits the lowered value and goes back to this one where allowed.
   */
  nice: number | null;
}

export type LogLevelName = 'info' | 'warn' | 'error';

/** Receiver thread to main thread. */
export type FromReceiver =
  | { type: 'ready'; slack: { mode: 'http' | 'socket'; port: number } | null; discord: boolean; heapUsedMb: number; nice: number | null }
  | { type: 'failed'; error: string }
  | { type: 'job'; job: AnswerJob }
  | { type: 'log'; level: LogLevelName; text: string }
  | { type: 'route'; id: number; path: string }
  | { type: 'stopped' };

/** Main thread to receiver thread. */
export type ToReceiver = { type: 'route-answer'; id: number; status: number; contentType: string; body: string } | { type: 'stop' };

/** A GET route whose text the main thread makes (it holds the metrics registry). */
export interface TextRoute {
  path: string;
  render(): Promise<{ contentType: string; body: string }>;
}
