// Fault: a corrupt, damaged or missing SQLite file. The sender process must stop at start-up with
// a clear message (exit code 2), never run on a silently empty store.
import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { openStore } from '../../src/store/index.ts';
import { makeTempDir } from '../delivery/deliveryFixtures.ts';
import { spawnSender } from './faultHarness.ts';

describe('fault: corrupt or missing SQLite file at start-up', () => {
  let dir: string;
  const outcomes: string[] = [];
  beforeAll(() => {
    dir = makeTempDir('corrupt');
  });
  afterAll(() => {
    console.log(`[fault corrupt-sqlite] cases=${outcomes.length} clearErrors=${outcomes.filter((o) => o === 'clear').length}`);
  });

  async function startUp(file: string, extra: Record<string, string> = {}) {
    const sender = spawnSender({ LAPSEWATCH_STORE_URL: `sqlite:${file}`, SLACK_API_URL: 'http://127.0.0.1:9/api/', DISCORD_API_URL: 'http://127.0.0.1:9/api', ...extra });
    return sender.exited;
  }

  it('a file that is not a database', async () => {
    const file = path.join(dir, 'garbage.db');
    fs.writeFileSync(file, 'this is not a database, it is an invented test file\n'.repeat(100));
    const result = await startUp(file);
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(/not a SQLite database/);
    expect(result.stderr).toContain(file);
    outcomes.push('clear');
  }, 60_000);

  it('a real store with its pages damaged', async () => {
    const file = path.join(dir, 'damaged.db');
    const store = await openStore({ url: `sqlite:${file}` });
    await store.channels.ensureChannel({ platform: 'slack', teamId: 'T0INVENTED', channelId: 'C0DAMAGED' }, { unitSystem: 'metric', summaryLocalTime: '06:30' }, Date.now());
    await store.close();
    for (const side of ['-wal', '-shm']) fs.rmSync(file + side, { force: true });
    const bytes = fs.readFileSync(file);
    // Keep the header (so it still looks like SQLite) and scribble over every later page.
    for (let i = 4096; i < bytes.length; i += 1) bytes[i] = (i * 31) & 0xff;
    fs.writeFileSync(file, bytes);
    const result = await startUp(file);
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(/damaged|integrity|malformed|corrupt/i);
    outcomes.push('clear');
  }, 60_000);

  it('a missing file when the store must exist', async () => {
    const file = path.join(dir, 'gone', 'lapsewatch.db');
    const result = await startUp(file, { EXPECT_EXISTING: '1' });
    expect(result.code).toBe(2);
    expect(result.stderr).toMatch(/does not exist/);
    expect(fs.existsSync(file)).toBe(false); // no empty store was made in its place
    outcomes.push('clear');
  }, 60_000);
});
