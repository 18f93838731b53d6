import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { NO_MIGRATIONS, sql, type Kysely } from 'kysely';
import { migrateToLatest, migratorFor } from '@/db/migrate';
import { migrations } from '@/db/migrations';
import { freshDatabase, type FreshDatabase } from '../support/db';

const TABLES = ['users', 'sign_in_attempts', 'properties', 'memberships', 'invitations', 'plots', 'plantings', 'steps', 'step_moves', 'forecasts', 'forecast_status', 'notification_settings', 'push_subscriptions', 'notifications', 'blends', 'uploads', 'observations', 'application_records', 'soil_tests', 'expenses', 'calendar_feeds'];
const ENUM_TYPES = ['property_role', 'land_tenure', 'plot_cover', 'plot_sun', 'planting_method', 'planting_status', 'step_kind', 'step_status', 'notification_channel'];

// Catalog queries follow the PostgreSQL manual: information_schema.tables (ch. 37) and pg_type /
// pg_enum (ch. 53) list what exists in the current database.
async function tablesIn(db: Kysely<any>): Promise<string[]> {
  const rows = await sql<{ table_name: string }>`
    select table_name from information_schema.tables
    where table_schema = 'public' and table_type = 'BASE TABLE'`.execute(db);
  return rows.rows.map((r) => r.table_name).sort();
}

async function enumTypesIn(db: Kysely<any>): Promise<Record<string, string[]>> {
  const rows = await sql<{ typname: string; labels: string[] }>`
    select t.typname, array_agg(e.enumlabel::text order by e.enumsortorder) as labels
    from pg_type t join pg_enum e on e.enumtypid = t.oid
    join pg_namespace n on n.oid = t.typnamespace
    where n.nspname = 'public'
    group by t.typname`.execute(db);
  return Object.fromEntries(rows.rows.map((r) => [r.typname, r.labels]));
}

describe('migrations on a fresh database', () => {
  let fresh: FreshDatabase;

  beforeAll(async () => {
    fresh = await freshDatabase('sowcast_mig');
  });

  afterAll(async () => {
    await fresh?.drop();
  });

  it('migrates to latest and creates every table and enum type', async () => {
    const applied = await migrateToLatest(fresh.db);
    expect(applied).toEqual(Object.keys(migrations));
    const tables = await tablesIn(fresh.db);
    for (const table of TABLES) expect(tables, `table ${table}`).toContain(table);
    const enums = await enumTypesIn(fresh.db);
    expect(enums.property_role).toEqual(['owner', 'manager', 'member', 'viewer']);
    expect(enums.land_tenure).toEqual(['owned', 'leased', 'permission']);
    expect(enums.plot_cover).toEqual(['grass-weeds', 'brush', 'bare-soil', 'tilled', 'existing-stand']);
    expect(enums.plot_sun).toEqual(['full', 'partial', 'shade']);
  });

  it('is a no-op when run again', async () => {
    expect(await migrateToLatest(fresh.db)).toEqual([]);
  });

  it('keeps the constraints the schema promises (checked by inserting rows the rules forbid)', async () => {
    // Each insert breaks one rule; PostgreSQL must refuse it (SQLSTATE class 23, integrity violation).
    const db = fresh.db;
    const user = await db
      .insertInto('users')
      .values({ email: 'schema@example.test', name: 'Schema', password_hash: 'x' })
      .returning('id')
      .executeTakeFirstOrThrow();
    await expect(
      db.insertInto('users').values({ email: 'Upper@Example.test', name: 'U', password_hash: 'x' }).execute(),
    ).rejects.toMatchObject({ code: '23514' });
    await expect(
      db.insertInto('users').values({ email: 'schema@example.test', name: 'Dup', password_hash: 'x' }).execute(),
    ).rejects.toMatchObject({ code: '23505' });
    const property = await db
      .insertInto('properties')
      .values({ name: 'P', latitude: 10, longitude: 10, time_zone: 'UTC' })
      .returning('id')
      .executeTakeFirstOrThrow();
    await expect(
      db.insertInto('properties').values({ name: 'P', latitude: 91, longitude: 10, time_zone: 'UTC' }).execute(),
    ).rejects.toMatchObject({ code: '23514' });
    await expect(
      db
        .insertInto('properties')
        .values({ name: 'P', latitude: 1, longitude: 1, time_zone: 'UTC', avg_last_spring_frost: '13-01' })
        .execute(),
    ).rejects.toMatchObject({ code: '23514' });
    await expect(
      db.insertInto('plots').values({ property_id: property.id, name: 'A', acres: 0, cover: 'brush', sun: 'full' }).execute(),
    ).rejects.toMatchObject({ code: '23514' });
    await db.insertInto('plots').values({ property_id: property.id, name: 'A', acres: 1, cover: 'brush', sun: 'full' }).execute();
    await expect(
      db.insertInto('plots').values({ property_id: property.id, name: 'A', acres: 1, cover: 'brush', sun: 'full' }).execute(),
    ).rejects.toMatchObject({ code: '23505' });
    await db.insertInto('memberships').values({ property_id: property.id, user_id: user.id, role: 'owner' }).execute();
    // Deleting the property takes its plots and memberships with it (on delete cascade).
    await db.deleteFrom('properties').where('id', '=', property.id).execute();
    const left = await db.selectFrom('plots').select('id').where('property_id', '=', property.id).execute();
    expect(left).toEqual([]);
    const memberships = await db.selectFrom('memberships').select('user_id').where('property_id', '=', property.id).execute();
    expect(memberships).toEqual([]);
  });

  it('migrates all the way down: tables and enum types are gone', async () => {
    const { error, results } = await migratorFor(fresh.db).migrateTo(NO_MIGRATIONS);
    expect(error).toBeUndefined();
    expect(results?.every((r) => r.status === 'Success' && r.direction === 'Down')).toBe(true);
    expect(results?.map((r) => r.migrationName).sort()).toEqual(Object.keys(migrations).sort());
    const tables = await tablesIn(fresh.db);
    for (const table of TABLES) expect(tables, `table ${table}`).not.toContain(table);
    const enums = await enumTypesIn(fresh.db);
    for (const type of ENUM_TYPES) expect(Object.keys(enums), `type ${type}`).not.toContain(type);
    const pending = await migratorFor(fresh.db).getMigrations();
    expect(pending.every((m) => m.executedAt === undefined)).toBe(true);
  });

  it('migrates up again after going down', async () => {
    expect(await migrateToLatest(fresh.db)).toEqual(Object.keys(migrations));
    const tables = await tablesIn(fresh.db);
    for (const table of TABLES) expect(tables).toContain(table);
    expect(Object.keys(await enumTypesIn(fresh.db)).sort()).toEqual([...ENUM_TYPES].sort());
  });

  it('steps down one migration at a time until none is left', async () => {
    const migrator = migratorFor(fresh.db);
    let steps = 0;
    for (;;) {
      const { error, results } = await migrator.migrateDown();
      expect(error).toBeUndefined();
      if (!results?.length) break;
      steps += 1;
      expect(steps).toBeLessThanOrEqual(Object.keys(migrations).length);
    }
    expect(steps).toBe(Object.keys(migrations).length);
    expect((await tablesIn(fresh.db)).filter((t) => TABLES.includes(t))).toEqual([]);
  });
});
