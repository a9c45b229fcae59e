import type { Message } from './message.ts';

/**
 * Lapsewatch's own severity colours, chosen to read as calm, heightened and urgent on both light
 * and dark chat themes.
 */
export const SEVERITY_COLOURS: Record<Message['severity'], { rgb: number; hex: string; ansi: string; word: string }> = {
  info: { rgb: 0x4a7c8f, hex: '#4A7C8F', ansi: '\u001b[36m', word: 'Info' },
  watch: { rgb: 0xc98a1b, hex: '#C98A1B', ansi: '\u001b[33m', word: 'Watch' },
  warning: { rgb: 0xb8432f, hex: '#B8432F', ansi: '\u001b[31m', word: 'Warning' },
};
