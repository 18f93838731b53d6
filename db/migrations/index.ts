import type { Migration, MigrationProvider } from 'kysely';
import * as m0001 from './0001_foundation';

// Listed here rather than read from disk, so the same list works under tsx, vitest and Next's bundler.
// A new migration: add a file `NNNN_name.ts` with `up`/`down`, then one line below.
export const migrations: Record<string, Migration> = {
  '0001_foundation': m0001,
};

export const migrationProvider: MigrationProvider = {
  async getMigrations() {
    return migrations;
  },
};
