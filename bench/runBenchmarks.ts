/**
 * `npm run bench [name ...]`: runs the benchmarks one after another and prints their figures. Goals
 * are checked here by a person reading the figures, never by timed unit tests.
 */
import { loadavg } from 'node:os';

const BENCHMARKS: Record<string, () => Promise<{ run: () => Promise<void> }>> = {
  core: async () => ({ run: (await import('./coreAnalysis.ts')).runCoreAnalysisBench }),
  series: async () => ({ run: (await import('./seriesAssessment.ts')).runSeriesAssessmentBench }),
  http: async () => ({ run: (await import('./httpSource.ts')).runHttpSourceBench }),
  chat: async () => ({ run: (await import('./chatLoad.ts')).runChatLoadBench }),
  alerts: async () => ({ run: (await import('./alertCycle.ts')).runAlertCycleBench }),
};

export async function runBenchmarks(names: string[]): Promise<number> {
  const wanted = names.length > 0 ? names : Object.keys(BENCHMARKS);
  const unknown = wanted.filter((name) => !Object.hasOwn(BENCHMARKS, name));
  if (unknown.length > 0) {
    process.stderr.write(`unknown benchmark(s): ${unknown.join(', ')}; choose from ${Object.keys(BENCHMARKS).join(', ')}\n`);
    return 2;
  }
  for (const name of wanted) {
    process.stdout.write(`\n=== ${name} (load average ${loadavg().map((value) => value.toFixed(2)).join(' ')}) ===\n`);
    const { run } = await BENCHMARKS[name]();
    await run();
  }
  return 0;
}
