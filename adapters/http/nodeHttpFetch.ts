/**
 * A `fetch` for the platform clients (@slack/web-api's `fetch` option, @discordjs/rest's
 * `makeRequest`), sending through node:http(s). Both libraries keep their own retries, rate-limit
 * handling and parsing; only the transport changes. Measured on one answer's calls, Node's built-in
 * fetch took 1.5-2.8 ms of the answering thread's CPU per call (a multipart upload the most), and
 * node:http a quarter of that; a Slack answer with a picture makes three such calls.
 *
 * What it covers is what those clients send: string, byte, URLSearchParams and FormData bodies
 * (FormData encoded as multipart/form-data, RFC 7578), and an array of byte pieces sent one after
 * the other (fetch's BodyInit allows an iterable of Uint8Array; our multipart bodies go so, their
 * pictures uncopied); headers as an object, pairs or Headers, and an AbortSignal. The whole
 * response is read before it resolves (API answers are small). A redirect is handed back as it
 * is, never followed.
 */
import { request as httpRequest, type IncomingMessage } from 'node:http';
import { request as httpsRequest } from 'node:https';
import { bufferView } from './bufferView.ts';
import { multipartBody, type MultipartField } from './multipartBody.ts';

type FetchInput = string | URL;
/** A body as the pieces it is sent in (a multipart form is not copied into one buffer first). */
type Body = { pieces: Buffer[]; contentType: string | null };

// Statuses whose response must not have a body (Fetch standard, "null body status").
const NULL_BODY_STATUSES = new Set([101, 103, 204, 205, 304]);

interface FileLike {
  arrayBuffer(): Promise<ArrayBuffer>;
  readonly type?: string;
  readonly name?: string;
}

/** A Blob or File from any implementation (Node's, or the undici copy a library bundles). */
function isFileLike(value: unknown): value is FileLike {
  return typeof value === 'object' && value !== null && typeof (value as FileLike).arrayBuffer === 'function';
}

async function multipart(form: FormData): Promise<Body> {
  const fields: MultipartField[] = [];
  for (const [name, value] of form.entries() as Iterable<[string, unknown]>) {
    if (isFileLike(value)) {
      const fileName = typeof value.name === 'string' && value.name !== '' ? value.name : 'blob';
      fields.push({ name, fileName, contentType: value.type || 'application/octet-stream', bytes: new Uint8Array(await value.arrayBuffer()) });
    } else {
      fields.push({ name, text: String(value) });
    }
  }
  return multipartBody(fields);
}

async function encodeBody(body: unknown): Promise<Body | null> {
  if (body === undefined || body === null) return null;
  if (typeof body === 'string') return { pieces: [Buffer.from(body, 'utf8')], contentType: 'text/plain;charset=UTF-8' };
  if (body instanceof URLSearchParams) return { pieces: [Buffer.from(body.toString(), 'utf8')], contentType: 'application/x-www-form-urlencoded;charset=UTF-8' };
  if (ArrayBuffer.isView(body)) return { pieces: [bufferView(body)], contentType: null };
  if (body instanceof ArrayBuffer) return { pieces: [Buffer.from(body)], contentType: null };
  if (Array.isArray(body) && body.every((piece) => ArrayBuffer.isView(piece))) return { pieces: body.map(bufferView), contentType: null };
  if (typeof (body as FormData).entries === 'function' && typeof (body as FormData).append === 'function') return multipart(body as FormData);
  if (isFileLike(body)) return { pieces: [Buffer.from(await body.arrayBuffer())], contentType: body.type || null };
  throw new TypeError(`this transport does not send a ${Object.prototype.toString.call(body)} body`);
}

/** Request headers as lower-case names; later values of a repeated name are joined as fetch joins them. */
function headerRecord(headers: RequestInit['headers']): Record<string, string> {
  const record: Record<string, string> = {};
  if (!headers) return record;
  const pairs: Iterable<[string, string | readonly string[]]> =
    headers instanceof Headers || Array.isArray(headers) ? (headers as Iterable<[string, string]>) : Object.entries(headers);
  for (const [name, value] of pairs) {
    if (value === undefined) continue;
    const key = name.toLowerCase();
    const text = typeof value === 'string' ? value : value.join(', ');
    record[key] = key in record ? `${record[key]}, ${text}` : text;
  }
  return record;
}

