import { PassThrough } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { main } from '../../src/cli/main.ts';

/** Runs the command line in this process with captured streams: the same code as the binary, without a process start per case. */
async function runMain(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  const stdout = new PassThrough();
  const stderr = new PassThrough();
  const stdin = new PassThrough();
  stdin.end();
  let out = '';
  let err = '';
  stdout.on('data', (chunk: Buffer) => (out += chunk.toString()));
  stderr.on('data', (chunk: Buffer) => (err += chunk.toString()));
  const code = await main(args, { stdout, stderr, stdin });
  return { code, stdout: out, stderr: err };
}

describe('lapsewatch command line, parsed in process', () => {
  it.each([
    [['analyze', '--surface-temp', 'warm'], /--surface-temp "warm" is not a number/],
    [['analyze', '--surface-temp'], /--surface-temp needs a temperature/],
    [['analyze', '--surface-temp', '310'], /outside −60 to 60 °C/],
    [['analyze', '--surface-temp=', 'x.json'], /--surface-temp needs a temperature/],
    [['analyze', '--json=yes'], /--json takes no value/],
    [['analyze', '--colour'], /unknown option "--colour"/],
    [['analyze', 'a.json', 'b.json'], /one FILE at a time/],
    [['analyze', '--ndjson', 'a.json'], /--ndjson reads profiles from standard input/],
    [['forecast'], /unknown command "forecast"/],
    [[], /Usage: lapsewatch <command>/],
  ])('%j exits 2 with the reason on stderr and nothing on stdout', async (args, reason) => {
    const run = await runMain(args);
    expect(run.code).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(reason);
  });

  it('takes a negative --surface-temp and the --surface-temp=C form', async () => {
    const spaced = await runMain(['analyze', '--json', '--surface-temp', '-5']);
    expect(spaced.code).toBe(0);
    expect(JSON.parse(spaced.stdout).options.surfaceTemperatureC).toBe(-5);
    const joined = await runMain(['analyze', '--json', '--surface-temp=36.5']);
    expect(JSON.parse(joined.stdout).options.surfaceTemperatureC).toBe(36.5);
  });

  it('--help lists the commands; analyze --help lists its options and exit codes', async () => {
    const top = await runMain(['--help']);
    expect(top.code).toBe(0);
    expect(top.stdout).toMatch(/analyze/);
    const analyze = await runMain(['analyze', '--help']);
    expect(analyze.code).toBe(0);
    expect(analyze.stdout).toMatch(/--surface-temp C/);
    expect(analyze.stdout).toMatch(/Exit codes/);
  });
});
