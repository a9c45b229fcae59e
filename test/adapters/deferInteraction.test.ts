// The deferral's own edges at the wire, against bare local HTTP servers: a Discord that never
// answers is given up, and the refusal names Discord's message. (Its normal path, 429 and expired
// tokens run through the real discord.js client in discordGateway.test.ts.)
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { deferInteraction } from '../../adapters/discord/deferInteraction.ts';

let server: Server | undefined;

async function listen(handler: Parameters<typeof createServer>[1]): Promise<string> {
  server = createServer(handler);
  await new Promise<void>((resolve) => server!.listen(0, '127.0.0.1', resolve));
  return `http://127.0.0.1:${(server!.address() as AddressInfo).port}/api`;
}

afterEach(async () => {
  server?.closeAllConnections();
  await new Promise((resolve) => server?.close(resolve));
  server = undefined;
});

describe('deferInteraction', () => {
  it('gives up a callback Discord never answers after its timeout, and says so', async () => {
    const base = await listen(() => {
      // Reads the request and never answers.
    });
    const started = Date.now();
    const outcome = await deferInteraction(base, { id: '1100000000000000201', token: 'itoken-silent' }, { timeoutMs: 300 });
    expect(outcome.ok).toBe(false);
    expect(Date.now() - started).toBeGreaterThanOrEqual(280);
    expect(Date.now() - started).toBeLessThan(3000);
    expect(outcome.ok ? '' : outcome.reason).toMatch(/timeout|aborted/i);
  });

  it('posts type 5 to the interaction callback and reports Discord\'s message when refused', async () => {
    const seen: Array<{ url: string; body: string }> = [];
    const base = await listen((request, response) => {
      let body = '';
      request.on('data', (chunk) => (body += chunk));
      request.on('end', () => {
        seen.push({ url: request.url ?? '', body });
        response.writeHead(400, { 'content-type': 'application/json' }).end(JSON.stringify({ message: 'Interaction has already been acknowledged.', code: 40060 }));
      });
    });
    const outcome = await deferInteraction(base, { id: '1100000000000000202', token: 'itoken-twice' });
    expect(seen).toEqual([{ url: '/api/v10/interactions/1100000000000000202/itoken-twice/callback', body: '{"type":5}' }]);
    expect(outcome).toEqual({ ok: false, reason: 'Discord answered 400: Interaction has already been acknowledged. (code 40060)' });
  });

  it('does not try again after a 429 that says neither in its body nor in Retry-After how long to wait', async () => {
    let requests = 0;
    const base = await listen((request, response) => {
      requests += 1;
      request.resume();
      request.on('end', () => response.writeHead(429).end());
    });
    const outcome = await deferInteraction(base, { id: '1100000000000000203', token: 'itoken-unsaid' });
    expect(requests).toBe(1);
    expect(outcome).toEqual({ ok: false, reason: 'Discord answered 429' });
  });
});
