// The common part of the platform stand-ins: an HTTP server on 127.0.0.1 at a random port that
// records every request, can be told to fail for a while, and stops cleanly (open sockets too).
// HTTP/1.1 and HTTP/2 on the one port (bothHttpVersions.ts).
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import { createServer as createHttp2Server, type Http2Server } from 'node:http2';
import type { AddressInfo, Server as TcpServer, Socket } from 'node:net';
import { serveBothHttpVersions } from './bothHttpVersions.ts';

export interface RecordedCall {
  at: number;
  method: string;
  /** Path without the query string. */
  path: string;
  query: URLSearchParams;
  headers: IncomingMessage['headers'];
  /** "1.1", or "2.0" for a call over HTTP/2. */
  httpVersion: string;
  raw: Buffer;
  /** JSON, form fields (as an object), multipart fields, or undefined for other bodies. */
  body: any;
  /** Status the stand-in answered with. */
  status: number;
}

export interface Fault {
  /** Only requests whose path matches; every request when absent. */
  path?: RegExp;
  status: number;
  /** Seconds, sent as the Retry-After header (and as the platform's body field, where it has one). */
  retryAfterSec?: number;
  /** Body to send; a JSON object is serialised. */
  body?: unknown;
  /** How many requests to fail; unlimited when absent. */
  times?: number;
  /** Fail until this epoch-ms time; forever when absent (bounded by `times`). */
  untilMs?: number;
}

export interface Reply {
  status: number;
  headers?: Record<string, string>;
  body?: unknown;
}

export type Handler = (call: RecordedCall) => Reply | Promise<Reply>;

async function parseBody(request: IncomingMessage, raw: Buffer, parseMultipart: boolean): Promise<any> {
  const type = request.headers['content-type'] ?? '';
  if (raw.length === 0) return undefined;
  if (type.includes('application/json')) return JSON.parse(raw.toString('utf8'));
  if (type.includes('application/x-www-form-urlencoded')) {
    return Object.fromEntries(new URLSearchParams(raw.toString('utf8')));
  }
  if (type.includes('multipart/form-data') && parseMultipart) {
    const form = await new Response(raw, { headers: { 'content-type': type } }).formData();
    const fields: Record<string, unknown> = {};
    for (const [name, value] of form.entries()) {
      fields[name] = typeof value === 'string' ? value : { fileName: value.name, size: value.size, type: value.type };
    }
    return fields;
  }
  return undefined;
}

export class RecordingServer {
  readonly calls: RecordedCall[] = [];
  readonly server: Server;
  /** Takes the connections that open with HTTP/2's preface; the rest go to `server`. */
  private readonly http2Server: Http2Server;
  /** What listens: it hands each connection to `server` or `http2Server` by its first bytes. */
  private readonly front: TcpServer;
  private readonly faults: Fault[] = [];
  private readonly sockets = new Set<Socket>();
  private readonly listeners = new Set<() => void>();
  private readonly callListeners = new Set<(call: RecordedCall) => void>();
  private readonly arrivalListeners = new Set<(method: string, url: string) => void>();
  private port = 0;
  private parseMultipart = true;
  private keepCalls = true;

  constructor(private readonly handle: Handler) {
    const onRequest = (request: IncomingMessage, response: ServerResponse): void => {
      for (const listener of this.arrivalListeners) listener(request.method ?? 'GET', request.url ?? '/');
      void this.serve(request, response);
    };
    this.server = createServer(onRequest);
    // HTTP/2's compatibility request and response have the members serve() reads and writes.
    this.http2Server = createHttp2Server(onRequest as unknown as Parameters<typeof createHttp2Server>[0]);
    this.front = serveBothHttpVersions(this.server, this.http2Server, (socket) => {
      this.sockets.add(socket);
      socket.on('close', () => this.sockets.delete(socket));
    });
  }

  async start(): Promise<this> {
    await new Promise<void>((resolve) => this.front.listen({ port: 0, host: '127.0.0.1' }, resolve));
    this.port = (this.front.address() as AddressInfo).port;
    return this;
  }

  get origin(): string {
    return `http://127.0.0.1:${this.port}`;
  }

  get wsOrigin(): string {
    return `ws://127.0.0.1:${this.port}`;
  }

  /** Answer matching requests with an error status for a while (see Fault). */
  addFault(fault: Fault): void {
    this.faults.push({ ...fault });
  }

  clearFaults(): void {
    this.faults.length = 0;
  }

