/**
 * One HTTP/2 connection to one origin, opened before it is needed and kept while it is used, for
 * calls that must leave at once (Discord's interaction callbacks, discord/deferInteraction.ts).
 * Over HTTP/1.1 each of a burst of simultaneous calls opens a connection of its own, and over the
 * internet a TLS handshake of its own; over HTTP/2 they all go as streams of the one connection.
 *
 * It never stands in a call's way: `ready()` is false while the connection is being made, after
 * it has ended, and for a while after the origin turned HTTP/2 down (a proxy that speaks only
 * HTTP/1.1); the caller then sends that call the usual way.
 */
import { connect, constants, type ClientHttp2Session, type IncomingHttpHeaders } from 'node:http2';
import { bufferedResponse } from './nodeHttpFetch.ts';

export interface Http2OriginTimings {
  /** A PING this often while the connection is open; one still unanswered at the next means it is dead. */
  pingIntervalMs: number;
  /** With no call for this long the connection is closed; the next call opens it again. */
  idleCloseMs: number;
  /** After an attempt that never came up (refused, not HTTP/2), none before this has passed. */
  retryAfterFailureMs: number;
}

/**
 * A PING every 30 s finds a connection a middlebox dropped before a call is lost on it, and is
 * rare enough for servers that limit pings. Ten quiet minutes close it: a bot nobody asks keeps
 * no connection open for nothing.
 */
export const HTTP2_ORIGIN_TIMINGS: Http2OriginTimings = { pingIntervalMs: 30_000, idleCloseMs: 600_000, retryAfterFailureMs: 600_000 };

/** What a call sends: the parts of fetch's RequestInit this transport takes. */
export interface Http2Call {
  method: string;
  /** Lower-case names, without HTTP/1.1's connection headers. */
  headers: Record<string, string>;
  body?: string | Buffer;
  signal?: AbortSignal;
}

export class Http2Origin {
  private session: ClientHttp2Session | null = null;
  private connected = false;
  private pingUnanswered = false;
  private notBeforeMs = 0;
  private lastCallMs = 0;
  private timer: NodeJS.Timeout | null = null;
  private closed = false;
  private openedAtMs = 0;
  /** Why the connection being made failed, for `onFailedAttempt`. */
  private lastError: string | null = null;

  constructor(
    /** "https://host[:port]" or "http://host[:port]" (cleartext HTTP/2 with prior knowledge). */
    readonly origin: string,
    private readonly timings: Http2OriginTimings = HTTP2_ORIGIN_TIMINGS,
    /** Told when an attempt never came up, with the reason, so a log can say why calls go over HTTP/1.1. */
    private readonly onFailedAttempt: (reason: string) => void = () => undefined,
  ) {}

  /** True when a call can go over the connection now. */
  ready(): boolean {
    return this.connected && this.session !== null && !this.session.closed && !this.session.destroyed;
  }

  /** Opens the connection unless it is open, being made, closed for good or in its wait after a failure; counts as use. */
  open(): void {
    this.lastCallMs = Date.now();
    // One closing (idle, deaf, GOAWAY) is let go now, not at its 'close' event: until then it
    // would keep a call from opening the next.
    if (this.session && (this.session.closed || this.session.destroyed)) this.forget(this.session);
    if (this.closed || this.session || Date.now() < this.notBeforeMs) return;
    const session = connect(this.origin);
    this.session = session;
    this.connected = false;
    this.openedAtMs = Date.now();
    // Never what keeps the process alive; the receiver's own lifetime decides.
    session.unref();
    // Up once the server's SETTINGS have come: the TCP connection alone may be to a server that
    // answers HTTP/2's preface with an HTTP/1.1 error (cleartext has no protocol negotiation).
    session.once('remoteSettings', () => {
      if (this.session === session) this.connected = true;
    });
    // 'close' follows; calls meanwhile go the usual way.
    session.on('error', (error) => {
      if (this.session === session) this.lastError = error.message;
    });
    session.once('goaway', () => this.forget(session));
    session.once('close', () => this.forget(session));
    this.timer ??= setInterval(() => this.keepOrClose(), this.timings.pingIntervalMs).unref();
  }

