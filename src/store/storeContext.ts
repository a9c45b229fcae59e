/** What every repository gets: the query layer and which backend sits under it. */
import type { Kysely } from 'kysely';
import type { StoreDatabase } from './databaseSchema.ts';
import type { StoreBackend } from './storeTypes.ts';

export interface StoreContext {
  db: Kysely<StoreDatabase>;
  backend: StoreBackend;
}
