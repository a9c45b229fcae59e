import { describe, expect, it } from 'vitest';
import { backoffDelayMs, retryAfterMs, type RetryPolicy } from '../../src/forecast/retryPolicy.ts';

const POLICY: RetryPolicy = { timeoutMs: 1000, maxAttempts: 5, backoffBaseMs: 100, backoffMaxMs: 1000, maxRetryAfterMs: 60_000 };

describe('backoffDelayMs', () => {
  it('doubles per failure, keeps half fixed and half random, and stops at the cap', () => {
    expect(backoffDelayMs(1, POLICY, () => 0)).toBe(50);
    expect(backoffDelayMs(1, POLICY, () => 1)).toBe(100);
    expect(backoffDelayMs(2, POLICY, () => 0)).toBe(100);
    expect(backoffDelayMs(3, POLICY, () => 0.5)).toBe(300);
    expect(backoffDelayMs(10, POLICY, () => 1)).toBe(1000);
    expect(backoffDelayMs(10, POLICY, () => 0)).toBe(500);
  });
});

describe('retryAfterMs (RFC 9110 §10.2.3: delay-seconds or an HTTP date)', () => {
  const now = Date.UTC(2026, 7, 14, 12, 0, 0);
  it('reads seconds and dates', () => {
    expect(retryAfterMs('3', now)).toBe(3000);
    expect(retryAfterMs(' 0 ', now)).toBe(0);
    expect(retryAfterMs('Fri, 14 Aug 2026 12:00:30 GMT', now)).toBe(30_000);
    expect(retryAfterMs('Fri, 14 Aug 2026 11:00:00 GMT', now)).toBe(0);
  });
  it('gives null when absent or unreadable', () => {
    expect(retryAfterMs(null, now)).toBeNull();
    expect(retryAfterMs('soon', now)).toBeNull();
  });
});
