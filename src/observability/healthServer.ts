/**
 * `/healthz` and `/metrics` on a local HTTP port (127.0.0.1 unless told otherwise).
 *
 * /healthz runs the registered checks (each bounded by `checkTimeoutMs`) and answers 200 with
 * `{"status":"ok"}` when all pass, 503 with the failing checks' reasons otherwise. /metrics is the
 * Prometheus text exposition of the registry. Anything else is 404.
 */
import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Registry } from 'prom-client';

/** Resolves with null when healthy, or a short reason (no secrets, no message bodies). */
export type HealthCheck = () => Promise<string | null>;

export interface HealthServerOptions {
  registry: Registry;
  checks?: Record<string, HealthCheck>;
  /** 0 picks a free port (tests). */
  port: number;
  host?: string;
  checkTimeoutMs?: number;
}

export interface RunningHealthServer {
  readonly port: number;
  readonly origin: string;
  close(): Promise<void>;
}

async function runCheck(check: HealthCheck, timeoutMs: number): Promise<string | null> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<string>((resolve) => {
    timer = setTimeout(() => resolve(`no answer within ${timeoutMs} ms`), timeoutMs);
  });
  try {
    return await Promise.race([check().catch((error: unknown) => (error instanceof Error ? error.message : String(error))), timeout]);
  } finally {
    clearTimeout(timer);
  }
}

export async function answerHealthz(checks: Record<string, HealthCheck>, timeoutMs: number): Promise<{ status: number; body: string }> {
  const names = Object.keys(checks);
  const results = await Promise.all(names.map((name) => runCheck(checks[name]!, timeoutMs)));
  const failing: Record<string, string> = {};
  results.forEach((reason, i) => {
    if (reason !== null) failing[names[i]!] = reason;
  });
  const healthy = Object.keys(failing).length === 0;
  return {
    status: healthy ? 200 : 503,
    body: JSON.stringify(healthy ? { status: 'ok', checks: names } : { status: 'unhealthy', failing }),
  };
}

export async function startHealthServer(options: HealthServerOptions): Promise<RunningHealthServer> {
  const checks = options.checks ?? {};
  const timeoutMs = options.checkTimeoutMs ?? 2_000;
  const serve = async (request: IncomingMessage, response: ServerResponse): Promise<void> => {
    const path = (request.url ?? '/').split('?')[0];
    const isHead = request.method === 'HEAD';
    if (request.method !== 'GET' && !isHead) {
      response.writeHead(405, { allow: 'GET, HEAD' }).end();
      return;
    }
    if (path === '/healthz') {
      const { status, body } = await answerHealthz(checks, timeoutMs);
      response.writeHead(status, { 'content-type': 'application/json' }).end(isHead ? undefined : body);
      return;
    }
    if (path === '/metrics') {
      const text = await options.registry.metrics();
      response.writeHead(200, { 'content-type': options.registry.contentType }).end(isHead ? undefined : text);
      return;
    }
    response.writeHead(404, { 'content-type': 'text/plain' }).end(isHead ? undefined : 'not found\n');
  };
  const server: Server = createServer((request, response) => {
    serve(request, response).catch((error: unknown) => {
      if (!response.headersSent) response.writeHead(500, { 'content-type': 'text/plain' });
      response.end(`health server error: ${error instanceof Error ? error.message : String(error)}\n`);
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen({ port: options.port, host: options.host ?? '127.0.0.1' }, () => {
      server.off('error', reject);
      resolve();
    });
  });
  const port = (server.address() as AddressInfo).port;
  return {
    port,
    origin: `http://${options.host ?? '127.0.0.1'}:${port}`,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}
