import { spawn } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';

// `npm start` as a new user meets it: no tokens, no network, the invented demo in the terminal, with
// commands piped in. Every run gets its own data folder (SQLite store, saved images).
const BIN = join(import.meta.dirname, '../../bin/lapsewatch.mjs');
const folders: string[] = [];

function runStart(input: string, environment: Record<string, string> = {}): Promise<{ code: number | null; stdout: string; stderr: string }> {
  const dataDir = mkdtempSync(join(tmpdir(), 'lapsewatch-start-'));
  folders.push(dataDir);
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [BIN, 'start'], {
      cwd: dataDir,
      env: { ...process.env, LAPSEWATCH_DATA_DIR: dataDir, LAPSEWATCH_LOG_LEVEL: 'error', SLACK_BOT_TOKEN: '', DISCORD_TOKEN: '', ...environment },
      stdio: ['pipe', 'pipe', 'pipe'],
    });
    let stdout = '';
    let stderr = '';
    child.stdout.on('data', (chunk) => (stdout += chunk));
    child.stderr.on('data', (chunk) => (stderr += chunk));
    const timer = setTimeout(() => child.kill('SIGKILL'), 90_000);
    child.on('error', reject);
    child.on('close', (code) => {
      clearTimeout(timer);
      resolve({ code, stdout, stderr });
    });
    child.stdin.end(input);
  });
}

afterAll(() => {
  for (const folder of folders) rmSync(folder, { recursive: true, force: true });
});

// Child processes start slowly on a loaded two-core machine; the fast-clock case also waits 15 s.
describe('npm start with no credentials: the terminal on the invented demo', { timeout: 85_000 }, () => {
  it('answers a lookup of the first demo place at once, then one command a line, and exits at the end of input', async () => {
    const { code, stdout } = await runStart('help\nsave Camp One 43.60,-115.50\nplaces\nmorning 31:00\n');
    expect(code).toBe(0);
    const answers = stdout.split(SAFETY_FOOTER);
    // The opening lookup, help, save, places, the refused morning time: each ends with the footer.
    expect(answers.length - 1).toBeGreaterThanOrEqual(5);
    expect(answers[0]).toMatch(/Kestrel Bench ICP: next 48 h/);
    expect(answers[0]).toMatch(/Invented demo data/);
    expect(stdout).toMatch(/Commands/);
    expect(stdout).toMatch(/Camp One: 43\.60°N 115\.50°W/);
    expect(stdout).toMatch(/"morning": "31:00" is not a time of day/);
  });

  it('on a fast scenario clock, a watched demo place gets its alerts (the coupling among them) and then the 06:30 morning summary', async () => {
    // 05:00 MDT on an invented August morning, ten scenario minutes per real second.
    const { code, stdout } = await runStart('watch Kestrel Bench ICP\npause 15\n', {
      LAPSEWATCH_CLOCK_START: '2026-08-14T11:00:00Z',
      LAPSEWATCH_CLOCK_SPEED: '600',
    });
    expect(code).toBe(0);
    // The first check's alerts come in one message; the coupling this afternoon is among them.
    const alertAt = stdout.search(/Kestrel Bench ICP: \d+ alerts stand in the forecast/);
    const couplingLine = 'Fri 14 Aug 15:00 MDT · Mixed layer reaches a dry layer aloft';
    const summaryAt = stdout.indexOf('Morning summary: Kestrel Bench ICP, Fri 14 Aug');
    expect(alertAt).toBeGreaterThan(0);
    expect(stdout.indexOf(couplingLine)).toBeGreaterThan(alertAt);
    expect(summaryAt).toBeGreaterThan(alertAt);
    // Each alert and summary is posted once.
    expect(stdout.split(couplingLine).length - 1).toBe(1);
    expect(stdout.split('stand in the forecast').length - 1).toBe(1);
    expect(stdout.split('Morning summary: Kestrel Bench ICP, Fri 14 Aug').length - 1).toBe(1);
  });

  it('stops with the file, the key and the reason when the store URL is bad, and prints nothing else', async () => {
    const { code, stdout, stderr } = await runStart('help\n', { LAPSEWATCH_STORE_URL: 'mysql://nowhere' });
    expect(code).toBe(1);
    expect(stdout).toBe('');
    expect(stderr).toMatch(/key "store\.url": must be sqlite:PATH or postgres:\/\//);
  });
});
