// The deferral's own edges at the wire, against bare local HTTP servers: a Discord that never
// answers is given up, the refusal names Discord's message, and a callback the HTTP/2 connection
// lost is sent again over HTTP/1.1. (Its normal path, 429 and expired tokens run through the real
// discord.js client in discordGateway.test.ts.)
import { createServer, type Server } from 'node:http';
import { constants, createServer as createHttp2Server, type Http2Server } from 'node:http2';
import type { AddressInfo, Server as TcpServer } from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { deferInteraction } from '../../adapters/discord/deferInteraction.ts';
import { Http2Origin } from '../../adapters/http/http2Origin.ts';
import { waitUntil } from '../waitUntil.ts';
import { serveBothHttpVersions } from './bothHttpVersions.ts';

let server: Server | undefined;

async function listen(handler: Parameters<typeof createServer>[1]): Promise<string> {
  server = createServer(handler);
  await new Promise<void>((resolve) => server!.listen(0, '127.0.0.1', resolve));
  return `http://127.0.0.1:${(server!.address() as AddressInfo).port}/api`;
}

afterEach(async () => {
  if (server) {
    server.closeAllConnections();
    await new Promise((resolve) => server!.close(resolve));
  }
  server = undefined;
  for (const cleanup of cleanups.splice(0)) cleanup();
});

const cleanups: Array<() => void> = [];

/** HTTP/1.1 by `http1`, HTTP/2 by `http2`, on one port; returns the API base and a connected Http2Origin. */
async function listenBoth(http1: Server, http2: Http2Server): Promise<{ base: string; origin: Http2Origin }> {
  const front: TcpServer = serveBothHttpVersions(http1, http2, (socket) => cleanups.push(() => socket.destroy()));
  await new Promise<void>((resolve) => front.listen(0, '127.0.0.1', resolve));
  cleanups.push(() => front.close());
  const address = `http://127.0.0.1:${(front.address() as AddressInfo).port}`;
  const origin = new Http2Origin(address);
  cleanups.push(() => origin.close());
  origin.open();
  await waitUntil(() => origin.ready(), 3_000, 'the HTTP/2 connection', 10);
  return { base: `${address}/api`, origin };
}

/** An HTTP/1.1 server answering every callback with `status` and `body`, counting them. */
function http1Answering(status: number, body?: object): { handler: Parameters<typeof createServer>[1]; server: Server; calls: string[] } {
  const calls: string[] = [];
  const handler: Parameters<typeof createServer>[1] = (request, response) => {
    calls.push(request.url ?? '');
    request.resume();
    request.on('end', () => (body ? response.writeHead(status, { 'content-type': 'application/json' }).end(JSON.stringify(body)) : response.writeHead(status).end()));
  };
  return { handler, server: createServer(handler), calls };
}

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

  it('goes over the HTTP/2 connection when it is up', async () => {
    const http1 = http1Answering(204);
    const streams: string[] = [];
    const http2 = createHttp2Server();
    http2.on('stream', (stream, headers) => {
      streams.push(String(headers[':path']));
      stream.resume();
      stream.on('end', () => stream.respond({ ':status': 204 }, { endStream: true }));
    });
    const { base, origin } = await listenBoth(http1.server, http2);
    const outcome = await deferInteraction(base, { id: '1100000000000000204', token: 'itoken-two' }, { http2: origin });
    expect(outcome).toEqual({ ok: true });
    expect(streams).toEqual(['/api/v10/interactions/1100000000000000204/itoken-two/callback']);
    expect(http1.calls).toEqual([]);
  });

  it('sends a callback the HTTP/2 connection lost once more over HTTP/1.1', async () => {
    const http1 = http1Answering(204);
    const http2 = createHttp2Server();
    http2.on('stream', (stream) => {
      // Its own side of the reset is an error event too.
      stream.on('error', () => undefined);
      stream.close(constants.NGHTTP2_INTERNAL_ERROR);
    });
    const { base, origin } = await listenBoth(http1.server, http2);
    expect(origin.ready()).toBe(true);
    const outcome = await deferInteraction(base, { id: '1100000000000000205', token: 'itoken-reset' }, { http2: origin });
    expect(outcome).toEqual({ ok: true });
    expect(http1.calls).toEqual(['/api/v10/interactions/1100000000000000205/itoken-reset/callback']);
  });

  it("counts 'already acknowledged' on the resend as acknowledged: the lost stream had reached Discord", async () => {
    const http1 = http1Answering(400, { message: 'Interaction has already been acknowledged.', code: 40060 });
    const http2 = createHttp2Server();
    // Reads the callback, then drops the connection before answering.
    http2.on('stream', (stream) => {
      stream.resume();
      stream.on('end', () => stream.session?.destroy());
    });
    const { base, origin } = await listenBoth(http1.server, http2);
    const outcome = await deferInteraction(base, { id: '1100000000000000206', token: 'itoken-landed' }, { http2: origin });
    expect(http1.calls).toHaveLength(1);
    expect(outcome).toEqual({ ok: true });
  });

  it('sends over HTTP/1.1 when the API host speaks no HTTP/2', async () => {
    const http1 = http1Answering(204);
    const base = await listen(http1.handler);
    let failedAttempts = 0;
    const origin = new Http2Origin(new URL(base).origin, undefined, () => (failedAttempts += 1));
    cleanups.push(() => origin.close());
    // The attempt at HTTP/2 has been made and refused before the callback.
    origin.open();
    await waitUntil(() => failedAttempts > 0, 3_000, 'the refused attempt at HTTP/2', 10);
    expect(failedAttempts).toBe(1);
    const outcome = await deferInteraction(base, { id: '1100000000000000207', token: 'itoken-one' }, { http2: origin });
    expect(outcome).toEqual({ ok: true });
    expect(http1.calls).toEqual(['/api/v10/interactions/1100000000000000207/itoken-one/callback']);
    expect(origin.ready()).toBe(false);
  });
});
