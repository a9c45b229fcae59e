import type { Message, MessageAction, MessageImage } from './message.ts';
import { footerOf } from './safetyFooter.ts';
import { INVENTED_DATA_NOTE } from './inventedDataNote.ts';
import { tableTextWithin } from './tableText.ts';
import { nonEmpty, truncateText, truncateTransformed } from './textFit.ts';

/** Slack's documented Block Kit limits, the ones our messages could reach. */
export const SLACK_LIMITS = {
  blocks: 50,
  headerText: 150,
  sectionText: 3000,
  sectionFields: 10,
  fieldText: 2000,
  contextText: 3000,
  actionsElements: 25,
  buttonText: 75,
  buttonValue: 2000,
  actionId: 255,
  /** Top-level fallback text: Slack advises 4,000 at most; we stay well under. */
  fallbackText: 3000,
} as const;

/** The most action blocks one message gets; more buttons than this is not a compact message. */
const MAX_ACTION_BLOCKS = 2;

export interface SlackFile {
  fileName: string;
  title: string;
  altText: string;
  png: Uint8Array;
}

export interface SlackEncoding {
  /** Plain-text fallback (notifications, screen readers); ends with the footer. */
  text: string;
  blocks: object[];
  /** Images for the adapter to upload (files.uploadV2) beside or after the message. */
  files: SlackFile[];
}

