import { startLapsewatch } from '../app/startLapsewatch.ts';
import { EXIT_USAGE, type CliCommand } from './cliCommand.ts';

const USAGE = `Usage: lapsewatch start [--config FILE]

Starts every chat adapter whose credentials are set (SLACK_BOT_TOKEN with SLACK_SIGNING_SECRET or
SLACK_APP_TOKEN; DISCORD_TOKEN with DISCORD_APPLICATION_ID), the scheduler and the outbox sender.
With none set it opens the terminal on the configured source (the invented demo by default).
In the terminal, "pause SECONDS" waits for scheduled messages (scripted demos) and "#" starts a
comment. LAPSEWATCH_CLOCK_SPEED and LAPSEWATCH_CLOCK_START run the scheduler on a fast clock.
`;

export const startCommand: CliCommand = {
  async run(args, io) {
    if (args.includes('--help') || args.includes('-h')) {
      io.stdout.write(USAGE);
      return 0;
    }
    let configPath: string | undefined;
    for (let index = 0; index < args.length; index++) {
      if (args[index] === '--config' && args[index + 1]) configPath = args[++index];
      else {
        io.stderr.write(`lapsewatch start: unknown option "${args[index]}"\n\n${USAGE}`);
        return EXIT_USAGE;
      }
    }
    return startLapsewatch({ environment: process.env, stdin: io.stdin as NodeJS.ReadableStream & { isTTY?: boolean }, stdout: io.stdout, stderr: io.stderr, ...(configPath ? { configPath } : {}) });
  },
};
