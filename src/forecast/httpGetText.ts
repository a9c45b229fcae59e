import { backoffDelayMs, retryAfterMs, type RetryPolicy } from './retryPolicy.ts';

export type HttpFailureKind = 'timeout' | 'network' | 'rate-limited' | 'server' | 'client';

export type HttpTextResult =
  | { ok: true; status: number; bodyText: string; attempts: number }
  | { ok: false; kind: HttpFailureKind; cause: string; attempts: number; status?: number; bodyText?: string };

export interface HttpGetOptions {
  policy: RetryPolicy;
  /** Injected for tests of the jitter; Math.random otherwise. */
  random?: () => number;
  headers?: Record<string, string>;
}

const sleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

/**
 * GET with a timeout per attempt and retries: 5xx, network errors and timeouts are retried with
 * backoff and jitter; 429 waits for Retry-After (or the backoff when the server gives none); other
 * 4xx are final, since asking again would get the same refusal. Never throws.
 */
export async function httpGetText(url: string, options: HttpGetOptions): Promise<HttpTextResult> {
  const { policy } = options;
  let lastFailure: HttpTextResult & { ok: false } = { ok: false, kind: 'network', cause: 'no attempt was made', attempts: 0 };
  for (let attempt = 1; attempt <= policy.maxAttempts; attempt++) {
    const outcome = await attemptOnce(url, policy.timeoutMs, options.headers);
    if (outcome.ok) return { ...outcome, attempts: attempt };
    lastFailure = { ...outcome, attempts: attempt };
    if (outcome.kind === 'client') return lastFailure;
    if (attempt === policy.maxAttempts) break;
    let waitMs = backoffDelayMs(attempt, policy, options.random);
    if (outcome.kind === 'rate-limited' && outcome.retryAfterMs !== null) {
      if (outcome.retryAfterMs > policy.maxRetryAfterMs) {
        return {
          ...lastFailure,
          cause: `${outcome.cause}; the server asks to wait ${Math.ceil(outcome.retryAfterMs / 1000)} s, longer than the ${Math.round(policy.maxRetryAfterMs / 1000)} s this source waits, so try again after that`,
        };
      }
      waitMs = outcome.retryAfterMs;
    }
    await sleep(waitMs);
  }
  return {
    ...lastFailure,
    cause: `${lastFailure.cause} (gave up after ${lastFailure.attempts} attempt${lastFailure.attempts === 1 ? '' : 's'})`,
  };
}

type AttemptOutcome =
  | { ok: true; status: number; bodyText: string }
  | { ok: false; kind: HttpFailureKind; cause: string; status?: number; bodyText?: string; retryAfterMs: number | null };

async function attemptOnce(url: string, timeoutMs: number, headers: Record<string, string> | undefined): Promise<AttemptOutcome> {
  const controller = new AbortController();
  const timer = setTimeout(() => controller.abort(), timeoutMs);
  try {
    const response = await fetch(url, { signal: controller.signal, headers });
    // The body is read under the same timer: a server that sends headers and then stalls is slow too.
    const bodyText = await response.text();
    if (response.ok) return { ok: true, status: response.status, bodyText };
    const statusLine = `the server answered ${response.status}${response.statusText ? ` ${response.statusText}` : ''}${describeErrorBody(bodyText)}`;
    if (response.status === 429) {
      return { ok: false, kind: 'rate-limited', cause: statusLine, status: 429, bodyText, retryAfterMs: retryAfterMs(response.headers.get('retry-after'), Date.now()) };
    }
    if (response.status >= 500) return { ok: false, kind: 'server', cause: statusLine, status: response.status, bodyText, retryAfterMs: null };
    return { ok: false, kind: 'client', cause: statusLine, status: response.status, bodyText, retryAfterMs: null };
  } catch (error) {
    if (controller.signal.aborted) {
      return { ok: false, kind: 'timeout', cause: `no complete answer within ${timeoutMs} ms`, retryAfterMs: null };
    }
    return { ok: false, kind: 'network', cause: `the connection failed (${describeNetworkError(error)})`, retryAfterMs: null };
  } finally {
    clearTimeout(timer);
  }
}

/** Providers put the reason in a small JSON body ({"error":true,"reason":"..."}); show it, briefly. */
function describeErrorBody(bodyText: string): string {
  const trimmed = bodyText.trim();
  if (trimmed.length === 0) return '';
  try {
    const parsed = JSON.parse(trimmed) as { reason?: unknown };
    if (parsed && typeof parsed.reason === 'string') return `: "${parsed.reason.slice(0, 300)}"`;
  } catch {
    // Not JSON: fall through to the raw text.
  }
  return `: "${trimmed.slice(0, 200)}"`;
}

function describeNetworkError(error: unknown): string {
  if (error instanceof Error) {
    const cause = (error as Error & { cause?: { code?: string; message?: string } }).cause;
    if (cause?.code) return `${cause.code}${cause.message ? `: ${cause.message}` : ''}`;
    return error.message;
  }
  return String(error);
}