/**
 * The answer as the clients read it: status, statusText, ok, url, headers (a real Headers) and the
 * body once as text, JSON or bytes. Not undici's Response, which cost ten times as much to make per
 * call; @discordjs/rest takes any such response-like, and the Slack client reads no more than this.
 */
class NodeHttpResponse {
  readonly ok: boolean;
  readonly redirected = false;
  readonly type = 'basic';
  bodyUsed = false;

  constructor(
    readonly status: number,
    readonly statusText: string,
    readonly headers: Headers,
    readonly url: string,
    private readonly bytes: Buffer | null,
  ) {
    this.ok = status >= 200 && status < 300;
  }

  /** Null for statuses that carry no body, as fetch has it; the body is not offered as a stream. */
  get body(): null {
    return null;
  }

  private take(): Buffer {
    if (this.bodyUsed) throw new TypeError('Body is unusable: Body has already been read');
    this.bodyUsed = true;
    return this.bytes ?? Buffer.alloc(0);
  }

  async text(): Promise<string> {
    return this.take().toString('utf8');
  }

  async json(): Promise<unknown> {
    return JSON.parse(await this.text());
  }

  async arrayBuffer(): Promise<ArrayBuffer> {
    const bytes = this.take();
    return bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
  }

  clone(): NodeHttpResponse {
    if (this.bodyUsed) throw new TypeError('Response.clone: Body has already been consumed.');
    return new NodeHttpResponse(this.status, this.statusText, new Headers(this.headers), this.url, this.bytes);
  }
}

/** A whole answer read off the wire, as the response-like the clients read (also for HTTP/2, http2Origin.ts). */
export function bufferedResponse(url: string, status: number, statusText: string, headers: Headers, bytes: Buffer): Response {
  return new NodeHttpResponse(status, statusText, headers, url, NULL_BODY_STATUSES.has(status) ? null : bytes) as unknown as Response;
}

function responseOf(url: URL, incoming: IncomingMessage, bytes: Buffer): Response {
  const headers = new Headers();
  for (let index = 0; index + 1 < incoming.rawHeaders.length; index += 2) headers.append(incoming.rawHeaders[index]!, incoming.rawHeaders[index + 1]!);
  return bufferedResponse(url.href, incoming.statusCode ?? 0, incoming.statusMessage ?? '', headers, bytes);
}

export async function nodeHttpFetch(input: FetchInput, init: RequestInit = {}): Promise<Response> {
  const url = typeof input === 'string' ? new URL(input) : input;
  if (url.protocol !== 'http:' && url.protocol !== 'https:') throw new TypeError(`cannot fetch ${url.protocol} URLs`);
  const signal = init.signal ?? undefined;
  signal?.throwIfAborted();
  const body = await encodeBody(init.body);
  const headers = headerRecord(init.headers);
  if (body) {
    if (body.contentType && !('content-type' in headers)) headers['content-type'] = body.contentType;
    headers['content-length'] = String(body.pieces.reduce((total, piece) => total + piece.length, 0));
  }
  const send = url.protocol === 'http:' ? httpRequest : httpsRequest;
  return new Promise<Response>((resolve, reject) => {
    const outgoing = send(url, { method: init.method ?? 'GET', headers }, (incoming) => {
      const chunks: Buffer[] = [];
      incoming.on('data', (chunk: Buffer) => chunks.push(chunk));
      incoming.on('end', () => {
        signal?.removeEventListener('abort', onAbort);
        try {
          resolve(responseOf(url, incoming, Buffer.concat(chunks)));
        } catch (error) {
          reject(error);
        }
      });
      incoming.on('error', reject);
    });
    // As fetch does: an abort rejects with the signal's reason (AbortError, or TimeoutError for AbortSignal.timeout).
    const onAbort = () => {
      outgoing.destroy();
      reject(signal!.reason);
    };
    signal?.addEventListener('abort', onAbort, { once: true });
    outgoing.on('error', (error) => {
      signal?.removeEventListener('abort', onAbort);
      reject(error);
    });
    // Corked, the pieces leave in one write; end() uncorks.
    outgoing.cork();
    for (const piece of body?.pieces ?? []) outgoing.write(piece);
    outgoing.end();
  });
}