  /** One call over the connection; only when `ready()`. Rejects with the signal's reason on abort, as fetch does. */
  fetch(url: string, call: Http2Call): Promise<Response> {
    const session = this.session;
    if (!session || !this.ready()) return Promise.reject(new Error(`no HTTP/2 connection to ${this.origin}`));
    this.lastCallMs = Date.now();
    const { pathname, search } = new URL(url);
    const { signal } = call;
    signal?.throwIfAborted();
    return new Promise<Response>((resolve, reject) => {
      const headers: Record<string, string> = { ':method': call.method, ':path': `${pathname}${search}`, ...call.headers };
      if (call.body !== undefined) headers['content-length'] = String(Buffer.byteLength(call.body));
      const stream = session.request(headers, { endStream: call.body === undefined });
      let settled = false;
      const settle = (): boolean => {
        signal?.removeEventListener('abort', onAbort);
        const first = !settled;
        settled = true;
        return first;
      };
      const onAbort = () => {
        if (settle()) reject(signal!.reason);
        stream.close(constants.NGHTTP2_CANCEL);
      };
      signal?.addEventListener('abort', onAbort, { once: true });
      let answer: IncomingHttpHeaders = {};
      const chunks: Buffer[] = [];
      stream.on('response', (received) => (answer = received));
      stream.on('data', (chunk: Buffer) => chunks.push(chunk));
      stream.on('end', () => {
        // With no answer's head, the stream ended because its connection did.
        const status = answer[':status'];
        if (status === undefined) return void (settle() && reject(new Error(`HTTP/2 stream to ${this.origin} ended without an answer`)));
        if (!settle()) return;
        const responseHeaders = new Headers();
        for (const [name, value] of Object.entries(answer)) {
          if (name.startsWith(':') || value === undefined) continue;
          for (const one of Array.isArray(value) ? value : [value]) responseHeaders.append(name, String(one));
        }
        resolve(bufferedResponse(url, Number(status), '', responseHeaders, Buffer.concat(chunks)));
      });
      stream.on('error', (error) => {
        if (settle()) reject(error);
      });
      // A connection destroyed under it closes the stream with no error event.
      stream.on('close', () => {
        if (settle()) reject(new Error(`HTTP/2 stream to ${this.origin} ended without an answer (stream code ${stream.rstCode ?? 'none'})`));
      });
      if (call.body !== undefined) stream.end(call.body);
    });
  }

  /** Closes the connection for good (the receiver is stopping); calls under way finish first. */
  close(): void {
    this.closed = true;
    if (this.timer) clearInterval(this.timer);
    this.timer = null;
    this.session?.close();
  }

  private forget(session: ClientHttp2Session): void {
    if (this.session !== session) return;
    // A connection that never came up is not tried again for a while: the calls go the usual way.
    // (One closed while being made because the receiver is stopping is no failure.)
    if (!this.connected && !this.closed) {
      this.notBeforeMs = Date.now() + this.timings.retryAfterFailureMs;
      this.onFailedAttempt(this.lastError ?? 'closed before the server said HTTP/2');
    }
    this.lastError = null;
    this.session = null;
    this.connected = false;
    this.pingUnanswered = false;
    if (!session.destroyed) session.close();
  }

  private keepOrClose(): void {
    const session = this.session;
    if (!session) return;
    if (!this.connected) {
      // An attempt with no answer at all (packets dropped) ends here rather than at the system's TCP timeout.
      if (Date.now() - this.openedAtMs >= this.timings.pingIntervalMs) session.destroy(new Error(`no HTTP/2 answer within ${this.timings.pingIntervalMs} ms`));
      return;
    }
    // Quiet for long, or deaf since the last PING: the next call opens a new one.
    if (this.pingUnanswered) return void session.destroy();
    if (Date.now() - this.lastCallMs >= this.timings.idleCloseMs) return void session.close();
    this.pingUnanswered = true;
    session.ping((error) => {
      if (!error && this.session === session) this.pingUnanswered = false;
    });
  }
}
