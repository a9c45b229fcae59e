import type { Message } from './message.ts';
import { footerOf } from './safetyFooter.ts';
import { INVENTED_DATA_NOTE } from './inventedDataNote.ts';
import { SEVERITY_COLOURS } from './severityPalette.ts';
import { tableLines } from './tableText.ts';

const BOLD = '\u001b[1m';
const DIM = '\u001b[2m';
const RESET = '\u001b[0m';

export interface TerminalOptions {
  color: boolean;
}

/** Strips control characters a message could carry in from user text (they would move the cursor). */
function clean(text: string): string {
  return text.replace(/[\u0000-\u0008\u000b-\u001f\u007f]/g, '');
}

/**
 * A message as compact terminal text: title, sections with aligned figures, the table, the
 * buttons as hints, images by file name, and the footer last.
 */
export function encodeForTerminal(message: Message, options: TerminalOptions): string {
  const paint = (codes: string, text: string): string => (options.color ? `${codes}${text}${RESET}` : text);
  const severity = SEVERITY_COLOURS[message.severity] ?? SEVERITY_COLOURS.info;
  const out: string[] = [];

  const marker = message.severity === 'info' ? '' : `[${severity.word.toUpperCase()}] `;
  out.push(paint(BOLD + severity.ansi, `${marker}${clean(message.title)}`));
  if (message.inventedData) out.push(paint(BOLD, `! ${INVENTED_DATA_NOTE}`));

  for (const section of message.sections) {
    out.push('');
    if (section.heading) out.push(paint(BOLD, clean(section.heading)));
    for (const line of section.lines) out.push(`  ${clean(line)}`);
    const fields = section.fields ?? [];
    const labelWidth = Math.max(0, ...fields.map((field) => clean(field.label).length));
    for (const field of fields) {
      out.push(`  ${clean(field.label).padEnd(labelWidth)}  ${clean(field.value)}`);
    }
  }

  if (message.table && (message.table.columns.length > 0 || message.table.rows.length > 0)) {
    const cleanTable = { columns: message.table.columns.map(clean), rows: message.table.rows.map((row) => row.map(clean)) };
    const [header, rule, ...rows] = tableLines(cleanTable);
    out.push('', `  ${paint(BOLD, header)}`, `  ${rule}`, ...rows.map((row) => `  ${row}`));
  }

  if (message.images.length > 0) {
    out.push('');
    for (const image of message.images) out.push(paint(DIM, `  image: ${clean(image.fileName)} (${clean(image.altText)})`));
  }
  if (message.actions.length > 0) {
    out.push('');
    for (const action of message.actions) out.push(paint(DIM, `  [${action.actionId} ${clean(action.value)}] ${clean(action.label)}`));
  }

  // The footer stays at full strength: it is the one part nobody may skim past.
  out.push('', ...footerOf(message).split('\n').map(clean));
  return out.join('\n');
}
