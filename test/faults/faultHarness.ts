// Shared by the fault cases: spawning sender processes, killing them with SIGKILL, seeding the
// outbox with invented alerts, and counting what the platform stand-ins showed.
import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import type { Store } from '../../src/store/storeTypes.ts';
import type { SlackStandIn } from '../adapters/slackStandIn.ts';
import type { DiscordStandIn } from '../adapters/discordStandIn.ts';
import { discordTarget, enqueueAlerts, inventedAlert, slackTarget } from '../delivery/deliveryFixtures.ts';

const SENDER_SCRIPT = fileURLToPath(new URL('./senderProcess.ts', import.meta.url));
const REPO_ROOT = fileURLToPath(new URL('../../', import.meta.url));

export interface SenderChild {
  child: ChildProcess;
  ready: Promise<void>;
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null; stderr: string; stdout: string }>;
}

export function spawnSender(env: Record<string, string>): SenderChild {
  const child = spawn(process.execPath, ['--import', 'tsx', SENDER_SCRIPT], {
    cwd: REPO_ROOT,
    env: { ...process.env, MAX_RUN_MS: '120000', ...env },
    stdio: ['pipe', 'pipe', 'pipe'],
  });
  let stdout = '';
  let stderr = '';
  let markReady: () => void = () => {};
  const ready = new Promise<void>((resolve) => {
    markReady = resolve;
  });
  child.stdout!.on('data', (chunk: Buffer) => {
    stdout += chunk.toString();
    if (stdout.includes('ready ')) markReady();
  });
  child.stderr!.on('data', (chunk: Buffer) => {
    stderr += chunk.toString();
  });
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null; stderr: string; stdout: string }>((resolve) => {
    child.on('exit', (code, signal) => {
      markReady();
      resolve({ code, signal, stderr, stdout });
    });
  });
  return { child, ready, exited };
}

/** Lets a WAIT_FOR_GO child start sending. */
export function sayGo(sender: SenderChild): void {
  sender.child.stdin!.write('go\n');
}

export async function killHard(sender: SenderChild): Promise<void> {
  if (sender.child.exitCode === null && sender.child.signalCode === null) sender.child.kill('SIGKILL');
  await sender.exited;
}

/** A small seeded generator so a failing run can be repeated (seed printed by each case). */
export function seededRandom(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const TITLE = /Fault alert #(\d{5})/;

/** Seeds `count` invented alerts, half for Slack channels and half for Discord channels (a fan-out). */
export async function seedFanOut(store: Store, count: number, nowMs: number): Promise<string[]> {
  const items = Array.from({ length: count }, (_, i) => {
    const number = String(i).padStart(5, '0');
    const onSlack = i % 2 === 0;
    const channel = Math.floor(i / 2) % 25;
    return {
      key: `alert|fault-${number}|r0|${onSlack ? 'slack' : 'discord'}:${channel}`,
      target: onSlack ? slackTarget(`C0FAULT${String(channel).padStart(2, '0')}`) : discordTarget(`14000000000000000${String(channel).padStart(2, '0')}`),
      message: inventedAlert(`Fault alert #${number} (invented)`),
    };
  });
  return enqueueAlerts(store, items, nowMs);
}

function discordPayload(body: any): any {
  return body && typeof body.payload_json === 'string' ? JSON.parse(body.payload_json) : body;
}

export interface DeliveryCounts {
  /** Alerts that reached a channel (shown at least once). */
  shown: number;
  /** Alerts shown more than once (extra copies counted in `extraCopies`). */
  duplicated: number;
  extraCopies: number;
  /** Posts repeated with the same idempotency key and absorbed by the platform (Discord nonce). */
  absorbedRepeats: number;
  postsAttempted: number;
}

/** What the Slack stand-in showed: every accepted chat.postMessage is a message in the channel. */
export function countSlack(slack: SlackStandIn): DeliveryCounts {
  const shownCount = new Map<string, number>();
  let attempted = 0;
  for (const call of slack.apiCalls('chat.postMessage')) {
    attempted += 1;
    if (call.status !== 200) continue;
    const match = TITLE.exec(JSON.stringify(call.body));
    if (match) shownCount.set(match[1]!, (shownCount.get(match[1]!) ?? 0) + 1);
  }
  const extra = [...shownCount.values()].reduce((sum, n) => sum + n - 1, 0);
  return { shown: shownCount.size, duplicated: [...shownCount.values()].filter((n) => n > 1).length, extraCopies: extra, absorbedRepeats: 0, postsAttempted: attempted };
}

/**
 * What the Discord stand-in showed. With enforce_nonce the stand-in (like Discord) answers a repeat
 * nonce in a channel with the message it already made, so messages shown = distinct (channel,
 * nonce); a title under two nonces would be a real duplicate.
 */
export function countDiscord(discord: DiscordStandIn): DeliveryCounts {
  const nonceCount = new Map<string, number>();
  const titleNonces = new Map<string, Set<string>>();
  let attempted = 0;
  for (const call of discord.callsTo(/\/channels\/\d+\/messages$/)) {
    attempted += 1;
    if (call.status !== 200) continue;
    const payload = discordPayload(call.body);
    const key = `${call.path}|${payload.enforce_nonce ? payload.nonce : Math.random()}`;
    nonceCount.set(key, (nonceCount.get(key) ?? 0) + 1);
    const match = TITLE.exec(JSON.stringify(payload));
    if (match) {
      const set = titleNonces.get(match[1]!) ?? new Set<string>();
      set.add(key);
      titleNonces.set(match[1]!, set);
    }
  }
  const duplicated = [...titleNonces.values()].filter((s) => s.size > 1);
  return {
    shown: titleNonces.size,
    duplicated: duplicated.length,
    extraCopies: duplicated.reduce((sum, s) => sum + s.size - 1, 0),
    absorbedRepeats: [...nonceCount.values()].reduce((sum, n) => sum + n - 1, 0),
    postsAttempted: attempted,
  };
}

/** Every seeded row is sent; returns how many are not. */
export async function unsentRows(store: Store, ids: string[]): Promise<number> {
  let unsent = 0;
  for (const id of ids) {
    const row = await store.outbox.getItem(id);
    if (!row || row.sentAtMs === null) unsent += 1;
  }
  return unsent;
}
