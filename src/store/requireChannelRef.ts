/** Refuses a write for a channel id the store does not know, with a message instead of a key error. */
import type { Kysely, Transaction } from 'kysely';
import type { StoreDatabase } from './databaseSchema.ts';
import { StoreError } from './storeError.ts';

export async function requireChannelRef(db: Kysely<StoreDatabase> | Transaction<StoreDatabase>, channelRef: string): Promise<void> {
  const row = await db.selectFrom('channels').select('id').where('id', '=', channelRef).executeTakeFirst();
  if (row === undefined) {
    throw new StoreError('invalid-input', `no channel with id ${channelRef}; call channels.ensureChannel first`);
  }
}
