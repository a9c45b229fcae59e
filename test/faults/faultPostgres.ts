// PostgreSQL for the fault cases, kept away from the other suites' data:
// - a scratch database per case on the shared test server (created, then dropped);
// - for the restart case, a server of its own on another port (.ci/postgres.sh with
//   LAPSEWATCH_PG_PORT/LAPSEWATCH_PG_DIR), so restarting it cannot break tests running beside it.
import { execFile } from 'node:child_process';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import pg from 'pg';

const run = promisify(execFile);
const SCRIPT = fileURLToPath(new URL('../../.ci/postgres.sh', import.meta.url));

function withDatabase(url: string, database: string): string {
  const parsed = new URL(url);
  parsed.pathname = `/${database}`;
  return parsed.toString();
}

export async function createScratchDatabase(baseUrl: string, name: string): Promise<{ url: string; drop: () => Promise<void> }> {
  const database = `${name}_${process.pid}_${Date.now() % 100_000}`.toLowerCase().replace(/[^a-z0-9_]/g, '_');
  const admin = new pg.Client({ connectionString: withDatabase(baseUrl, 'postgres') });
  await admin.connect();
  try {
    await admin.query(`CREATE DATABASE ${database}`);
  } finally {
    await admin.end();
  }
  return {
    url: withDatabase(baseUrl, database),
    drop: async () => {
      const client = new pg.Client({ connectionString: withDatabase(baseUrl, 'postgres') });
      await client.connect();
      try {
        await client.query(`DROP DATABASE IF EXISTS ${database} WITH (FORCE)`);
      } finally {
        await client.end();
      }
    },
  };
}

export interface OwnPostgres {
  url: string;
  restart(): Promise<void>;
  stop(): Promise<void>;
}

/** A PostgreSQL server of the fault suite's own (port LAPSEWATCH_FAULT_PG_PORT, default 54339). */
export async function startOwnPostgres(): Promise<OwnPostgres> {
  const port = process.env.LAPSEWATCH_FAULT_PG_PORT ?? '54339';
  const env = { ...process.env, LAPSEWATCH_PG_PORT: port, LAPSEWATCH_PG_DIR: path.join(os.tmpdir(), `lapsewatch-fault-pg-${port}`) };
  const script = async (action: string): Promise<string> => (await run('bash', [SCRIPT, action], { env, timeout: 120_000 })).stdout;
  const url = (await script('start')).trim().split('\n').at(-1)!;
  return {
    url,
    restart: async () => {
      await script('restart');
    },
    stop: async () => {
      await script('stop');
    },
  };
}
