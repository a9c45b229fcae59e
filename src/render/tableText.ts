import type { MessageTable } from './message.ts';

/** Visible width of a cell: ANSI colour codes take no room on screen. */
function visibleWidth(text: string): number {
  return text.replace(/\u001b\[[0-9;]*m/g, '').length;
}

/** Numbers and figures with units read best right-aligned; words left-aligned. */
function looksNumeric(text: string): boolean {
  return /^[-+−]?[0-9.,]+(\s?\S+)?$/.test(text.trim());
}

/**
 * A table as aligned plain-text lines (header, rule, rows), for monospace places: a terminal or
 * a code block in chat.
 */
export function tableLines(table: MessageTable): string[] {
  const columnCount = Math.max(table.columns.length, ...table.rows.map((row) => row.length), 0);
  const cell = (row: string[], index: number): string => (row[index] ?? '').replace(/[\r\n]+/g, ' ');
  const widths = Array.from({ length: columnCount }, (_, index) =>
    Math.max(visibleWidth(cell(table.columns, index)), ...table.rows.map((row) => visibleWidth(cell(row, index)))),
  );
  const rightAligned = Array.from({ length: columnCount }, (_, index) =>
    table.rows.length > 0 && table.rows.every((row) => cell(row, index) === '' || looksNumeric(cell(row, index))),
  );
  const render = (row: string[]): string =>
    Array.from({ length: columnCount }, (_, index) => {
      const text = cell(row, index);
      const pad = ' '.repeat(Math.max(0, widths[index] - visibleWidth(text)));
      return rightAligned[index] ? pad + text : text + pad;
    })
      .join('  ')
      .trimEnd();
  const rule = widths.map((width) => '-'.repeat(width)).join('  ');
  return [render(table.columns), rule, ...table.rows.map(render)];
}

/** Table lines that fit `maxLength` when joined by newlines, dropping rows from the end with a count. */
export function tableTextWithin(table: MessageTable, maxLength: number): string {
  const lines = tableLines(table);
  const joined = lines.join('\n');
  if (joined.length <= maxLength) return joined;
  const kept: string[] = [];
  for (let index = 0; index < lines.length; index += 1) {
    const left = lines.length - index;
    const note = `… ${left} more row${left === 1 ? '' : 's'}`;
    const next = [...kept, lines[index]].join('\n');
    if (next.length + 1 + note.length > maxLength) {
      const withNote = [...kept, note].join('\n');
      return withNote.length <= maxLength ? withNote : kept.join('\n').slice(0, maxLength);
    }
    kept.push(lines[index]);
  }
  return kept.join('\n');
}
