// The chat benchmark's bare HTTP client: its timings are only as good as its reading of the answer,
// so it is held to node:http's server (the same server the Slack receiver runs on).
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterEach, describe, expect, it } from 'vitest';
import { KeepAliveCaller, parseAnswer } from '../../bench/keepAliveCaller.ts';

describe('parseAnswer', () => {
  it('waits for the whole Content-Length body and decodes it as UTF-8', () => {
    const head = 'HTTP/1.1 200 OK\r\nContent-Length: 6\r\n\r\n';
    expect(parseAnswer(`${head}ab`)).toBeNull();
    // "été" is 5 bytes in UTF-8; the answer arrives as latin1 text, one character per byte.
    const body = Buffer.from('été!', 'utf8').toString('latin1');
    expect(parseAnswer(`${head}${body}`)).toEqual({ answer: { status: 200, text: 'été!' }, closeAfter: false });
  });

  it('reads chunked bodies to the last chunk', () => {
    const head = 'HTTP/1.1 404 Not Found\r\nTransfer-Encoding: chunked\r\nConnection: close\r\n\r\n';
    expect(parseAnswer(`${head}3\r\nabc\r\n`)).toBeNull();
    expect(parseAnswer(`${head}3\r\nabc\r\n0\r\n`)).toBeNull();
    expect(parseAnswer(`${head}3\r\nabc\r\n2\r\nde\r\n0\r\n\r\n`)).toEqual({ answer: { status: 404, text: 'abcde' }, closeAfter: true });
  });

  it('refuses what is not an HTTP answer', () => {
    expect(() => parseAnswer('SSH-2.0-x\r\n\r\n')).toThrow(/not an HTTP answer/);
  });
});

describe('KeepAliveCaller against node:http', () => {
  let server: Server | null = null;
  afterEach(() => new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve())));

  async function listen(handler: Parameters<typeof createServer>[1]): Promise<{ port: number; connections: () => number }> {
    let connections = 0;
    server = createServer(handler);
    server.on('connection', () => (connections += 1));
    await new Promise<void>((resolve) => server!.listen(0, '127.0.0.1', resolve));
    return { port: (server.address() as AddressInfo).port, connections: () => connections };
  }

  it('sends the body and headers, and keeps one connection for its requests', async () => {
    const seen: string[] = [];
    const { port, connections } = await listen((request, response) => {
      let body = '';
      request.on('data', (chunk) => (body += chunk));
      request.on('end', () => {
        seen.push(`${request.method} ${request.url} ${request.headers['x-test']} ${body}`);
        // One answer with a length, one written in pieces (chunked).
        if (body === 'one') response.end('first');
        else {
          response.write('sec');
          response.end('ond');
        }
      });
    });
    const caller = new KeepAliveCaller('127.0.0.1', port);
    expect(await caller.post('/a', { 'X-Test': 'yes' }, 'one')).toEqual({ status: 200, text: 'first' });
    expect(await caller.post('/b', { 'X-Test': 'again' }, 'two')).toEqual({ status: 200, text: 'second' });
    expect(seen).toEqual(['POST /a yes one', 'POST /b again two']);
    expect(connections()).toBe(1);
    caller.close();
  });

  it('opens a new connection when the server closed the last one', async () => {
    const { port, connections } = await listen((_request, response) => {
      response.setHeader('Connection', 'close');
      response.end('bye');
    });
    const caller = new KeepAliveCaller('127.0.0.1', port);
    expect((await caller.post('/', {}, 'x')).text).toBe('bye');
    expect((await caller.post('/', {}, 'y')).text).toBe('bye');
    expect(connections()).toBe(2);
  });

  it('rejects when the connection ends before the answer', async () => {
    const { port } = await listen((request) => request.socket.destroy());
    const caller = new KeepAliveCaller('127.0.0.1', port);
    await expect(caller.post('/', {}, 'x')).rejects.toThrow(/closed before the answer/);
    // The caller is usable again: the next request opens a new connection (and is cut the same way).
    await expect(caller.post('/', {}, 'x')).rejects.toThrow(/closed before the answer/);
  });
});
