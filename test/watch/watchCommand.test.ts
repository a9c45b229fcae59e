import { spawn } from 'node:child_process';
import { mkdtemp, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { Writable } from 'node:stream';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { runWatchCommand } from '../../src/cli/watchCommand.ts';
import { INVENTED_DATA_NOTE } from '../../src/render/inventedDataNote.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';
import { syntheticSeries } from './support/syntheticSeries.ts';

const REPO = fileURLToPath(new URL('../../', import.meta.url));
// The demo's invented incident command post; its first scenario day starts at local midnight here.
const DEMO_ARGS = ['--place', 'Kestrel Bench ICP', '--start', '2026-08-14T06:00:00Z'];

class Collected extends Writable {
  text = '';
  override _write(chunk: Buffer, _encoding: BufferEncoding, done: () => void): void {
    this.text += chunk.toString();
    done();
  }
}

async function run(args: string[]): Promise<{ code: number; stdout: string; stderr: string }> {
  const stdout = new Collected();
  const stderr = new Collected();
  const code = await runWatchCommand(args, { stdout, stderr });
  return { code, stdout: stdout.text, stderr: stderr.text };
}

/** `node bin/lapsewatch.mjs watch ...` in its own process: the real entry point, streams and exit code. */
function runInChild(args: string[]): Promise<{ code: number | null; stdout: string; stderr: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ['bin/lapsewatch.mjs', 'watch', ...args], { cwd: REPO, env: { ...process.env, NO_COLOR: '1' } });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (chunk) => (stdout += chunk));
    child.stderr.on('data', (chunk) => (stderr += chunk));
    child.on('error', reject);
    child.on('close', (code) => resolve({ code, stdout, stderr }));
  });
}

interface JsonCrossing {
  ruleId: string;
  direction: string;
  localDate: string;
  localTime: string;
  threshold: number;
}

describe('lapsewatch watch on the demo (invented data)', () => {
  it('prints the table, day summaries and crossings; the first-afternoon coupling once, at the hour the mixed layer leaps; footer last', async () => {
    const { code, stdout, stderr } = await run(DEMO_ARGS);
    expect(stderr).toBe('');
    expect(code).toBe(0);
    expect(stdout).toContain(INVENTED_DATA_NOTE);
    expect(stdout).toMatch(/Local time\s+Mixing m\s+Effective m\s+Dry layer m\s+Coupled\s+Transport m\/s\s+Vent m²\/s\s+HDW\s+C-Haines\s+PFT GW\s+Min RH %/);
    expect(stdout).toContain('Day summaries');
    const couplingOnsets = stdout.split('\n').filter((line) => /Mixed layer reaches a dry layer aloft from Fri 14 Aug/.test(line));
    expect(couplingOnsets).toHaveLength(1);
    expect(couplingOnsets[0]).toContain('from Fri 14 Aug 15:00 MDT');
    expect(couplingOnsets[0]).toContain('threshold ≥ 0 m');
    expect(stdout.trimEnd().endsWith(SAFETY_FOOTER)).toBe(true);
  });

  it('--json prints one object whose crossings agree with its own hours', async () => {
    const { code, stdout } = await run([...DEMO_ARGS, '--json']);
    expect(code).toBe(0);
    const report = JSON.parse(stdout);
    expect(report.inventedDataNote).toBe(INVENTED_DATA_NOTE);
    expect(report.hours).toHaveLength(48);
    expect(Object.keys(report).at(-1)).toBe('safetyFooter');
    const onsets = (report.crossings as JsonCrossing[]).filter((c) => c.ruleId === 'mixing-reaches-dry-layer' && c.direction === 'onset' && c.localDate === '2026-08-14');
    expect(onsets).toHaveLength(1);
    const onsetHour = Number(onsets[0].localTime.slice(11, 13));
    // The demo couples in mid-afternoon of day 1 (its design); the crossing must sit on the hour the mixing height passes the layer's base.
    expect(onsetHour).toBeGreaterThanOrEqual(13);
    expect(onsetHour).toBeLessThanOrEqual(17);
    const index = report.hours.findIndex((h: { localTime: string }) => h.localTime === onsets[0].localTime);
    const [before, at] = [report.hours[index - 1], report.hours[index]];
    expect(before.mixingHeightAglM).toBeLessThan(before.dryLayerAloftBaseAglM);
    expect(at.mixingHeightAglM).toBeGreaterThanOrEqual(at.dryLayerAloftBaseAglM);
    expect(report.days[0].couplingHour).toBe(onsets[0].localTime);
    const keys = (report.crossings as Array<{ key: string }>).map((c) => c.key);
    expect(new Set(keys).size).toBe(keys.length);
  });

  it('--hours limits the series', async () => {
    const report = JSON.parse((await run([...DEMO_ARGS, '--json', '--hours', '6'])).stdout);
    expect(report.hours).toHaveLength(6);
  });
});

