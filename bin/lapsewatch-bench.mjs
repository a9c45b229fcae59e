#!/usr/bin/env node
// Runs the benchmarks through tsx, like the main command.
import { register } from 'tsx/esm/api';

register();
const { runBenchmarks } = await import('../bench/runBenchmarks.ts');
process.exitCode = await runBenchmarks(process.argv.slice(2));
// Stand-in servers and clients may leave handles open; the figures are printed, so leave.
process.exit(process.exitCode);
