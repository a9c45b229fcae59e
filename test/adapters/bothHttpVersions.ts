// One port for HTTP/1.1 (WebSocket upgrades too) and cleartext HTTP/2 with prior knowledge, as
// Discord's API host offers both (the bot's interaction callbacks go over HTTP/2,
// adapters/http/http2Origin.ts; discord.js's REST calls over HTTP/1.1). Each connection goes to
// one server or the other by its first bytes.
import type { Server } from 'node:http';
import type { Http2Server } from 'node:http2';
import { createServer, type Server as TcpServer, type Socket } from 'node:net';
import { Duplex } from 'node:stream';

/** The first bytes of every HTTP/2 connection (RFC 9113, 3.4). */
const HTTP2_PREFACE = Buffer.from('PRI * HTTP/2.0\r\n\r\nSM\r\n\r\n', 'latin1');

/**
 * The HTTP/1.1 server reads a connection's bytes from where its first chunk was put back; an
 * HTTP/2 session reads straight from the socket's handle, past a chunk put back, so it is given a
 * stream that starts with that chunk and then carries the socket's.
 */
function handOver(socket: Socket, first: Buffer, http1: Server, http2: Http2Server): void {
  const length = Math.min(first.length, HTTP2_PREFACE.length);
  if (!first.subarray(0, length).equals(HTTP2_PREFACE.subarray(0, length))) {
    socket.pause();
    socket.unshift(first);
    http1.emit('connection', socket);
    socket.resume();
    return;
  }
  const carried = new Duplex({
    read: () => void socket.resume(),
    write: (chunk, encoding, done) => void socket.write(chunk, encoding, done),
    final: (done) => void socket.end(done),
    destroy: (error, done) => {
      socket.destroy(error ?? undefined);
      done(error);
    },
  });
  carried.push(first);
  socket.on('data', (chunk: Buffer) => {
    if (!carried.push(chunk)) socket.pause();
  });
  socket.on('end', () => carried.push(null));
  socket.on('close', () => carried.destroy());
  socket.on('error', (error) => carried.destroy(error));
  http2.emit('connection', carried);
}

/** A TCP server (not yet listening) that hands each connection to `http1` or `http2`; `onSocket` sees every one. */
export function serveBothHttpVersions(http1: Server, http2: Http2Server, onSocket: (socket: Socket) => void = () => undefined): TcpServer {
  return createServer((socket) => {
    onSocket(socket);
    socket.once('data', (first: Buffer) => handOver(socket, first, http1, http2));
  });
}
