// Direct database access for assertions the API cannot show (hashes, row counts), and throwaway
// databases for migration and demo tests.
import { randomBytes } from 'node:crypto';
import { sql, type Kysely } from 'kysely';
import { createDb, createPool } from '@/db';
import type { Database } from '@/db/database';

function requireEnv(name: string): string {
  const value = process.env[name];
  if (!value) throw new Error(`${name} is not set: run integration tests through \`npm test\``);
  return value;
}

/** The database the test server uses. Destroy it in afterAll. */
export function testDb(): Kysely<Database> {
  return createDb(createPool(requireEnv('DATABASE_URL')));
}

/** Plots of one property: a count that no other test file can change. */
export async function countPlotsOf(db: Kysely<Database>, propertyId: string): Promise<number> {
  const row = await db
    .selectFrom('plots')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('property_id', '=', propertyId)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

/** Properties a user belongs to. */
export async function countPropertiesOf(db: Kysely<Database>, userId: string): Promise<number> {
  const row = await db
    .selectFrom('memberships')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('user_id', '=', userId)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

export async function countUsersWithEmail(db: Kysely<Database>, email: string): Promise<number> {
  const row = await db
    .selectFrom('users')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('email', '=', email.toLowerCase())
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

export interface FreshDatabase {
  name: string;
  url: string;
  db: Kysely<any>;
  drop(): Promise<void>;
}

/** An empty database in the test cluster, created through TEST_PG_ADMIN_URL; `drop()` removes it. */
export async function freshDatabase(prefix: string): Promise<FreshDatabase> {
  const adminUrl = requireEnv('TEST_PG_ADMIN_URL');
  const name = `${prefix}_${randomBytes(6).toString('hex')}`;
  if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`unsafe database name ${name}`);
  const admin = createDb(createPool(adminUrl));
  try {
    await sql`create database ${sql.id(name)}`.execute(admin);
  } finally {
    await admin.destroy();
  }
  const url = new URL(adminUrl);
  url.pathname = `/${name}`;
  const db = createDb(createPool(url.toString()));
  return {
    name,
    url: url.toString(),
    db,
    async drop() {
      await db.destroy();
      const again = createDb(createPool(adminUrl));
      try {
        await sql`drop database if exists ${sql.id(name)} with (force)`.execute(again);
      } finally {
        await again.destroy();
      }
    },
  };
}
