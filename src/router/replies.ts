import type { Message, MessageSection } from '../render/message.ts';
import { buildMessage } from '../render/safetyFooter.ts';

/** A short confirmation or listing. */
export function noticeMessage(title: string, lines: string[] = [], localFooterLine?: string, inventedData = false): Message {
  const sections: MessageSection[] = lines.length > 0 ? [{ lines }] : [];
  return buildMessage({ kind: 'notice', title, sections, inventedData }, localFooterLine);
}

/** A refusal or a failure: one line a person can act on; nothing was changed. */
export function errorMessage(text: string, localFooterLine?: string): Message {
  return buildMessage({ kind: 'error', title: text, sections: [] }, localFooterLine);
}

/** A change that turns posts on (watch, morning summary), refused where the platform says the bot may not post. */
export const CANNOT_POST_HERE =
  'Lapsewatch may not post in this channel (it needs to view the channel, send messages (in a thread: send messages in threads), embed links and attach files here), so alerts and morning summaries could not arrive. Give it those permissions, then give the command again. Nothing was changed.';

/** The sentence every change-refusal shares, so users learn it once. */
export const NEEDS_MANAGE_CHANNEL =
  'Only members who can manage this channel may change what it watches or its settings. Nothing was changed.';

/**
 * Added to the first answer in a channel that had been marked inactive: the platform refused the
 * bot's posts there (removed, or a permission taken away), the outbox switched its watches off, and
 * nobody could be told then. Any command makes the channel active again; the watches stay off.
 */
export function postsStoppedSection(inactiveSinceMs: number): MessageSection {
  const since = new Date(inactiveSinceMs).toISOString().slice(0, 16).replace('T', ' ');
  return {
    heading: 'Alerts here had stopped',
    lines: [
      `Since ${since}Z Lapsewatch could not post in this channel (it was removed, or lost a permission), so this channel's watches were switched off.`,
      'Make sure it can post here, then `watch PLACE` again; `watching` lists what is on.',
    ],
  };
}
