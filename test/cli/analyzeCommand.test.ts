import { execFile } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { beforeAll, describe, expect, it } from 'vitest';
import type { AnalysisResult } from '../../src/core/analysisResult.ts';
import type { ProfileInput } from '../../src/core/profile.ts';
import { SAFETY_FOOTER } from '../../src/render/safetyFooter.ts';

const repoRoot = fileURLToPath(new URL('../..', import.meta.url));
const demoPath = join(repoRoot, 'config/demo-profile.json');
const demo = JSON.parse(readFileSync(demoPath, 'utf8')) as ProfileInput;

interface Run {
  code: number;
  stdout: string;
  stderr: string;
}

/** Runs the real command, as a user would, and collects what it printed. */
function lapsewatch(args: string[], stdin?: string): Promise<Run> {
  return new Promise((resolve) => {
    const child = execFile(process.execPath, ['bin/lapsewatch.mjs', ...args], { cwd: repoRoot, maxBuffer: 64 * 1024 * 1024 }, (error, stdout, stderr) => {
      const code = error ? (typeof error.code === 'number' ? error.code : 1) : 0;
      resolve({ code, stdout, stderr });
    });
    child.stdin!.end(stdin ?? '');
  });
}

const workDir = mkdtempSync(join(tmpdir(), 'lapsewatch-cli-'));
function writeProfile(name: string, profile: unknown): string {
  const path = join(workDir, name);
  writeFileSync(path, typeof profile === 'string' ? profile : JSON.stringify(profile));
  return path;
}
const clone = (): ProfileInput => structuredClone(demo);

function asCsv(profile: ProfileInput): string {
  const header = 'pressureHpa,heightM,temperatureC,dewpointC,windDirDeg,windSpeedMs';
  const s = profile.surface;
  const rows = [
    `${s.pressureHpa},${s.elevationM},${s.temperatureC},${s.dewpointC},${s.windDirDeg},${s.windSpeedMs}`,
    ...profile.levels.map((l) => `${l.pressureHpa},${l.heightM},${l.temperatureC},${l.dewpointC},${l.windDirDeg},${l.windSpeedMs}`),
  ];
  return [`# name: ${profile.name}`, `# validTime: ${profile.validTime}`, `# latitude: ${profile.latitude}`, `# longitude: ${profile.longitude}`, header, ...rows].join('\n');
}

/** Generous: each process start compiles TypeScript, and a busy machine runs several at once. Not a timing check. */
const PROCESS_BATCH_TIMEOUT_MS = 300_000;

let jsonRun: Run;
let csvRun: Run;
let afternoonRun: Run;
let noVirtualRun: Run;
let readoutRun: Run;

beforeAll(async () => {
  const csvPath = writeProfile('demo.csv', asCsv(demo));
  [jsonRun, csvRun, afternoonRun, noVirtualRun, readoutRun] = await Promise.all([
    lapsewatch(['analyze', demoPath, '--json']),
    lapsewatch(['analyze', csvPath, '--json']),
    lapsewatch(['analyze', demoPath, '--json', '--surface-temp', '38']),
    lapsewatch(['analyze', '--no-virtual', demoPath, '--json']),
    lapsewatch(['analyze']),
  ]);
}, PROCESS_BATCH_TIMEOUT_MS);

