/**
 * `npm run bench [name ...]`: runs the benchmarks one after another and prints their figures. Goals
 * are checked here by a person reading the figures, never by timed unit tests.
 */
import { spawn } from 'node:child_process';
import { loadavg } from 'node:os';
import { fileURLToPath } from 'node:url';
import { BOT_ENVIRONMENT } from '../src/app/botRuntime.ts';
import { botNodeFlagsForBench } from './childLink.ts';

/**
 * The chat benchmark holds the bot in its own process, so that process is started as `npm start`
 * starts the bot: BOT_NODE_FLAGS and BOT_ENVIRONMENT (LAPSEWATCH_BENCH_NODE_FLAGS="..." tries
 * other flags; the benchmark prints the ones it ran with).
 */
async function runChatInBotProcess(): Promise<void> {
  const child = spawn(process.execPath, [...botNodeFlagsForBench(), '--import', 'tsx', fileURLToPath(new URL('./chatLoad.ts', import.meta.url))], {
    env: { ...process.env, ...BOT_ENVIRONMENT },
    stdio: 'inherit',
  });
  const code = await new Promise<number | null>((resolve) => child.once('exit', resolve));
  if (code !== 0) throw new Error(`the chat benchmark's process exited with code ${code}`);
}

const BENCHMARKS: Record<string, () => Promise<{ run: () => Promise<void> }>> = {
  core: async () => ({ run: (await import('./coreAnalysis.ts')).runCoreAnalysisBench }),
  series: async () => ({ run: (await import('./seriesAssessment.ts')).runSeriesAssessmentBench }),
  http: async () => ({ run: (await import('./httpSource.ts')).runHttpSourceBench }),
  chat: async () => ({ run: runChatInBotProcess }),
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
