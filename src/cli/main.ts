import { EXIT_OK, EXIT_USAGE, type CliCommand, type CliIo } from './cliCommand.ts';

interface CommandEntry {
  summary: string;
  load: () => Promise<CliCommand>;
}

/**
 * Subcommands by name. Each is loaded only when asked for, so `analyze` never pays for the chat
 * libraries; adding `watch` or `start` is one more entry here.
 */
const COMMANDS: Record<string, CommandEntry> = {
  analyze: {
    summary: 'read a forecast profile (or a batch) and report stability, mixing and fire-weather indices',
    load: async () => (await import('./analyzeCommand.ts')).analyzeCommand,
  },
  watch: {
    summary: 'follow a forecast hour by hour and report where it crosses the watch rules',
    load: async () => (await import('./watchCommand.ts')).watchCommand,
  },
  start: {
    summary: 'run the bot: chat adapters with credentials set, else the terminal; scheduler and outbox',
    load: async () => (await import('./startCommand.ts')).startCommand,
  },
};

function usage(): string {
  const lines = Object.entries(COMMANDS).map(([name, entry]) => `  ${name.padEnd(10)}${entry.summary}`);
  return ['Usage: lapsewatch <command> [options]', '', 'Commands:', ...lines, '', 'Run `lapsewatch <command> --help` for its options.', ''].join('\n');
}

const PROCESS_IO: CliIo = { stdout: process.stdout, stderr: process.stderr, stdin: process.stdin };

/** Entry point of `bin/lapsewatch.mjs`: runs a subcommand and resolves to the exit code. */
export async function main(args: string[], io: CliIo = PROCESS_IO): Promise<number> {
  const [name, ...rest] = args;
  if (name === '--help' || name === '-h' || name === 'help') {
    io.stdout.write(usage());
    return EXIT_OK;
  }
  if (name === undefined) {
    io.stderr.write(usage());
    return EXIT_USAGE;
  }
  const entry = Object.hasOwn(COMMANDS, name) ? COMMANDS[name] : undefined;
  if (!entry) {
    io.stderr.write(`lapsewatch: unknown command "${name}"\n\n${usage()}`);
    return EXIT_USAGE;
  }
  if (io === PROCESS_IO) stopQuietlyWhenOutputCloses();
  const command = await entry.load();
  return command.run(rest, io);
}

/** `lapsewatch analyze --ndjson | head` closes our stdout early: that is the reader's choice, not an error. */
function stopQuietlyWhenOutputCloses(): void {
  process.stdout.on('error', (error: NodeJS.ErrnoException) => {
    if (error.code === 'EPIPE') process.exit(0);
    throw error;
  });
}
