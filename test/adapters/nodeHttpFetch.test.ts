import { createServer, type IncomingMessage, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { nodeHttpFetch } from '../../adapters/http/nodeHttpFetch.ts';

// Our transport beside Node's own fetch (the WHATWG Fetch implementation, the reference here): the
// same requests to one local server must arrive the same, and their answers read the same.
interface Arrived {
  method: string;
  path: string;
  headers: IncomingMessage['headers'];
  raw: Buffer;
}

let server: Server;
let base: string;
const arrived: Arrived[] = [];

beforeAll(async () => {
  server = createServer((request, response) => {
    const chunks: Buffer[] = [];
    request.on('data', (chunk: Buffer) => chunks.push(chunk));
    request.on('end', () => {
      arrived.push({ method: request.method!, path: request.url!, headers: request.headers, raw: Buffer.concat(chunks) });
      if (request.url === '/empty') return void response.writeHead(204).end();
      if (request.url === '/slow') return void setTimeout(() => response.end('late'), 2_000).unref();
      if (request.url === '/limited') return void response.writeHead(429, { 'retry-after': '3', 'x-note': 'one' }).end('{"ok":false}');
      response.writeHead(200, { 'content-type': 'application/json', 'set-cookie': ['a=1', 'b=2'] });
      response.end(JSON.stringify({ ok: true, path: request.url }));
    });
  });
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});
afterAll(() => new Promise<void>((resolve) => server.close(() => resolve())));

/** Sends through both transports; returns what the server received from each. */
async function both(path: string, init: () => RequestInit): Promise<{ ours: Arrived; theirs: Arrived; oursResponse: Response; theirResponse: Response }> {
  const oursResponse = await nodeHttpFetch(`${base}${path}`, init());
  const ours = arrived.at(-1)!;
  const theirResponse = await fetch(`${base}${path}`, init());
  const theirs = arrived.at(-1)!;
  return { ours, theirs, oursResponse, theirResponse };
}

/** Multipart fields as the Fetch standard's parser reads them (name, and text or file name, type and bytes). */
async function fieldsOf(call: Arrived): Promise<unknown[]> {
  const form = await new Response(call.raw, { headers: { 'content-type': call.headers['content-type']! } }).formData();
  const fields: unknown[] = [];
  for (const [name, value] of form.entries()) {
    fields.push(typeof value === 'string' ? [name, value] : [name, value.name, value.type, Buffer.from(await value.arrayBuffer()).toString('hex')]);
  }
  return fields;
}

describe('node:http transport for the platform clients', () => {
  it('sends a multipart form (text fields and files) that parses to the same fields as fetch sends', async () => {
    const png = new Uint8Array([137, 80, 78, 71, 13, 10, 26, 10, 0, 255, 13, 10]);
    const form = () => {
      const data = new FormData();
      data.append('payload_json', JSON.stringify({ content: 'Mixing reaches the dry layer at 14:00 (invented)' }));
      data.append('files[0]', new Blob([png], { type: 'image/png' }), 'mixing "chart".png');
      data.append('files[1]', new Blob([png]), 'raw.bin');
      return data;
    };
    const { ours, theirs } = await both('/upload', () => ({ method: 'PATCH', body: form() }));
    expect(ours.method).toBe('PATCH');
    expect(ours.headers['content-type']).toMatch(/^multipart\/form-data; boundary=/);
    expect(Number(ours.headers['content-length'])).toBe(ours.raw.length);
    expect(await fieldsOf(ours)).toEqual(await fieldsOf(theirs));
    expect((await fieldsOf(ours))[1]).toEqual(['files[0]', 'mixing "chart".png', 'image/png', Buffer.from(png).toString('hex')]);
  });

  it('sends string, URLSearchParams and byte bodies with the headers fetch would send', async () => {
    for (const body of ['token=x&channel=C1', new URLSearchParams({ channel: 'C1', text: 'a b' }), new Uint8Array([1, 2, 3])]) {
      const headers = { Authorization: 'Bearer xoxb-invented', 'X-Twice': 'a' };
      const { ours, theirs } = await both('/api/method', () => ({ method: 'POST', headers, body }));
      expect(ours.raw.equals(theirs.raw)).toBe(true);
      for (const name of ['content-type', 'content-length', 'authorization', 'x-twice']) expect([name, ours.headers[name]]).toEqual([name, theirs.headers[name]]);
    }
    const { ours } = await both('/api/method', () => ({ method: 'POST', headers: new Headers([['content-type', 'application/json']]), body: '{"a":1}' }));
    expect(ours.headers['content-type']).toBe('application/json');
  });

  it('hands back status, headers and body as fetch does, a 204 with no body, a 429 unfollowed', async () => {
    const ok = await both('/answer', () => ({ method: 'GET' }));
    expect(ok.oursResponse.status).toBe(200);
    expect(await ok.oursResponse.json()).toEqual(await ok.theirResponse.json());
    expect(ok.oursResponse.headers.getSetCookie()).toEqual(['a=1', 'b=2']);
    expect([ok.oursResponse.ok, ok.oursResponse.url, ok.oursResponse.bodyUsed]).toEqual([true, `${base}/answer`, true]);
    // A body is read once, as with fetch.
    await expect(ok.theirResponse.text()).rejects.toThrow(TypeError);
    await expect(ok.oursResponse.text()).rejects.toThrow(TypeError);
    const empty = await both('/empty', () => ({ method: 'DELETE' }));
    expect([empty.oursResponse.status, empty.oursResponse.body]).toEqual([204, null]);
    const limited = await both('/limited', () => ({ method: 'POST', body: 'x' }));
    expect([limited.oursResponse.status, limited.oursResponse.headers.get('retry-after'), await limited.oursResponse.text()]).toEqual([429, '3', '{"ok":false}']);
  });

  it('sends an array of byte pieces as the bytes of them one after another, as fetch sends the same bytes in one piece', async () => {
    const pieces = [Buffer.from('--b\r\n'), new Uint8Array([0, 13, 10, 255]).subarray(1, 3), new Uint8Array(0), Buffer.from('\r\n--b--\r\n')];
    const whole = Buffer.concat(pieces);
    const ours = await nodeHttpFetch(`${base}/pieces`, { method: 'POST', headers: { 'content-type': 'multipart/form-data; boundary=b' }, body: pieces });
    expect(ours.status).toBe(200);
    const oursArrived = arrived.at(-1)!;
    await fetch(`${base}/pieces`, { method: 'POST', headers: { 'content-type': 'multipart/form-data; boundary=b' }, body: whole });
    const theirs = arrived.at(-1)!;
    expect(oursArrived.raw.toString('hex')).toBe(whole.toString('hex'));
    expect(oursArrived.raw.equals(theirs.raw)).toBe(true);
    expect(oursArrived.headers['content-length']).toBe(String(whole.length));
    await expect(nodeHttpFetch(`${base}/answer`, { method: 'POST', body: [Buffer.from('a'), 'b'] as never })).rejects.toThrow(/does not send a \[object Array\] body/);
  });

  it('rejects with the signal\'s reason when aborted or timed out, as fetch does, and refuses what it cannot send', async () => {
    const timedOut = await nodeHttpFetch(`${base}/slow`, { signal: AbortSignal.timeout(50) }).catch((error: unknown) => error);
    const fetchTimedOut = await fetch(`${base}/slow`, { signal: AbortSignal.timeout(50) }).catch((error: unknown) => error);
    expect((timedOut as Error).name).toBe('TimeoutError');
    expect((timedOut as Error).name).toBe((fetchTimedOut as Error).name);
    const controller = new AbortController();
    controller.abort();
    await expect(nodeHttpFetch(`${base}/answer`, { signal: controller.signal })).rejects.toMatchObject({ name: 'AbortError' });
    await expect(nodeHttpFetch('ftp://127.0.0.1/x')).rejects.toThrow(/cannot fetch ftp: URLs/);
    await expect(nodeHttpFetch(`${base}/answer`, { method: 'POST', body: new ReadableStream() as never })).rejects.toThrow(/does not send a \[object ReadableStream\] body/);
    await expect(nodeHttpFetch('http://127.0.0.1:1/closed')).rejects.toMatchObject({ code: 'ECONNREFUSED' });
  });
});
