import { Migrator, type Kysely } from 'kysely';
import { createDb, createPool } from './index';
import { migrationProvider } from './migrations';

export function migratorFor(db: Kysely<any>): Migrator {
  return new Migrator({ db, provider: migrationProvider });
}

export async function migrateToLatest(db: Kysely<any>): Promise<string[]> {
  const { error, results } = await migratorFor(db).migrateToLatest();
  if (error) throw error;
  return (results ?? []).filter((r) => r.status === 'Success').map((r) => r.migrationName);
}

async function main() {
  const pool = createPool();
  const db = createDb(pool);
  try {
    const direction = process.argv[2] ?? 'latest';
    const migrator = migratorFor(db);
    const { error, results } =
      direction === 'down' ? await migrator.migrateDown() : await migrator.migrateToLatest();
    for (const r of results ?? []) console.log(`migration ${r.migrationName}: ${r.status} (${r.direction})`);
    if (error) {
      console.error('migration failed:', error);
      process.exitCode = 1;
    } else if (!results?.length) {
      console.log('migrations: already up to date');
    }
  } finally {
    await db.destroy();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  void main();
}
