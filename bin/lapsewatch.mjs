#!/usr/bin/env node
// Runs the compiled build (dist/, made by `npm ci` through `prepare`, or `npm run build`) when it
// is current, else the TypeScript sources through tsx, so a changed source is never run stale.
import { pathToFileURL } from 'node:url';
import { runnableModule } from './compiledBuild.mjs';

const entry = runnableModule('src/cli/main.ts');
if (!entry.compiled) {
  const { register } = await import('tsx/esm/api');
  register();
}
const { main } = await import(pathToFileURL(entry.path).href);
process.exitCode = await main(process.argv.slice(2));
