import { formatRunTime } from './localTime.ts';

/** Where the numbers come from, in one line: model, run and source; invented data say so. */
export function sourceLine(model: string, runTime: string, sourceName: string, invented: boolean): string {
  const source = invented && !/invented/i.test(sourceName) ? `${sourceName} (invented data)` : sourceName;
  return `Model ${model}, run ${formatRunTime(runTime)} · source: ${source}`;
}
