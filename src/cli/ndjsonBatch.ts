import { once } from 'node:events';
import { createInterface } from 'node:readline';
import { analyzeProfileInput, type AnalyzeOptions } from '../core/analyzeProfile.ts';
import { parseProfileText } from '../profile/parseProfileText.ts';
import { EXIT_BAD_INPUT, EXIT_OK, type CliIo } from './cliCommand.ts';
import { ProgressLine } from './progressLine.ts';

/**
 * `analyze --ndjson`: one JSON profile per input line, one JSON result per output line, in order.
 * A line that cannot be analysed yields `{"line": N, "error": "..."}` on stdout (and the same words
 * on stderr) and the batch goes on; the exit code is 1 when any line failed. Empty lines are skipped
 * and produce no output. Line numbers count every input line from 1.
 */
export async function runNdjsonBatch(io: CliIo, options: AnalyzeOptions): Promise<number> {
  const progress = new ProgressLine((text) => io.stderr.write(text), io.stderr.isTTY === true, () => performance.now());
  const lines = createInterface({ input: io.stdin, crlfDelay: Infinity });
  let lineNumber = 0;
  let doneCount = 0;
  let failedCount = 0;
  for await (const line of lines) {
    lineNumber++;
    if (line.trim().length === 0) continue;
    const outcome = analyzeLine(line, lineNumber, options);
    doneCount++;
    if (!outcome.ok) {
      failedCount++;
      progress.clear();
      io.stderr.write(`lapsewatch analyze: ${outcome.error}\n`);
    }
    const text = outcome.ok ? outcome.json : JSON.stringify({ line: lineNumber, error: outcome.error });
    if (!io.stdout.write(`${text}\n`)) await once(io.stdout, 'drain');
    progress.update(doneCount, failedCount);
  }
  progress.finish(doneCount, failedCount);
  return failedCount > 0 ? EXIT_BAD_INPUT : EXIT_OK;
}

function analyzeLine(line: string, lineNumber: number, options: AnalyzeOptions): { ok: true; json: string } | { ok: false; error: string } {
  const where = `line ${lineNumber}`;
  if (!line.trimStart().startsWith('{')) return { ok: false, error: `${where}: not a JSON object; --ndjson takes one JSON profile per line` };
  const parsed = parseProfileText(line, where);
  if (!parsed.ok) return { ok: false, error: parsed.error };
  const analysed = analyzeProfileInput(parsed.profile, options);
  if (!analysed.ok) return { ok: false, error: `${where}: ${analysed.errors.join('; ')}` };
  return { ok: true, json: JSON.stringify(analysed.result) };
}
