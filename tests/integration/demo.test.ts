import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import bcrypt from 'bcryptjs';
import type { Kysely } from 'kysely';
import { loadDemo } from '@/db/demo';
import demoUsers from '@/db/demo-users.json';
import type { Database } from '@/db/database';
import { migrateToLatest } from '@/db/migrate';
import { ROLES } from '@/lib/validations/membership';
import { plotSchema } from '@/lib/validations/plot';
import { isKnownTimeZone, propertySchema } from '@/lib/validations/property';
import { freshDatabase, type FreshDatabase } from '../support/db';

const TABLES = ['users', 'properties', 'memberships', 'plots'] as const;

async function counts(db: Kysely<Database>) {
  const out: Record<string, number> = {};
  for (const table of TABLES) {
    const row = await db.selectFrom(table).select((eb) => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow();
    out[table] = Number(row.n);
  }
  return out;
}

describe('demo scenario loader', () => {
  let fresh: FreshDatabase;
  let db: Kysely<Database>;

  beforeAll(async () => {
    fresh = await freshDatabase('sowcast_demo');
    db = fresh.db as Kysely<Database>;
    await migrateToLatest(db);
  });

  afterAll(async () => {
    await fresh?.drop();
  });

  it('loads twice with identical row counts (idempotent)', async () => {
    const firstIds = await loadDemo(db);
    const first = await counts(db);
    const secondIds = await loadDemo(db);
    const second = await counts(db);
    expect(second).toEqual(first);
    expect(secondIds).toEqual(firstIds);
    expect(first.users).toBe(demoUsers.users.length);
    expect(first.properties).toBeGreaterThanOrEqual(2);
    // Every demo person belongs to every demo property, once.
    expect(first.memberships).toBe(first.users * first.properties);
  });

  it('spans at least two time zones, all known to the IANA database (via Intl)', async () => {
    const zones = await db.selectFrom('properties').select('time_zone').distinct().execute();
    expect(zones.length).toBeGreaterThanOrEqual(2);
    for (const { time_zone } of zones) expect(isKnownTimeZone(time_zone), time_zone).toBe(true);
  });

  it('has between 6 and 10 plots', async () => {
    const { plots } = await counts(db);
    expect(plots).toBeGreaterThanOrEqual(6);
    expect(plots).toBeLessThanOrEqual(10);
  });

  it('has exactly one user per role on each property', async () => {
    const rows = await db.selectFrom('memberships').select(['property_id', 'role', 'user_id']).execute();
    const byProperty = new Map<string, string[]>();
    for (const r of rows) byProperty.set(r.property_id, [...(byProperty.get(r.property_id) ?? []), r.role]);
    for (const roles of byProperty.values()) expect([...roles].sort()).toEqual([...ROLES].sort());
    const usersPerRole = new Map<string, Set<string>>();
    for (const r of rows) usersPerRole.set(r.role, (usersPerRole.get(r.role) ?? new Set()).add(r.user_id));
    for (const role of ROLES) expect(usersPerRole.get(role)?.size, role).toBe(1);
    expect(new Set(rows.map((r) => r.user_id)).size).toBe(ROLES.length);
  });

  it('stores the demo passwords as bcrypt hashes that verify', async () => {
    // bcrypt's modular-crypt prefix is $2a$/$2b$/$2y$ (OpenBSD bcrypt); verified with bcryptjs.
    for (const u of demoUsers.users) {
      const row = await db.selectFrom('users').select('password_hash').where('email', '=', u.email).executeTakeFirstOrThrow();
      expect(row.password_hash).toMatch(/^\$2[aby]\$\d{2}\$/);
      expect(await bcrypt.compare(u.password, row.password_hash)).toBe(true);
    }
  });

  it('passes the same validation a person filling the forms would (lib/validations)', async () => {
    const properties = await db.selectFrom('properties').selectAll().execute();
    for (const p of properties) {
      const parsed = propertySchema.safeParse({
        name: p.name,
        latitude: p.latitude,
        longitude: p.longitude,
        timeZone: p.time_zone,
        elevationM: p.elevation_m,
        avgLastSpringFrost: p.avg_last_spring_frost,
        avgFirstFallFrost: p.avg_first_fall_frost,
        seasonOpensOn: p.season_opens_on,
        tenure: p.tenure,
        landownerName: p.landowner_name,
        landownerContact: p.landowner_contact,
        permissionGrantedOn: p.permission_granted_on,
      });
      expect(parsed.error?.issues ?? [], p.name).toEqual([]);
    }
    const plots = await db.selectFrom('plots').selectAll().execute();
    for (const plot of plots) {
      const parsed = plotSchema.safeParse({
        name: plot.name, acres: plot.acres, cover: plot.cover, sun: plot.sun, soilPh: plot.soil_ph, notes: plot.notes,
      });
      expect(parsed.error?.issues ?? [], plot.name).toEqual([]);
    }
    // Each property has at least one plot, so every screen has something to show.
    expect(new Set(plots.map((p) => p.property_id)).size).toBe(properties.length);
  });
});
