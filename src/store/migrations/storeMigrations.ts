/**
 * The versioned migrations, in code so they ship inside the bundle with no file lookup.
 * Names sort in the order they must run; never rename or edit one that has shipped: add a new one.
 */
import type { Migration, MigrationProvider } from 'kysely';
import { migration001InitialSchema } from './migration001InitialSchema.ts';

export const storeMigrations: Record<string, Migration> = {
  '001_initial_schema': migration001InitialSchema,
};

export const storeMigrationProvider: MigrationProvider = {
  async getMigrations() {
    return storeMigrations;
  },
};
