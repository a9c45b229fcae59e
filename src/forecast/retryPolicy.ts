/** How hard an HTTP source tries before it gives up. All durations in milliseconds. */
export interface RetryPolicy {
  /** Per attempt, covering connection, headers and body. */
  timeoutMs: number;
  /** Total attempts including the first. */
  maxAttempts: number;
  backoffBaseMs: number;
  backoffMaxMs: number;
  /** A Retry-After longer than this is not waited for: the caller is told when to try again. */
  maxRetryAfterMs: number;
}

/**
 * Exponential backoff with "equal jitter": half the step is fixed, half random, so that many
 * clients retrying after one outage do not arrive together, yet none retries immediately.
 * `attempt` counts failed attempts so far (1 after the first failure).
 */
export function backoffDelayMs(attempt: number, policy: RetryPolicy, random: () => number = Math.random): number {
  const stepMs = Math.min(policy.backoffMaxMs, policy.backoffBaseMs * 2 ** Math.max(0, attempt - 1));
  return stepMs / 2 + (random() * stepMs) / 2;
}

/**
 * Retry-After as milliseconds from now: either delta-seconds or an HTTP date (RFC 9110 §10.2.3).
 * Null when absent or unreadable.
 */
export function retryAfterMs(headerValue: string | null, nowMs: number): number | null {
  if (headerValue === null) return null;
  const trimmed = headerValue.trim();
  if (/^\d+$/.test(trimmed)) return Number(trimmed) * 1000;
  const dateMs = Date.parse(trimmed);
  if (Number.isNaN(dateMs)) return null;
  return Math.max(0, dateMs - nowMs);
}
