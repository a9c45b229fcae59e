import { z } from 'zod';
import type { Message } from './message.ts';

/**
 * The standard safety footer. This is the only place its words live: every message gets it
 * through `buildMessage`, and encoders keep it whatever else they must shorten.
 */
export const SAFETY_FOOTER =
  'Forecast guidance only, not an official forecast. Check it with the incident meteorologist or ' +
  'the local forecast office. Follow your agency\u2019s fireline safety rules and local practice.';

/** The first sentence, for places too small for the whole footer (the corner of an image). */
export const SAFETY_FOOTER_SHORT = 'Forecast guidance only, not an official forecast.';

/** Longest local line config may add; keeps the footer inside every platform's smallest limit. */
export const LOCAL_FOOTER_LINE_MAX_CHARS = 300;

/** For the config loader: one extra line, shown after the footer, never instead of it. */
export const localFooterLineSchema = z
  .string()
  .trim()
  .min(1, 'the local footer line is empty; leave the key out instead')
  .max(LOCAL_FOOTER_LINE_MAX_CHARS, `the local footer line is longer than ${LOCAL_FOOTER_LINE_MAX_CHARS} characters`)
  .refine((line) => !/[\r\n]/.test(line), 'the local footer line must be one line, e.g. "Dispatch: Ridgeview ECC, channel 4 (invented)"');

export type MessageParts = Omit<Message, 'footer' | 'images' | 'actions' | 'sections' | 'severity' | 'inventedData' | 'postsToChannel'> &
  Partial<Pick<Message, 'images' | 'actions' | 'sections' | 'severity' | 'inventedData'>>;

/** Builds the footer: the standard text, then at most one local line (made single-line and capped). */
export function composeFooter(localLine?: string): string {
  if (localLine === undefined) return SAFETY_FOOTER;
  const oneLine = localLine.replace(/\s+/g, ' ').trim().slice(0, LOCAL_FOOTER_LINE_MAX_CHARS);
  return oneLine.length === 0 ? SAFETY_FOOTER : `${SAFETY_FOOTER}\n${oneLine}`;
}

/** Every message is made here, so none can leave the footer out or replace it. */
export function buildMessage(parts: MessageParts, localFooterLine?: string): Message {
  return {
    kind: parts.kind,
    title: parts.title,
    sections: parts.sections ?? [],
    ...(parts.table ? { table: parts.table } : {}),
    images: parts.images ?? [],
    actions: parts.actions ?? [],
    severity: parts.severity ?? 'info',
    inventedData: parts.inventedData ?? false,
    footer: composeFooter(localFooterLine),
  };
}

/** What an encoder must show: the message's footer, restored when a caller blanked it or dropped the standard text. */
export function footerOf(message: Message): string {
  const footer = typeof message.footer === 'string' ? message.footer : '';
  if (!footer.startsWith(SAFETY_FOOTER)) return SAFETY_FOOTER;
  return composeFooter(footer.length > SAFETY_FOOTER.length ? footer.slice(SAFETY_FOOTER.length) : undefined);
}
