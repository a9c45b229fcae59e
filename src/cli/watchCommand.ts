import { DemoSource } from '../forecast/demoSource.ts';
import { FileSource } from '../forecast/fileSource.ts';
import { OpenMeteoSource } from '../forecast/openMeteoSource.ts';
import { forecastWindowFrom } from '../forecast/forecastWindowFrom.ts';
import type { ForecastSource } from '../forecast/forecastSource.ts';
import { encodeForTerminal } from '../render/encodeTerminal.ts';
import { assessSeries } from '../watch/assessSeries.ts';
import { parseWatchArguments, WATCH_USAGE, type WatchSourceChoice } from '../watch/command/watchArguments.ts';
import { findCrossings } from '../watch/crossings/findCrossings.ts';
import { watchJson } from '../watch/report/watchJson.ts';
import { watchMessage, type WatchReport } from '../watch/report/watchMessage.ts';
import { formatConfigProblem } from '../watch/rules/configProblem.ts';
import { DEFAULT_RULES_PATH, loadRulesFile } from '../watch/rules/loadRules.ts';
import type { CliCommand } from './cliCommand.ts';

/** Exit codes, as the other subcommands use them. */
const EXIT_OK = 0;
const EXIT_FAILED = 1;
const EXIT_USAGE = 2;

export interface WatchIo {
  stdout: NodeJS.WritableStream & { isTTY?: boolean };
  stderr: NodeJS.WritableStream;
}

function buildSource(choice: WatchSourceChoice): ForecastSource {
  switch (choice.kind) {
    case 'demo':
      return new DemoSource();
    case 'http':
      return new OpenMeteoSource();
    case 'files':
      return new FileSource({ directory: choice.directory });
  }
}

/**
 * `lapsewatch watch`: a forecast series for one place, assessed hour by hour, with day summaries
 * and the rule crossings, each once; the safety footer last. Bad arguments: one line on stderr and
 * exit 2, nothing on stdout. A bad rules file or a source that cannot answer: the reason on stderr
 * and exit 1.
 */
export async function runWatchCommand(args: string[], io: WatchIo): Promise<number> {
  const parsed = parseWatchArguments(args);
  if (!parsed.ok) {
    io.stderr.write(`lapsewatch watch: ${parsed.message}\n`);
    return EXIT_USAGE;
  }
  const options = parsed.arguments;
  if (options.help) {
    io.stdout.write(WATCH_USAGE);
    return EXIT_OK;
  }

  const rulesPath = options.rulesPath ?? DEFAULT_RULES_PATH;
  const rules = await loadRulesFile(rulesPath, options.rulesPath ?? 'config/rules.yaml');
  if (!rules.ok) {
    io.stderr.write(rules.problems.map((problem) => `lapsewatch watch: ${formatConfigProblem(problem)}\n`).join(''));
    return EXIT_FAILED;
  }

  let source: ForecastSource;
  try {
    source = buildSource(options.source);
  } catch (error) {
    io.stderr.write(`lapsewatch watch: ${(error as Error).message}\n`);
    return EXIT_FAILED;
  }

  const window = options.startTime ? { startTime: options.startTime, hours: options.hours } : forecastWindowFrom(Date.now(), options.hours);
  const result = await source.fetchSeries(options.location, window);
  if (!result.ok) {
    io.stderr.write(`lapsewatch watch: ${result.error.message}\n`);
    return EXIT_FAILED;
  }

  const series = assessSeries(result.series);
  const report: WatchReport = { series, crossings: findCrossings(series, rules.rules), rules: rules.rules, sourceNotes: result.series.notes ?? [] };
  if (options.json) {
    io.stdout.write(`${JSON.stringify(watchJson(report), null, 2)}\n`);
  } else {
    io.stdout.write(`${encodeForTerminal(watchMessage(report), { color: io.stdout.isTTY === true })}\n`);
  }
  return EXIT_OK;
}

/** For the CLI dispatcher's table of subcommands. */
export const watchCommand: CliCommand = { run: (args, io) => runWatchCommand(args, io) };
