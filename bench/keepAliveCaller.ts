/**
 * A bare HTTP/1.1 client for the Slack load generator: one keep-alive connection per caller, each
 * request written in one piece, the status line and the body read back (Content-Length or chunked).
 * The generator shares the bot's two cores, and whatever CPU it spends is taken from the receiver it
 * times: through node:http, the first burst's 20 requests on new connections cost the generator's
 * thread about 5 ms before the last of them was on the wire, while the receiver waited for them.
 * One request at a time per caller, as the load's callers ask (no pipelining).
 */
import { connect, type Socket } from 'node:net';

export interface CallerAnswer {
  status: number;
  text: string;
}

interface Waiting {
  resolve: (answer: CallerAnswer) => void;
  reject: (error: Error) => void;
}

const HEAD_END = '\r\n\r\n';

/** The whole answer at the front of `received` (bytes as latin1), or null while more is to come. */
export function parseAnswer(received: string): { answer: CallerAnswer; closeAfter: boolean } | null {
  const headEnd = received.indexOf(HEAD_END);
  if (headEnd < 0) return null;
  const head = received.slice(0, headEnd).split('\r\n');
  const status = Number(/^HTTP\/1\.[01] (\d{3})/.exec(head[0] ?? '')?.[1]);
  if (!Number.isInteger(status)) throw new Error(`not an HTTP answer: ${JSON.stringify(head[0])}`);
  const headers = new Map<string, string>();
  for (const line of head.slice(1)) {
    const colon = line.indexOf(':');
    if (colon > 0) headers.set(line.slice(0, colon).trim().toLowerCase(), line.slice(colon + 1).trim());
  }
  const closeAfter = headers.get('connection')?.toLowerCase() === 'close';
  const bodyStart = headEnd + HEAD_END.length;
  const decode = (latin1: string): string => Buffer.from(latin1, 'latin1').toString('utf8');
  if (headers.get('transfer-encoding')?.toLowerCase() === 'chunked') {
    let at = bodyStart;
    let body = '';
    for (;;) {
      const sizeEnd = received.indexOf('\r\n', at);
      if (sizeEnd < 0) return null;
      const size = parseInt(received.slice(at, sizeEnd), 16);
      if (!Number.isFinite(size)) throw new Error('bad chunk size');
      if (size === 0) return received.indexOf(HEAD_END, sizeEnd) >= 0 ? { answer: { status, text: decode(body) }, closeAfter } : null;
      const chunkEnd = sizeEnd + 2 + size;
      if (received.length < chunkEnd + 2) return null;
      body += received.slice(sizeEnd + 2, chunkEnd);
      at = chunkEnd + 2;
    }
  }
  const length = Number(headers.get('content-length') ?? 0);
  if (received.length < bodyStart + length) return null;
  return { answer: { status, text: decode(received.slice(bodyStart, bodyStart + length)) }, closeAfter };
}

/** One caller: its own connection, opened on its first request and again after the server closes it. */
export class KeepAliveCaller {
  private socket: Socket | null = null;
  private received = '';
  private waiting: Waiting | null = null;

  constructor(
    private readonly host: string,
    private readonly port: number,
  ) {}

  post(path: string, headers: Record<string, string>, body: string): Promise<CallerAnswer> {
    if (this.waiting) return Promise.reject(new Error('one request at a time per caller'));
    const socket = this.socket ?? this.open();
    const head = [`POST ${path} HTTP/1.1`, `Host: ${this.host}:${this.port}`, ...Object.entries(headers).map(([name, value]) => `${name}: ${value}`), `Content-Length: ${Buffer.byteLength(body)}`];
    return new Promise<CallerAnswer>((resolve, reject) => {
      this.waiting = { resolve, reject };
      socket.write(`${head.join('\r\n')}${HEAD_END}${body}`);
    });
  }

  close(): void {
    this.socket?.destroy();
    this.socket = null;
  }

  private open(): Socket {
    const socket = connect({ host: this.host, port: this.port, noDelay: true });
    this.socket = socket;
    this.received = '';
    socket.setEncoding('latin1');
    socket.on('data', (chunk: string) => this.onData(chunk));
    // Only the current connection's end fails a request: one closed here has been let go already.
    const gone = (error?: Error): void => {
      if (this.socket !== socket) return;
      this.socket = null;
      this.fail(error ?? new Error('connection closed before the answer'));
    };
    socket.on('error', gone);
    socket.on('close', () => gone());
    return socket;
  }

  private onData(chunk: string): void {
    this.received += chunk;
    let parsed: ReturnType<typeof parseAnswer>;
    try {
      parsed = parseAnswer(this.received);
    } catch (error) {
      this.fail(error as Error);
      this.close();
      return;
    }
    if (!parsed) return;
    this.received = '';
    if (parsed.closeAfter) this.close();
    const waiting = this.waiting;
    this.waiting = null;
    waiting?.resolve(parsed.answer);
  }

  private fail(error: Error): void {
    const waiting = this.waiting;
    this.waiting = null;
    waiting?.reject(error);
  }
}
