import { mkdtemp, rm, writeFile, mkdir } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { ProfileInput } from '../../src/core/profile.ts';
import { DemoSource } from '../../src/forecast/demoSource.ts';
import { FileSource } from '../../src/forecast/fileSource.ts';

// Profile files written from the invented demo scenario into a temporary folder.
const LOCATION = { latitude: 43.62, longitude: -115.48, name: 'Kestrel Bench ICP' };
let root: string;
let demoProfiles: ProfileInput[];

function csvOf(profile: ProfileInput): string {
  const lines = [
    `# validTime: ${profile.validTime}`,
    `# latitude: ${profile.latitude}`,
    `# longitude: ${profile.longitude}`,
    'pressureHpa,heightM,temperatureC,dewpointC,windDirDeg,windSpeedMs',
    [profile.surface.pressureHpa, profile.surface.elevationM, profile.surface.temperatureC, profile.surface.dewpointC, profile.surface.windDirDeg, profile.surface.windSpeedMs].join(','),
    ...profile.levels.map((level) => [level.pressureHpa, level.heightM, level.temperatureC, level.dewpointC, level.windDirDeg, level.windSpeedMs].join(',')),
  ];
  return lines.join('\n');
}

async function folderWith(name: string, files: Record<string, string>): Promise<string> {
  const directory = join(root, name);
  await mkdir(directory);
  for (const [fileName, text] of Object.entries(files)) await writeFile(join(directory, fileName), text);
  return directory;
}

beforeAll(async () => {
  root = await mkdtemp(join(tmpdir(), 'lapsewatch-files-'));
  const result = await new DemoSource().fetchSeries(LOCATION, { startTime: '2026-08-14T12:00:00Z', hours: 8 });
  if (!result.ok) throw new Error(result.error.message);
  demoProfiles = result.series.profiles;
});
afterAll(async () => {
  await rm(root, { recursive: true, force: true });
});

function standardFiles(): Record<string, string> {
  const files: Record<string, string> = {};
  demoProfiles.slice(0, 6).forEach((profile, index) => {
    files[`hour-${String(index).padStart(2, '0')}.json`] = JSON.stringify(profile);
  });
  files['hour-06.csv'] = csvOf(demoProfiles[6]);
  files['README.txt'] = 'not a profile';
  return files;
}

describe('FileSource', () => {
  it('reads JSON and CSV files and keeps those in the window, in time order', async () => {
    const directory = await folderWith('good', standardFiles());
    const result = await new FileSource({ directory }).fetchSeries(LOCATION, { startTime: '2026-08-14T14:00:00Z', hours: 5 });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.series.profiles.map((profile) => profile.validTime)).toEqual([
      '2026-08-14T14:00:00Z',
      '2026-08-14T15:00:00Z',
      '2026-08-14T16:00:00Z',
      '2026-08-14T17:00:00Z',
      '2026-08-14T18:00:00Z',
    ]);
    // The last one came from the CSV, values intact.
    expect(result.series.profiles[4].levels[3].heightM).toBe(demoProfiles[6].levels[3].heightM);
    expect(result.series.invented).toBe(false);
    expect(result.series.runTime).toBe('2026-08-14T14:00:00Z');
    expect(result.series.notes ?? []).toEqual([]);
  });

  it('says how many hours are missing when the folder does not cover the window', async () => {
    const directory = await folderWith('partial', standardFiles());
    const result = await new FileSource({ directory }).fetchSeries(LOCATION, { startTime: '2026-08-14T16:00:00Z', hours: 6 });
    expect(result.ok).toBe(true);
    if (result.ok) expect(result.series.notes?.join(' ')).toMatch(/3 of the 6 hours asked have a profile file/);
  });

  it('refuses the series when any file is bad, naming the file', async () => {
    const directory = await folderWith('bad', { ...standardFiles(), 'hour-03.json': '{"validTime": "2026-08-14T15:00:00Z", "surface": {' });
    const result = await new FileSource({ directory }).fetchSeries(LOCATION, { startTime: '2026-08-14T12:00:00Z', hours: 6 });
    expect(result.ok).toBe(false);
    if (result.ok) return;
    expect(result.error.kind).toBe('bad-profile');
    expect(result.error.message).toContain('hour-03.json');
    expect(result.error.message).toContain('43.620, -115.480 (Kestrel Bench ICP)');
  });

  it('refuses two files for one hour', async () => {
    const directory = await folderWith('twice', { ...standardFiles(), 'again.json': JSON.stringify(demoProfiles[2]) });
    const result = await new FileSource({ directory }).fetchSeries(LOCATION, { startTime: '2026-08-14T12:00:00Z', hours: 6 });
    expect(result.ok).toBe(false);
    if (!result.ok) expect(result.error.message).toMatch(/again\.json and hour-02\.json|hour-02\.json and again\.json/);
  });

  it('refuses files for a place far from the one asked', async () => {
    const directory = await folderWith('elsewhere', standardFiles());
    const result = await new FileSource({ directory }).fetchSeries({ latitude: 47, longitude: -120 }, { startTime: '2026-08-14T12:00:00Z', hours: 3 });
    expect(result.ok).toBe(false);
    if (!result.ok) {
      expect(result.error.kind).toBe('no-data');
      expect(result.error.message).toMatch(/km from 47\.000, -120\.000, more than the 50 km allowed/);
    }
  });

  it('reports an empty window, an empty folder and a missing folder as no data', async () => {
    const directory = await folderWith('early', standardFiles());
    const none = await new FileSource({ directory }).fetchSeries(LOCATION, { startTime: '2026-08-20T00:00:00Z', hours: 3 });
    expect(!none.ok && none.error.kind).toBe('no-data');
    if (!none.ok) expect(none.error.message).toMatch(/none of the 7 files/);
    const empty = await folderWith('empty', { 'notes.txt': 'nothing here' });
    const nothing = await new FileSource({ directory: empty }).fetchSeries(LOCATION, { startTime: '2026-08-14T12:00:00Z', hours: 3 });
    expect(!nothing.ok && nothing.error.message).toMatch(/holds no \.json or \.csv profile files/);
    const missing = await new FileSource({ directory: join(root, 'no-such-folder') }).fetchSeries(LOCATION, { startTime: '2026-08-14T12:00:00Z', hours: 3 });
    expect(!missing.ok && missing.error.message).toMatch(/cannot be read \(ENOENT\)/);
  });
});