  /**
   * Leaves multipart bodies (images) unparsed: a benchmark's stand-in then spends its time on
   * timing, not on decoding PNG uploads it never reads.
   */
  skipMultipartBodies(): void {
    this.parseMultipart = false;
  }

  /**
   * Keeps no record of calls (listeners are still told of each): a benchmark's stand-in would
   * otherwise hold every request body, images included, and spend its time collecting them.
   */
  keepNoCalls(): void {
    this.keepCalls = false;
  }

  /** Told of every call as it is recorded (benchmarks time answers this way); returns an unsubscribe. */
  onCall(listener: (call: RecordedCall) => void): () => void {
    this.callListeners.add(listener);
    return () => this.callListeners.delete(listener);
  }

  /**
   * Told of every request as soon as its head has arrived, before its body is read and answered:
   * benchmarks time acknowledgements this way, so that what the stand-in does with a request is
   * not counted against the bot. Returns an unsubscribe.
   */
  onArrival(listener: (method: string, url: string) => void): () => void {
    this.arrivalListeners.add(listener);
    return () => this.arrivalListeners.delete(listener);
  }

  callsTo(path: RegExp): RecordedCall[] {
    return this.calls.filter((call) => path.test(call.path));
  }

  /** Resolves with the first recorded call (past or future) that matches. */
  async waitForCall(match: (call: RecordedCall) => boolean, timeoutMs = 5_000): Promise<RecordedCall> {
    const deadline = Date.now() + timeoutMs;
    for (;;) {
      const found = this.calls.find(match);
      if (found) return found;
      const left = deadline - Date.now();
      if (left <= 0) throw new Error(`no matching call within ${timeoutMs} ms; saw ${this.calls.map((c) => `${c.method} ${c.path}`).join(', ')}`);
      await new Promise<void>((resolve) => {
        const timer = setTimeout(done, left);
        const listeners = this.listeners;
        function done(): void {
          clearTimeout(timer);
          listeners.delete(done);
          resolve();
        }
        listeners.add(done);
      });
    }
  }

  async stop(): Promise<void> {
    await new Promise<void>((resolve) => {
      this.front.close(() => resolve());
      this.server.close();
      this.http2Server.close();
      for (const socket of this.sockets) socket.destroy();
    });
  }

  private takeFault(path: string): Fault | undefined {
    const now = Date.now();
    for (let i = 0; i < this.faults.length; i += 1) {
      const fault = this.faults[i]!;
      if (fault.untilMs !== undefined && now >= fault.untilMs) {
        this.faults.splice(i, 1);
        i -= 1;
        continue;
      }
      if (fault.path && !fault.path.test(path)) continue;
      if (fault.times !== undefined) {
        fault.times -= 1;
        if (fault.times <= 0) this.faults.splice(i, 1);
      }
      return fault;
    }
    return undefined;
  }

  private async serve(request: IncomingMessage, response: ServerResponse): Promise<void> {
    const chunks: Buffer[] = [];
    for await (const chunk of request) chunks.push(chunk as Buffer);
    const raw = Buffer.concat(chunks);
    const url = new URL(request.url ?? '/', this.origin);
    const call: RecordedCall = {
      at: Date.now(),
      method: request.method ?? 'GET',
      path: decodeURIComponent(url.pathname),
      query: url.searchParams,
      headers: request.headers,
      httpVersion: request.httpVersion,
      raw,
      body: undefined,
      status: 0,
    };
    let reply: Reply;
    try {
      call.body = await parseBody(request, raw, this.parseMultipart);
      const fault = this.takeFault(call.path);
      reply = fault
        ? {
            status: fault.status,
            headers: fault.retryAfterSec !== undefined ? { 'retry-after': String(fault.retryAfterSec) } : {},
            body: fault.body ?? { message: `stand-in fault ${fault.status}` },
          }
        : await this.handle(call);
    } catch (error) {
      reply = { status: 400, body: { message: `stand-in could not read the request: ${String(error)}` } };
    }
    call.status = reply.status;
    if (this.keepCalls) this.calls.push(call);
    for (const listener of this.callListeners) listener(call);
    for (const wake of [...this.listeners]) wake();
    const isText = typeof reply.body === 'string' || reply.body === undefined;
    response.writeHead(reply.status, {
      ...(isText ? { 'content-type': 'text/plain' } : { 'content-type': 'application/json' }),
      ...reply.headers,
    });
    response.end(reply.body === undefined ? '' : isText ? String(reply.body) : JSON.stringify(reply.body));
  }
}
