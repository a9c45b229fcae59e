// The kept HTTP/2 connection at the wire, against real local servers: calls share one connection,
// an origin that speaks only HTTP/1.1 is left alone for a while, a connection that goes away, goes
// quiet or goes deaf is given up and made again, and a call never hangs past its signal.
import { createServer as createHttp1Server, type Server as Http1Server } from 'node:http';
import { createServer as createHttp2Server, type Http2Server, type ServerHttp2Session } from 'node:http2';
import { createServer as createTcpServer, type AddressInfo, type Server as TcpServer, type Socket } from 'node:net';
import { Duplex } from 'node:stream';
import { afterEach, describe, expect, it } from 'vitest';
import { Http2Origin, type Http2OriginTimings } from '../../adapters/http/http2Origin.ts';
import { waitUntil } from '../waitUntil.ts';

const SLOW: Http2OriginTimings = { pingIntervalMs: 60_000, idleCloseMs: 600_000, retryAfterFailureMs: 600_000 };

const cleanups: Array<() => void> = [];
afterEach(() => {
  for (const cleanup of cleanups.splice(0)) cleanup();
});

/** Listens on 127.0.0.1 at a random port; returns "http://127.0.0.1:port". */
async function listen(server: TcpServer | Http1Server | Http2Server): Promise<string> {
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const sockets = new Set<Socket>();
  server.on('connection', (socket: Socket) => {
    sockets.add(socket);
    socket.on('close', () => sockets.delete(socket));
  });
  cleanups.push(() => {
    for (const socket of sockets) socket.destroy();
    server.close();
  });
  return `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
}

/** An HTTP/2 server that echoes each call's method, path and body, and counts its sessions. */
function echoServer(): { server: Http2Server; sessions: ServerHttp2Session[] } {
  const sessions: ServerHttp2Session[] = [];
  const server = createHttp2Server();
  server.on('session', (session) => sessions.push(session));
  server.on('stream', (stream, headers) => {
    let body = '';
    stream.on('data', (chunk) => (body += chunk));
    stream.on('end', () => {
      if (headers[':path'] === '/empty') return void stream.respond({ ':status': 204 });
      stream.respond({ ':status': 200, 'content-type': 'application/json', 'x-seen': 'yes' });
      stream.end(JSON.stringify({ method: headers[':method'], path: headers[':path'], body, agent: headers['user-agent'] }));
    });
  });
  return { server, sessions };
}

function opened(origin: string, timings: Http2OriginTimings = SLOW, onFailedAttempt?: (reason: string) => void): Http2Origin {
  const http2 = new Http2Origin(origin, timings, onFailedAttempt);
  cleanups.push(() => http2.close());
  http2.open();
  return http2;
}

/** The shared wait, checking often: these connections come and go within milliseconds. */
const until = (condition: () => boolean, what: string): Promise<void> => waitUntil(condition, 3_000, what, 10);

const post = (http2: Http2Origin, origin: string, path: string, body = '{"type":5}', signal?: AbortSignal) =>
  http2.fetch(`${origin}${path}`, { method: 'POST', headers: { 'content-type': 'application/json', 'user-agent': 'lapsewatch-test' }, body, ...(signal ? { signal } : {}) });

describe('Http2Origin', () => {
  it('sends simultaneous calls as streams of one connection and reads their answers whole', async () => {
    const { server, sessions } = echoServer();
    const origin = await listen(server);
    const http2 = opened(origin);
    await until(() => http2.ready(), 'the connection');

    const answers = await Promise.all([1, 2, 3, 4, 5].map((n) => post(http2, origin, `/call/${n}?q=${n}`, `{"n":${n}}`)));
    expect(sessions).toHaveLength(1);
    for (const [index, answer] of answers.entries()) {
      expect(answer.status).toBe(200);
      expect(answer.ok).toBe(true);
      expect(answer.headers.get('x-seen')).toBe('yes');
      expect(await answer.json()).toEqual({ method: 'POST', path: `/call/${index + 1}?q=${index + 1}`, body: `{"n":${index + 1}}`, agent: 'lapsewatch-test' });
    }
    const empty = await post(http2, origin, '/empty');
    expect(empty.status).toBe(204);
    expect(await empty.text()).toBe('');
  });

  it('leaves an origin that speaks only HTTP/1.1 alone until its wait has passed', async () => {
    const http1 = createHttp1Server((_, response) => response.end('ok'));
    let connections = 0;
    http1.on('connection', () => (connections += 1));
    const origin = await listen(http1);
    const failures: string[] = [];
    const http2 = opened(origin, { ...SLOW, retryAfterFailureMs: 300 }, (reason) => failures.push(reason));
    await until(() => connections === 1, 'the first attempt');
    await until(() => failures.length === 1, 'word of the failed attempt');
    expect(failures[0]).not.toBe('');
    expect(http2.ready()).toBe(false);
    await expect(post(http2, origin, '/x')).rejects.toThrow(/no HTTP\/2 connection/);

    http2.open();
    await new Promise((resolve) => setTimeout(resolve, 50));
    expect(connections).toBe(1);
    await new Promise((resolve) => setTimeout(resolve, 300));
    http2.open();
    await until(() => connections === 2, 'a second attempt after the wait');
    await until(() => failures.length === 2, 'word of the second attempt');
  });

  it('makes a new connection after the server has sent GOAWAY', async () => {
    const { server, sessions } = echoServer();
    const origin = await listen(server);
    const http2 = opened(origin);
    await until(() => http2.ready(), 'the connection');
    sessions[0]!.close();
    await until(() => !http2.ready(), 'the connection given up');

    http2.open();
    await until(() => http2.ready(), 'a new connection');
    expect(sessions).toHaveLength(2);
    expect((await post(http2, origin, '/after')).status).toBe(200);
  });

  it('closes a connection left quiet past its idle time, and the next open makes a new one', async () => {
    const { server, sessions } = echoServer();
    const origin = await listen(server);
    const http2 = opened(origin, { pingIntervalMs: 40, idleCloseMs: 150, retryAfterFailureMs: 600_000 });
    await until(() => http2.ready(), 'the connection');
    await until(() => !http2.ready(), 'the quiet connection closed');
    // The server hears of it a moment later: its session ends once our GOAWAY and close arrive.
    await until(() => sessions[0]!.closed || sessions[0]!.destroyed, "the server's session ended");
    http2.open();
    await until(() => http2.ready(), 'a new connection');
    expect(sessions).toHaveLength(2);
  });

  it('opens a new connection for a call that comes the moment a quiet one was closed', async () => {
    const { server, sessions } = echoServer();
    const origin = await listen(server);
    const http2 = opened(origin, { pingIntervalMs: 20, idleCloseMs: 60, retryAfterFailureMs: 600_000 });
    const nextTurn = () => new Promise((resolve) => setImmediate(resolve));
    // Checked every turn of the event loop, so the call comes before the closed connection's 'close' event.
    await waitUntil(() => http2.ready(), 3_000, 'the connection', 0);
    while (http2.ready()) await nextTurn();
    http2.open();
    await until(() => http2.ready(), 'a new connection');
    expect(sessions).toHaveLength(2);
  });

  it('gives up a connection whose PING goes unanswered', async () => {
    // Carries bytes from each socket into an HTTP/2 server until told to go deaf.
    const h2 = echoServer();
    let deaf = false;
    const sockets: Socket[] = [];
    const tcp = createTcpServer((socket) => {
      sockets.push(socket);
      const carried = new Duplex({
        read: () => undefined,
        write: (chunk, encoding, done) => void socket.write(chunk, encoding, done),
        destroy: (error, done) => {
          socket.destroy();
          done(error);
        },
      });
      socket.on('data', (chunk) => {
        if (!deaf) carried.push(chunk);
      });
      socket.on('close', () => carried.destroy());
      h2.server.emit('connection', carried);
    });
    const origin = await listen(tcp);
    const http2 = opened(origin, { pingIntervalMs: 60, idleCloseMs: 600_000, retryAfterFailureMs: 600_000 });
    await until(() => http2.ready(), 'the connection');
    // Calls keep it from going idle; PINGs are answered while the server hears.
    await new Promise((resolve) => setTimeout(resolve, 200));
    expect(http2.ready()).toBe(true);
    deaf = true;
    await until(() => !http2.ready(), 'the deaf connection given up');
    await until(() => sockets[0]!.destroyed, 'its socket closed');
  });

  it('rejects with the signal\'s reason when a call gets no answer in time', async () => {
    const server = createHttp2Server();
    server.on('stream', () => undefined);
    const origin = await listen(server);
    const http2 = opened(origin);
    await until(() => http2.ready(), 'the connection');
    const started = Date.now();
    await expect(post(http2, origin, '/silent', '{}', AbortSignal.timeout(150))).rejects.toMatchObject({ name: 'TimeoutError' });
    expect(Date.now() - started).toBeLessThan(2_000);
  });

  it('rejects a call whose connection is destroyed under it, instead of leaving it waiting', async () => {
    const server = createHttp2Server();
    server.on('stream', (stream) => stream.session?.destroy());
    const origin = await listen(server);
    const http2 = opened(origin);
    await until(() => http2.ready(), 'the connection');
    await expect(post(http2, origin, '/lost', '{}', AbortSignal.timeout(5_000))).rejects.toThrow(/ended without an answer/);
  });

  it('gives up an attempt that gets no answer at all, and says why; one stopped while being made is no failure', async () => {
    // Accepts connections and never says a word.
    const silent = createTcpServer(() => undefined);
    const origin = await listen(silent);
    const failures: string[] = [];
    const http2 = opened(origin, { pingIntervalMs: 60, idleCloseMs: 600_000, retryAfterFailureMs: 600_000 }, (reason) => failures.push(reason));
    await until(() => failures.length === 1, 'the connection given up');
    expect(failures[0]).toMatch(/no HTTP\/2 answer within 60 ms/);
    expect(http2.ready()).toBe(false);

    const stopped: string[] = [];
    const stopping = opened(origin, SLOW, (reason) => stopped.push(reason));
    stopping.close();
    await new Promise((resolve) => setTimeout(resolve, 100));
    expect(stopped).toEqual([]);
  });
});
