import { createHash } from 'node:crypto';

/** Discord accepts a nonce of at most 25 characters. */
export const DISCORD_NONCE_MAX_CHARS = 25;

/**
 * The outbox's idempotency key, hashed into a Discord nonce: stable for the same key, 100 bits of
 * hex so two different alerts in one channel never collide within Discord's few-minute window.
 */
export function nonceFromKey(idempotencyKey: string): string {
  return createHash('sha256').update(idempotencyKey).digest('hex').slice(0, DISCORD_NONCE_MAX_CHARS);
}
