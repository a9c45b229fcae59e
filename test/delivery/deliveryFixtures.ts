// Shared by the delivery, schedule and fault tests: a real store in a temp folder (or the test
// PostgreSQL), invented alert messages, and a logger whose lines the test can read.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Writable } from 'node:stream';
import { openStore } from '../../src/store/index.ts';
import type { ChannelTarget, Store } from '../../src/store/storeTypes.ts';
import { buildMessage } from '../../src/render/safetyFooter.ts';
import type { Message } from '../../src/render/message.ts';
import { messageToPayload } from '../../src/delivery/outboxPayload.ts';
import { createLogger, type Logger } from '../../src/observability/createLogger.ts';

export function makeTempDir(prefix: string): string {
  return fs.mkdtempSync(path.join(os.tmpdir(), `lapsewatch-${prefix}-`));
}

export async function openTempSqliteStore(prefix: string): Promise<{ store: Store; url: string; dir: string }> {
  const dir = makeTempDir(prefix);
  const url = `sqlite:${path.join(dir, 'lapsewatch.db')}`;
  return { store: await openStore({ url }), url, dir };
}

/**
 * The test PostgreSQL URL from LAPSEWATCH_TEST_PG_URL. Under CI its absence is a failure; on a
 * workstation the PostgreSQL cases are skipped with a visible warning.
 */
export function testPostgresUrl(): string | null {
  const url = process.env.LAPSEWATCH_TEST_PG_URL;
  if (url) return url;
  if (process.env.CI) {
    throw new Error('LAPSEWATCH_TEST_PG_URL is not set under CI: start PostgreSQL with `bash .ci/postgres.sh start` and export its URL');
  }
  console.warn('WARNING: LAPSEWATCH_TEST_PG_URL is not set; PostgreSQL cases are SKIPPED (run `bash .ci/postgres.sh start`)');
  return null;
}

/** Empties every table of a PostgreSQL test database so cases do not see each other's rows. */
export async function resetPostgres(url: string): Promise<void> {
  const store = await openStore({ url });
  await store.close();
  const pg = (await import('pg')).default;
  const client = new pg.Client({ connectionString: url });
  await client.connect();
  try {
    await client.query('TRUNCATE outbox, job_claims, alert_history, mutes, rule_overrides, watches, places, channels');
  } finally {
    await client.end();
  }
}

/** An invented alert; `title` makes each one recognisable on the stand-in. */
export function inventedAlert(title: string, extraLines: string[] = []): Message {
  return buildMessage({
    kind: 'alert',
    title,
    severity: 'warning',
    inventedData: true,
    sections: [{ lines: ['Invented test alert at an invented place (Cinder Flats, invented).', ...extraLines] }],
  });
}

export function slackTarget(channelId: string): ChannelTarget {
  return { platform: 'slack', teamId: 'T0INVENTED', channelId };
}

export function discordTarget(channelId: string): ChannelTarget {
  return { platform: 'discord', teamId: '1100000000000000003', channelId };
}

/** Queues one alert row per item, straight into the outbox. */
export async function enqueueAlerts(store: Store, items: Array<{ key: string; target: ChannelTarget; message: Message }>, nowMs: number): Promise<string[]> {
  const { insertedIds } = await store.outbox.enqueue(
    items.map((item) => ({ dedupeKey: item.key, kind: 'alert' as const, target: item.target, payload: messageToPayload(item.message) })),
    nowMs,
  );
  return insertedIds;
}

/** A logger that keeps its JSON lines for the test to read. */
export function capturingLogger(level = 'info'): { logger: Logger; lines: Array<Record<string, unknown>>; raw: string[] } {
  const lines: Array<Record<string, unknown>> = [];
  const raw: string[] = [];
  const destination = new Writable({
    write(chunk, _encoding, done) {
      for (const line of String(chunk).split('\n')) {
        if (line.trim() === '') continue;
        raw.push(line);
        lines.push(JSON.parse(line) as Record<string, unknown>);
      }
      done();
    },
  });
  return { logger: createLogger({ level, destination }), lines, raw };
}
