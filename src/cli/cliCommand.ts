/** What the process gives a subcommand: the three standard streams. */
export interface CliIo {
  stdout: NodeJS.WritableStream & { isTTY?: boolean };
  stderr: NodeJS.WritableStream & { isTTY?: boolean };
  stdin: NodeJS.ReadableStream;
}

/** A subcommand of `lapsewatch`: resolves to the process exit code. */
export interface CliCommand {
  run(args: string[], io: CliIo): Promise<number>;
}

/** Exit codes of every subcommand. */
export const EXIT_OK = 0;
/** A file, a profile or (in a batch) at least one line could not be analysed. */
export const EXIT_BAD_INPUT = 1;
/** The command line itself is wrong: unknown option, missing value, unknown subcommand. */
export const EXIT_USAGE = 2;