describe('lapsewatch analyze FILE --json', () => {
  it('prints one JSON object with the contract keys', () => {
    expect(jsonRun.code).toBe(0);
    expect(jsonRun.stderr).toBe('');
    const result = JSON.parse(jsonRun.stdout) as AnalysisResult;
    for (const level of result.levels) {
      expect(level).toEqual(expect.objectContaining({ pressureHpa: expect.any(Number), heightAglM: expect.any(Number), thetaK: expect.any(Number) }));
    }
    expect(result.lcl).toEqual(expect.objectContaining({ pressureHpa: expect.any(Number), temperatureC: expect.any(Number), heightAglM: expect.any(Number) }));
    expect(result.layers.length).toBeGreaterThan(0);
    for (const layer of result.layers) {
      for (const key of ['basePressureHpa', 'topPressureHpa', 'baseAglM', 'topAglM', 'lapseRateCPerKm']) expect(layer).toHaveProperty(key, expect.any(Number));
      expect(layer).toHaveProperty('class', expect.any(String));
    }
    expect(result.dryNearAdiabaticLayers.length).toBeGreaterThan(0);
    for (const layer of result.dryNearAdiabaticLayers) {
      for (const key of ['baseAglM', 'topAglM', 'meanLapseRateCPerKm']) expect(layer).toHaveProperty(key, expect.any(Number));
      expect(layer).toHaveProperty('triggerTemperatureC');
    }
    expect(result.mixingHeight.aglM).toEqual(expect.any(Number));
    expect(['low', 'mid', 'high']).toContain(result.haines.variant);
    for (const variant of ['low', 'mid', 'high'] as const) expect(result.haines).toHaveProperty(variant);
    const chosen = result.haines[result.haines.variant]!;
    expect(chosen).toEqual(expect.objectContaining({ a: expect.any(Number), b: expect.any(Number), total: expect.any(Number) }));
    expect(result.cHaines!.total).toEqual(expect.any(Number));
    expect(result.hdw).toEqual(expect.any(Number));
    for (const parcel of [result.parcels.surface, result.parcels.mixedLayer]) {
      for (const key of ['capeJkg', 'cinJkg', 'lclPressureHpa']) expect(parcel).toHaveProperty(key, expect.any(Number));
      expect(parcel).toHaveProperty('lfcPressureHpa');
      expect(parcel).toHaveProperty('elPressureHpa');
    }
    expect(result.dcapeJkg).toEqual(expect.any(Number));
    expect(result.precipitableWaterMm).toEqual(expect.any(Number));
    expect(result.pft).toHaveProperty('gw');
  });

  it('gives the same answer for the same profile as CSV', () => {
    expect(csvRun.code).toBe(0);
    expect(JSON.parse(csvRun.stdout)).toEqual(JSON.parse(jsonRun.stdout));
  });

  it('--surface-temp raises the mixing height of the afternoon (38 °C against the profile\u2019s 33 °C)', () => {
    expect(afternoonRun.code).toBe(0);
    const morning = JSON.parse(jsonRun.stdout) as AnalysisResult;
    const afternoon = JSON.parse(afternoonRun.stdout) as AnalysisResult;
    expect(afternoon.options.surfaceTemperatureC).toBe(38);
    expect(afternoon.mixingHeight.aglM).toBeGreaterThan(morning.mixingHeight.aglM + 1000);
  });

  it('--no-virtual lifts parcels without the virtual temperature correction', () => {
    expect(noVirtualRun.code).toBe(0);
    expect((JSON.parse(noVirtualRun.stdout) as AnalysisResult).options.virtualTemperature).toBe(false);
    expect((JSON.parse(jsonRun.stdout) as AnalysisResult).options.virtualTemperature).toBe(true);
  });
});