/** Slack's mrkdwn needs only these three escaped. */
export function escapeSlackText(text: string): string {
  return text.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

const fitMrkdwn = (raw: string, maxLength: number): string => truncateTransformed(raw, maxLength, escapeSlackText);

function mrkdwn(text: string): { type: 'mrkdwn'; text: string } {
  return { type: 'mrkdwn', text };
}

/** Packs escaped lines into section texts of at most the section limit, cutting any single overlong line. */
function packLines(rawLines: string[], bold: Set<number>): string[] {
  const chunks: string[] = [];
  let current = '';
  rawLines.forEach((raw, index) => {
    const budget = SLACK_LIMITS.sectionText - (bold.has(index) ? 2 : 0);
    const escaped = fitMrkdwn(raw.replace(/\r/g, ''), budget);
    const line = bold.has(index) && escaped.trim().length > 0 ? `*${escaped}*` : escaped;
    if (current.length > 0 && current.length + 1 + line.length > SLACK_LIMITS.sectionText) {
      chunks.push(current);
      current = line;
    } else {
      current = current.length > 0 ? `${current}\n${line}` : line;
    }
  });
  if (current.trim().length > 0) chunks.push(current);
  return chunks;
}

function sectionBlocks(message: Message): object[] {
  const blocks: object[] = [];
  for (const section of message.sections) {
    const rawLines = [...(section.heading ? [section.heading] : []), ...section.lines];
    const texts = packLines(rawLines, new Set(section.heading ? [0] : []));
    const fields = (section.fields ?? []).map((field) =>
      mrkdwn(
        nonEmpty(
          `*${fitMrkdwn(nonEmpty(field.label, '-'), 200)}*\n${fitMrkdwn(field.value, SLACK_LIMITS.fieldText - 210)}`,
          '-',
        ),
      ),
    );
    const fieldChunks: object[][] = [];
    for (let start = 0; start < fields.length; start += SLACK_LIMITS.sectionFields) {
      fieldChunks.push(fields.slice(start, start + SLACK_LIMITS.sectionFields));
    }
    texts.forEach((text, index) => {
      const isLast = index === texts.length - 1;
      const attached = isLast ? fieldChunks.shift() : undefined;
      blocks.push({ type: 'section', text: mrkdwn(text), ...(attached ? { fields: attached } : {}) });
    });
    for (const chunk of fieldChunks) blocks.push({ type: 'section', fields: chunk });
  }
  if (message.table && (message.table.columns.length > 0 || message.table.rows.length > 0)) {
    const fence = 8; // "```\n" + "\n```"
    const text = fitTable(message.table, SLACK_LIMITS.sectionText - fence);
    blocks.push({ type: 'section', text: mrkdwn(`\`\`\`\n${text}\n\`\`\``) });
  }
  return blocks;
}

function fitTable(table: NonNullable<Message['table']>, maxLength: number): string {
  // Rows are dropped (with a count) until the escaped table fits.
  let fits = 0;
  let tooLong = maxLength + 1;
  if (escapeSlackText(tableTextWithin(table, maxLength)).length <= maxLength) return escapeSlackText(tableTextWithin(table, maxLength));
  while (tooLong - fits > 1) {
    const middle = Math.floor((fits + tooLong) / 2);
    if (escapeSlackText(tableTextWithin(table, middle)).length <= maxLength) fits = middle;
    else tooLong = middle;
  }
  return escapeSlackText(tableTextWithin(table, fits));
}

/** Buttons, duplicates removed, in blocks where no action_id repeats (Slack refuses a repeat). */
function actionBlocks(actions: MessageAction[]): object[] {
  const seen = new Set<string>();
  const groups: MessageAction[][] = [];
  for (const action of actions) {
    const key = `${action.actionId}\u0000${action.value}`;
    if (seen.has(key)) continue;
    // A value Slack would refuse cannot be cut without breaking it: leave that button out.
    if (action.value.length > SLACK_LIMITS.buttonValue || action.actionId.length > SLACK_LIMITS.actionId) continue;
    seen.add(key);
    const group = groups.find(
      (candidate) => candidate.length < SLACK_LIMITS.actionsElements && candidate.every((other) => other.actionId !== action.actionId),
    );
    if (group) group.push(action);
    else groups.push([action]);
  }
  return groups.slice(0, MAX_ACTION_BLOCKS).map((group) => ({
    type: 'actions',
    elements: group.map((action) => ({
      type: 'button',
      action_id: action.actionId,
      value: action.value,
      text: { type: 'plain_text', text: truncateText(nonEmpty(action.label, action.actionId), SLACK_LIMITS.buttonText), emoji: true },
      ...(action.actionId === 'show-detail' ? { style: 'primary' } : {}),
    })),
  }));
}

function fallbackText(message: Message, footer: string): string {
  const lines: string[] = [message.title];
  if (message.inventedData) lines.push(INVENTED_DATA_NOTE);
  for (const section of message.sections) {
    if (section.heading) lines.push(section.heading);
    lines.push(...section.lines);
    for (const field of section.fields ?? []) lines.push(`${field.label}: ${field.value}`);
  }
  const tail = escapeSlackText(footer);
  const room = SLACK_LIMITS.fallbackText - tail.length - 1;
  const body = fitMrkdwn(lines.join('\n'), room);
  return body.length > 0 ? `${body}\n${tail}` : tail;
}

/**
 * A message as Slack Block Kit. Never produces what Slack would refuse: everything is shortened to
 * Slack's limits, the footer and the invented-data note always survive.
 */
export function encodeForSlack(message: Message): SlackEncoding {
  const footer = footerOf(message);
  const header = {
    type: 'header',
    text: { type: 'plain_text', text: truncateText(nonEmpty(message.title.replace(/\s+/g, ' '), 'Lapsewatch'), SLACK_LIMITS.headerText), emoji: true },
  };
  const invented = message.inventedData ? [{ type: 'context', elements: [mrkdwn(`*${escapeSlackText(INVENTED_DATA_NOTE)}*`)] }] : [];
  const footerBlock = { type: 'context', elements: [mrkdwn(fitMrkdwn(footer, SLACK_LIMITS.contextText))] };
  const actions = actionBlocks(message.actions);
  const content = sectionBlocks(message);
  const room = SLACK_LIMITS.blocks - 1 - invented.length - 1 - actions.length;
  let kept = content;
  if (content.length > room) {
    const dropped = content.length - (room - 1);
    kept = [
      ...content.slice(0, room - 1),
      { type: 'section', text: mrkdwn(`_… shortened: ${dropped} more part${dropped === 1 ? '' : 's'} not shown._`) },
    ];
  }
  return {
    text: fallbackText(message, footer),
    blocks: [header, ...invented, ...kept, ...actions, footerBlock],
    files: message.images.map((image: MessageImage) => ({
      fileName: image.fileName,
      title: truncateText(image.altText, 250),
      altText: truncateText(image.altText, 1000),
      png: image.png,
    })),
  };
}
