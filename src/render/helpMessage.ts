import { COMMAND_EXAMPLES, type Verb } from '../router/commandGrammar.ts';
import type { Message } from './message.ts';
import { buildMessage } from './safetyFooter.ts';

/** Every verb, in the order the grammar lists them, so a new command cannot be left out of help. */
const ORDER = Object.keys(COMMAND_EXAMPLES) as Verb[];

/** One screen: every command, what it does and one example, prefixed with the platform's command. */
export function buildHelpMessage(commandPrefix: string, options: { inventedData: boolean; demoPlaceNames: string[]; localFooterLine?: string }): Message {
  const prefix = commandPrefix.length > 0 ? `${commandPrefix} ` : '';
  const lines = ORDER.map((verb) => {
    const { example, what } = COMMAND_EXAMPLES[verb];
    return `\`${prefix}${example}\` — ${what}`;
  });
  const sections = [{ heading: 'Commands', lines }];
  if (options.demoPlaceNames.length > 0) {
    sections.push({
      heading: 'Demo places (invented)',
      lines: [`Try ${options.demoPlaceNames.map((name) => `\`${prefix}${name}\``).join(', ')}, or any LAT,LON.`],
    });
  }
  return buildMessage(
    {
      kind: 'help',
      title: 'Lapsewatch: when will mixing reach the dry air aloft?',
      sections,
      inventedData: options.inventedData,
    },
    options.localFooterLine,
  );
}
