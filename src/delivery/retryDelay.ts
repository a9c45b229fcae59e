/**
 * When to try a failed post again.
 *
 * Retryable faults (5xx, timeouts, network) back off exponentially with "full jitter": a random
 * delay between 0 and min(cap, base × 2^(attempt−1)), so that many rows failing together during an
 * outage do not all come back at the same instant. A floor keeps a retry from spinning.
 * Rate limits (429) wait exactly what the platform asked, plus a little jitter for the same reason.
 */
export interface BackoffPolicy {
  baseMs: number;
  capMs: number;
  floorMs: number;
}

export const DEFAULT_BACKOFF: BackoffPolicy = { baseMs: 2_000, capMs: 5 * 60_000, floorMs: 250 };

/** Delay before the next attempt after `attempts` failed attempts (1 = the first failed). */
export function backoffDelayMs(attempts: number, random: () => number = Math.random, policy: BackoffPolicy = DEFAULT_BACKOFF): number {
  const exponent = Math.max(0, Math.min(30, attempts - 1));
  const ceilingMs = Math.min(policy.capMs, policy.baseMs * 2 ** exponent);
  return Math.max(policy.floorMs, Math.floor(random() * ceilingMs));
}

/** Delay after a 429: the platform's Retry-After plus up to 10 % (at most 1 s) of jitter. */
export function rateLimitDelayMs(retryAfterMs: number, random: () => number = Math.random): number {
  const waitMs = Math.max(0, retryAfterMs);
  return waitMs + Math.floor(random() * Math.min(1_000, waitMs * 0.1));
}
