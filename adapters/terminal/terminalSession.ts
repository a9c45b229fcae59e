import { userInfo } from 'node:os';
import { createInterface } from 'node:readline';
import { encodeForTerminal } from '../../src/render/encodeTerminal.ts';
import type { Message } from '../../src/render/message.ts';
import type { CommandRouter, CommandRequest } from '../../src/router/routerTypes.ts';
import { saveImages } from './saveImages.ts';

export interface TerminalSessionOptions {
  router: CommandRouter;
  input: NodeJS.ReadableStream & { isTTY?: boolean };
  output: NodeJS.WritableStream & { isTTY?: boolean };
  /** Folder for PNGs the terminal cannot show. */
  imageFolder: string;
  /** Text run as soon as the session opens, so a new user sees an answer at once. */
  firstCommand?: string;
  /** The terminal's channel: one per machine, like a chat channel of one. */
  channelId?: string;
  /** Terminal-only `pause SECONDS`: lets scheduled messages arrive during a scripted demo. */
  pause?: (seconds: number) => Promise<void>;
  /** Runs once the input ends, before the session returns (e.g. send what the last commands queued). */
  beforeExit?: () => Promise<void>;
}

/** Longest `pause` a script may ask for, seconds. */
const MAX_PAUSE_S = 600;

/** The terminal's stand-in for a chat channel id. */
export const TERMINAL_CHANNEL_ID = 'terminal';

/**
 * The local terminal as a chat platform: one command a line, answers as text. Interactive when
 * standard input is a terminal (a prompt); otherwise it reads every line, answers each in order and
 * returns at the end of input, so it can be scripted.
 */
export async function runTerminalSession(options: TerminalSessionOptions): Promise<void> {
  const interactive = options.input.isTTY === true;
  const color = options.output.isTTY === true;
  const write = (text: string) => options.output.write(text.endsWith('\n') ? text : `${text}\n`);
  const request = (text: string): CommandRequest => ({
    platform: 'terminal',
    teamId: '',
    channelId: options.channelId ?? TERMINAL_CHANNEL_ID,
    userId: safeUserName(),
    text,
    canManageChannel: true,
  });
  const show = async (message: Message) => {
    const paths = await saveImages(message.images, options.imageFolder, Date.now()).catch((error: Error) => {
      write(`(could not save images: ${error.message})`);
      return [];
    });
    write(encodeForTerminal(message, { color }));
    for (const path of paths) write(`  image saved: ${path}`);
  };
  const answer = async (text: string) => show(await options.router.handleCommand(request(text)));

  if (options.firstCommand) await answer(options.firstCommand);
  const lines = createInterface({ input: options.input, output: interactive ? options.output : undefined, terminal: interactive });
  if (interactive) {
    write('\nType a command (try "help"); Ctrl-D to leave.');
    lines.setPrompt('lapsewatch> ');
    lines.prompt();
  }
  for await (const line of lines) {
    const text = line.trim();
    if (text === 'quit' || text === 'exit') break;
    const pauseMatch = /^pause\s+(\d+(?:\.\d+)?)$/i.exec(text);
    if (pauseMatch && options.pause) {
      await options.pause(Math.min(MAX_PAUSE_S, Number(pauseMatch[1])));
    } else if (text.length > 0 && !text.startsWith('#')) {
      await answer(text);
    }
    if (interactive) lines.prompt();
  }
  lines.close();
  await options.beforeExit?.();
}

function safeUserName(): string {
  try {
    return userInfo().username;
  } catch {
    return 'terminal-user';
  }
}