describe('lapsewatch analyze (no file): the invented demo readout', () => {
  it('says the data are invented, reads the layers and indices, labels Haines and ends with the safety footer', () => {
    expect(readoutRun.code).toBe(0);
    const text = readoutRun.stdout;
    expect(text).toContain('(invented)');
    expect(text).toMatch(/Invented demo data/);
    expect(text).toMatch(/Mixing height \d+ m AGL/);
    expect(text).toMatch(/reached when the surface warms to \d+\.\d °C/);
    expect(text).toContain('near-dry-adiabatic');
    expect(text).toMatch(/Haines Index, high variant: \d \(dryness-and-lapse-rate index/);
    expect(text).toMatch(/CAPE/);
    expect(text).toMatch(/Hot-Dry-Windy Index/);
    expect(text).toMatch(/Continuous Haines/);
    expect(text).toMatch(/PyroCb Firepower Threshold/);
    expect(text.trimEnd().endsWith(SAFETY_FOOTER)).toBe(true);
  });
});

describe('bad input: non-zero exit, the reason on stderr, nothing on stdout', () => {
  const cases: Array<[string, () => string, RegExp]> = [
    [
      'dew point above temperature',
      () => {
        const p = clone();
        p.levels[8].dewpointC = p.levels[8].temperatureC + 4;
        return writeProfile('dewpoint.json', p);
      },
      /dewpoint\.json.*800 hPa.*dewpointC.*above/,
    ],
    [
      'height not increasing',
      () => {
        const p = clone();
        p.levels[10].heightM = p.levels[9].heightM - 50;
        return writeProfile('height.json', p);
      },
      /height\.json.*heightM.*not above/,
    ],
    [
      'fewer than 3 usable levels',
      () => {
        const p = clone();
        p.levels = p.levels.slice(0, 7); // 1000–850 hPa: only 850 is above the 870 hPa ground
        return writeProfile('few.json', p);
      },
      /few\.json.*at least 3/,
    ],
    [
      'NaN in a CSV cell',
      () => writeProfile('nan.csv', asCsv(clone()).replace(/\n850,([^,]+),([^,]+),/, '\n850,$1,NaN,')),
      /nan\.csv.*temperatureC/,
    ],
    [
      'a null temperature in JSON',
      () => writeProfile('null.json', JSON.stringify(clone()).replace('"temperatureC":33', '"temperatureC":null')),
      /null\.json.*surface\.temperatureC/,
    ],
    [
      'missing surface',
      () => {
        const p: Partial<ProfileInput> = clone();
        delete p.surface;
        return writeProfile('nosurface.json', p);
      },
      /nosurface\.json.*surface/,
    ],
    ['not JSON', () => writeProfile('broken.json', '{"name": "half a file (invented)", "levels": ['), /broken\.json.*not valid JSON/],
    ['no such file', () => join(workDir, 'absent.json'), /absent\.json.*no such file/],
  ];

  let runs: Run[];
  beforeAll(async () => {
    runs = await Promise.all(cases.map(([, makeFile]) => lapsewatch(['analyze', makeFile(), '--json'])));
  }, PROCESS_BATCH_TIMEOUT_MS);

  it.each(cases.map((testCase, index) => [testCase[0], index, testCase[2]] as const))('%s', (_label, index, reason) => {
    const run = runs[index];
    expect(run.code).not.toBe(0);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(reason);
  });

  it('a bad option exits 2 with the reason and nothing on stdout', async () => {
    const run = await lapsewatch(['analyze', demoPath, '--surface-temp', 'warm']);
    expect(run.code).toBe(2);
    expect(run.stdout).toBe('');
    expect(run.stderr).toMatch(/--surface-temp "warm" is not a number/);
  });
});

describe('lapsewatch analyze --ndjson', () => {
  it('writes one result per line, an error object for a bad line in the middle, goes on, and exits 1', async () => {
    const good = JSON.stringify(clone());
    const hot = clone();
    hot.name = 'second good line (invented)';
    const bad = clone();
    bad.levels[8].dewpointC = bad.levels[8].temperatureC + 4;
    const run = await lapsewatch(['analyze', '--ndjson'], [good, JSON.stringify(bad), '', JSON.stringify(hot), 'not json'].join('\n') + '\n');
    expect(run.code).toBe(1);
    const lines = run.stdout.trimEnd().split('\n').map((line) => JSON.parse(line));
    expect(lines).toHaveLength(4);
    expect(lines[0].name).toBe(demo.name);
    expect(lines[1]).toEqual({ line: 2, error: expect.stringMatching(/line 2.*dewpointC/) });
    expect(lines[2].name).toBe('second good line (invented)');
    expect(lines[3]).toEqual({ line: 5, error: expect.stringMatching(/not a JSON object/) });
    expect(run.stderr).toMatch(/line 2/);
  });

  it('exits 0 when every line is analysed, with the options applied to each', async () => {
    const good = JSON.stringify(clone());
    const run = await lapsewatch(['analyze', '--ndjson', '--surface-temp', '36'], `${good}\n${good}\n`);
    expect(run.code).toBe(0);
    const lines = run.stdout.trimEnd().split('\n').map((line) => JSON.parse(line) as AnalysisResult);
    expect(lines).toHaveLength(2);
    expect(lines.every((result) => result.options.surfaceTemperatureC === 36)).toBe(true);
  });
});