describe('bad input: one clear line, exit 2, nothing on stdout', () => {
  it.each([
    [['--place', '95,-115.48'], /latitude 95 is outside -90\.\.90; e\.g\. --place 43\.62,-115\.48/],
    [['--place', 'Nowhere Creek'], /not coordinates .* and not a known place .*e\.g\. --place 43\.62,-115\.48/],
    [[], /--place is required; e\.g\./],
    [['--place', '43.62,-115.48', '--source', 'satellite'], /--source "satellite": use demo, http or files:DIR/],
    [['--place', '43.62,-115.48', '--hours', 'many'], /--hours "many": give a whole number/],
    [['--place', '43.62,-115.48', '--color'], /Unknown option '--color'.*e\.g\. lapsewatch watch --place/],
  ])('%j', async (args, expected) => {
    const { code, stdout, stderr } = await run(args);
    expect(code).toBe(2);
    expect(stdout).toBe('');
    expect(stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(stderr).toMatch(expected);
  });

  it('a bad rules file stops the command naming the file, the key and the reason', async () => {
    const folder = await mkdtemp(join(tmpdir(), 'lapsewatch-watch-'));
    const path = join(folder, 'rules.yaml');
    await writeFile(path, 'rules:\n  hdw-above:\n    name: x\n    severity: loud\n    threshold: 250\n    hysteresis: 20\n    unit: hPa·m/s\n');
    const { code, stdout, stderr } = await run([...DEMO_ARGS, '--rules', path]);
    expect(code).toBe(1);
    expect(stdout).toBe('');
    expect(stderr).toContain(`${path}: rules.hdw-above.severity:`);
    expect(stderr).toContain(`${path}: rules.mixing-reaches-dry-layer: missing`);
  });
});

describe('lapsewatch watch on a folder of profile files', () => {
  it('reads the files and finds the coupling at the hour they were made for', async () => {
    const folder = await mkdtemp(join(tmpdir(), 'lapsewatch-files-'));
    // Invented profiles (test/watch/support/syntheticSeries.ts) that couple at 14:00 local on day 1.
    const series = syntheticSeries({ couplingLocalHourByDay: [14, null] });
    await Promise.all(series.profiles.map((profile, index) => writeFile(join(folder, `hour-${String(index).padStart(2, '0')}.json`), JSON.stringify(profile))));
    const { code, stdout, stderr } = await run(['--place', '44.12,-114.93', '--source', `files:${folder}`, '--start', '2026-08-14T06:00:00Z', '--json']);
    expect(stderr).toBe('');
    expect(code).toBe(0);
    const report = JSON.parse(stdout);
    const onsets = (report.crossings as JsonCrossing[]).filter((c) => c.ruleId === 'mixing-reaches-dry-layer' && c.direction === 'onset');
    expect(onsets.map((c) => c.localTime)).toEqual(['2026-08-14T14:00:00-06:00']);
  });

  it('an hour whose file fails quality control shows as NO DATA with its reason, never as a quiet hour', async () => {
    const folder = await mkdtemp(join(tmpdir(), 'lapsewatch-faulty-'));
    const series = syntheticSeries({ hours: 24, faultyHourIndices: [14] });
    await Promise.all(series.profiles.map((profile, index) => writeFile(join(folder, `hour-${String(index).padStart(2, '0')}.json`), JSON.stringify(profile))));
    const { code, stdout } = await run(['--place', '44.12,-114.93', '--source', `files:${folder}`, '--start', '2026-08-14T06:00:00Z', '--hours', '24']);
    expect(code).toBe(0);
    expect(stdout).toMatch(/Fri 14:00 MDT\s+NO DATA/);
    expect(stdout).toContain('Hours not assessed (1): not an all-clear');
    expect(stdout).toMatch(/Fri 14:00 MDT: level at .* hPa: dewpointC .* is above temperatureC/);
    // The crossing after the hole says the hour before it is unknown.
    expect(stdout).toMatch(/Mixed layer reaches a dry layer aloft from Fri 14 Aug 15:00 MDT.*1 forecast hour before this could not be assessed/);
  });

  it('a folder with no profile for the window is a clear error on stderr, exit 1', async () => {
    const folder = await mkdtemp(join(tmpdir(), 'lapsewatch-empty-'));
    const { code, stdout, stderr } = await run(['--place', '44.12,-114.93', '--source', `files:${folder}`]);
    expect(code).toBe(1);
    expect(stdout).toBe('');
    expect(stderr).toMatch(/no \.json or \.csv profile files/);
  });
});

describe('as a child process (node bin/lapsewatch.mjs watch)', () => {
  it('the demo: the first-afternoon coupling once among the crossings, footer last, exit 0', async () => {
    const { code, stdout, stderr } = await runInChild(DEMO_ARGS);
    expect(stderr).toBe('');
    expect(code).toBe(0);
    expect(stdout.match(/Mixed layer reaches a dry layer aloft from Fri 14 Aug 15:00 MDT/g)).toHaveLength(1);
    expect(stdout.trimEnd().endsWith(SAFETY_FOOTER)).toBe(true);
  }, 30_000);

  it('--json is one parsable object', async () => {
    const { code, stdout } = await runInChild([...DEMO_ARGS, '--json', '--hours', '24']);
    expect(code).toBe(0);
    expect(JSON.parse(stdout).hours).toHaveLength(24);
  }, 30_000);

  it('a bad place: one line on stderr with a correct example, nothing on stdout, exit 2', async () => {
    const { code, stdout, stderr } = await runInChild(['--place', '43.62;-115.48']);
    expect(code).toBe(2);
    expect(stdout).toBe('');
    expect(stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(stderr).toMatch(/^lapsewatch watch: --place "43\.62;-115\.48": .*e\.g\. --place 43\.62,-115\.48/);
  }, 30_000);
});
