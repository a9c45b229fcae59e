import { analyzeProfileInput } from '../core/analyzeProfile.ts';
import { ANALYZE_USAGE, parseAnalyzeArguments } from './analyzeArguments.ts';
import { EXIT_BAD_INPUT, EXIT_OK, EXIT_USAGE, type CliCommand, type CliIo } from './cliCommand.ts';
import { runNdjsonBatch } from './ndjsonBatch.ts';
import { DEMO_PROFILE_PATH, readProfileFile } from './readProfileFile.ts';
import { renderReadout } from './renderReadout.ts';

/**
 * `lapsewatch analyze`: the stable command-line contract. On any failure the reason goes to stderr
 * and nothing at all to stdout, so a caller can trust that stdout holds a whole result or nothing.
 */
export const analyzeCommand: CliCommand = {
  async run(args: string[], io: CliIo): Promise<number> {
    const parsed = parseAnalyzeArguments(args);
    if (!parsed.ok) {
      io.stderr.write(`lapsewatch analyze: ${parsed.error}\nRun \`lapsewatch analyze --help\` for the options.\n`);
      return EXIT_USAGE;
    }
    const { file, json, ndjson, surfaceTemperatureC, virtualTemperature, help } = parsed.value;
    if (help) {
      io.stdout.write(ANALYZE_USAGE);
      return EXIT_OK;
    }
    const options = { surfaceTemperatureC, virtualTemperature };
    if (ndjson) return runNdjsonBatch(io, options);

    const isDemo = file === null;
    const read = await readProfileFile(file ?? DEMO_PROFILE_PATH, io.stdin);
    if (!read.ok) {
      io.stderr.write(`lapsewatch analyze: ${read.error}\n`);
      return EXIT_BAD_INPUT;
    }
    const analysed = analyzeProfileInput(read.profile, options);
    if (!analysed.ok) {
      const where = file === null ? DEMO_PROFILE_PATH : file === '-' ? 'standard input' : file;
      io.stderr.write(analysed.errors.map((error) => `lapsewatch analyze: ${where}: ${error}\n`).join(''));
      return EXIT_BAD_INPUT;
    }
    const inventedData = isDemo || /\(invented\)/i.test(analysed.result.name);
    io.stdout.write(json ? `${JSON.stringify(analysed.result, null, 2)}\n` : renderReadout(analysed.result, { inventedData }));
    return EXIT_OK;
  },
};
