import { randomUUID } from 'node:crypto';

/** Row ids are random UUIDs: the same type on both backends, and safe to make on any replica. */
export function newId(): string {
  return randomUUID();
}
