import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import bcrypt from 'bcryptjs';
import type { Kysely } from 'kysely';
import { demoSeasonFor, demoWeatherEvents, loadDemo } from '@/db/demo';
import { demoPhoneLabel, registerDemoPhones } from '@/db/demo-phones';
import { controlEventSchema } from '@/fakes/weather/events';
import { SPECIES } from '@/lib/agronomy/species';
import { vapidKeys } from '@/lib/notify/push';
import { buildPlantingInput } from '@/lib/planning/input';
import { planPlanting } from '@/lib/schedule/plan';
import { plantingSchema } from '@/lib/validations/planting';
import demoUsers from '@/db/demo-users.json';
import { getDb } from '@/db';
import type { Database } from '@/db/database';
import { migrateToLatest } from '@/db/migrate';
import { ROLES } from '@/lib/validations/membership';
import { plotSchema } from '@/lib/validations/plot';
import { isKnownTimeZone, propertySchema } from '@/lib/validations/property';
import { freshDatabase, type FreshDatabase } from '../support/db';

const TABLES = ['users', 'properties', 'memberships', 'plots', 'plantings', 'steps', 'blends', 'expenses'] as const;

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
    // Plantings and subscriptions are saved through lib/data, which uses DATABASE_URL: point it at this
    // database before anything in this test file opens the shared pool (loadDemo checks they agree).
    process.env.DATABASE_URL = fresh.url;
  });

  afterAll(async () => {
    // lib/data's shared pool holds connections to this database too: close it before the database goes.
    await getDb().destroy();
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

  describe('plantings at every stage, saved through the engine', () => {
    // Local dates in the property's zone, from the runtime's ICU data (en-CA formats as YYYY-MM-DD).
    const localDate = (ms: number, timeZone: string) =>
      new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(ms);
    const plusDays = (date: string, days: number) => new Date(Date.parse(`${date}T12:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);

    async function planting(plotName: string) {
      const row = await db
        .selectFrom('plantings')
        .innerJoin('plots', 'plots.id', 'plantings.plot_id')
        .innerJoin('properties', 'properties.id', 'plots.property_id')
        .select(['plantings.id', 'plantings.method', 'properties.time_zone'])
        .where('plots.name', '=', plotName)
        .executeTakeFirstOrThrow();
      const steps = await db.selectFrom('steps').selectAll().where('planting_id', '=', row.id).orderBy('position').execute();
      const step = (key: string) => steps.find((s) => s.key === key);
      return { ...row, steps, step, today: localDate(Date.now(), row.time_zone) };
    }

    it('a plot sprayed 13 days ago whose 14-day kill wait ends tomorrow', async () => {
      const p = await planting('Creekside strip');
      expect(p.method).toBe('prepared-seedbed');
      expect(p.step('spray')).toMatchObject({ status: 'done', done_on: plusDays(p.today, -13) });
      // 14 days: the engine's documented default kill wait (lib/schedule/rules/kill-wait.ts, common practice).
      expect(p.step('kill-wait')).toMatchObject({ status: 'planned', local_date: plusDays(p.today, 1) });
      expect(p.step('seed')!.local_date >= plusDays(p.today, 1)).toBe(true);
    });

    it('a plot seeded a week ago whose germination check is close', async () => {
      const p = await planting('Duck pond rim');
      expect(p.method).toBe('spray-and-seed');
      expect(p.step('seed')).toMatchObject({ status: 'done', done_on: plusDays(p.today, -7) });
      const check = p.step('check-germination')!;
      expect(check.status).toBe('planned');
      expect(check.local_date >= p.today && check.local_date <= plusDays(p.today, 14)).toBe(true);
    });

    it('a plot waiting to seed in the next days, and the rain two days out that the demo puts in the fake forecast', async () => {
      const p = await planting('Old lane');
      const seed = p.step('seed')!;
      expect(seed.status).toBe('planned');
      expect(seed.local_date > p.today && seed.local_date <= plusDays(p.today, 7)).toBe(true);
      const [rain, dry] = demoWeatherEvents(new Date());
      expect(rain).toMatchObject({ kind: 'rain', date: plusDays(p.today, 2) });
      // A rain the seeding rules wait for: at least 0.25 in = 6.35 mm (1 in = 25.4 mm, NIST SP 811).
      expect(rain.totalMm).toBeGreaterThanOrEqual(6.35);
      // Dry from the day after the rain through past the planned seeding, so that rain is the one to beat.
      expect(dry).toMatchObject({ kind: 'dry', date: plusDays(p.today, 3) });
      expect(plusDays(dry.date, dry.days - 1) > seed.local_date).toBe(true);
      // The fake weather service's control API accepts both as they are (its own schema).
      for (const event of [rain, dry]) expect(controlEventSchema.safeParse(event).success, event.kind).toBe(true);
    });

    it('one planting planned for next month, with nothing done yet', async () => {
      const rows = await db
        .selectFrom('plantings')
        .innerJoin('plots', 'plots.id', 'plantings.plot_id')
        .innerJoin('properties', 'properties.id', 'plots.property_id')
        .select(['plantings.id', 'plantings.target_seed_date', 'plots.name', 'properties.time_zone'])
        .where('plots.name', 'in', ['North corner', 'Pecan edge', 'Saddle clearing'])
        .execute();
      expect(rows).toHaveLength(1);
      const [y, m] = localDate(Date.now(), rows[0].time_zone).split('-').map(Number);
      const nextMonth = m === 12 ? `${y + 1}-01` : `${y}-${String(m + 1).padStart(2, '0')}`;
      expect(rows[0].target_seed_date.slice(0, 7)).toBe(nextMonth);
      const steps = await db.selectFrom('steps').select(['status']).where('planting_id', '=', rows[0].id).execute();
      expect(steps.length).toBeGreaterThan(0);
      expect(steps.every((s) => s.status === 'planned')).toBe(true);
    });

    it('every step is assigned to the demo member or manager; done steps say who and when', async () => {
      const people = await db.selectFrom('users').select(['id', 'email']).execute();
      const idOf = (role: string) => people.find((u) => u.email === demoUsers.users.find((d) => d.role === role)!.email)!.id;
      const steps = await db.selectFrom('steps').selectAll().execute();
      expect(steps.length).toBeGreaterThan(10);
      for (const step of steps) {
        expect([idOf('member'), idOf('manager')], step.key).toContain(step.assignee_id);
        if (step.status === 'done') {
          expect(step.done_by).toBe(step.assignee_id);
          expect(step.done_at).toBeInstanceOf(Date);
        }
      }
      expect(new Set(steps.map((s) => s.assignee_id)).size).toBe(2);
    });

    it('loading again adds no planting or step', async () => {
      const before = await counts(db);
      await loadDemo(db);
      expect(await counts(db)).toEqual(before);
    });

    it('for every month of the year, the seasonal blends pass the planting form and plan without error', () => {
      const property = { time_zone: 'America/Chicago', latitude: 36.412, longitude: -90.118, elevation_m: 105, avg_last_spring_frost: '04-02', avg_first_fall_frost: '10-29' };
      const warm = new Set(SPECIES.filter((s) => s.season === 'warm').map((s) => s.id));
      for (let month = 1; month <= 12; month++) {
        const season = demoSeasonFor(month);
        for (const [stage, choice] of Object.entries(season)) {
          const form = plantingSchema.parse({
            season: choice.season,
            method: 'frostSeeding' in choice && choice.frostSeeding ? 'frost-seeding' : 'prepared-seedbed',
            blend: choice.blend,
            targetSeedDate: `2027-${String(month).padStart(2, '0')}-15`,
          });
          const plan = planPlanting(buildPlantingInput(property, { acres: 0.5, cover: 'existing-stand' }, form), null, new Date(`2027-${String(month).padStart(2, '0')}-01T12:00:00Z`));
          expect(plan.steps.length, `${month} ${stage}`).toBeGreaterThan(0);
          // Warm-season species (frost-tender in the catalog) only from April to July, never in the cold months.
          if (choice.blend.some((b: { speciesId: string }) => warm.has(b.speciesId))) expect([4, 5, 6, 7], `${month} ${stage}`).toContain(month);
        }
      }
    });
  });

  describe('virtual phones at the local push service', () => {
    it('one per demo person, labelled with their name; a second run makes none; a phone the service dropped is replaced', async () => {
      const pushUrl = process.env.FAKE_PUSH_URL;
      expect(pushUrl, 'the test run starts the fake push service and exports FAKE_PUSH_URL').toBeTruthy();
      const { publicKey } = vapidKeys(process.env, process.env.SOWCAST_DATA_DIR ?? '.data');
      expect(await registerDemoPhones(db, pushUrl!, publicKey)).toBe(demoUsers.users.length);
      expect(await registerDemoPhones(db, pushUrl!, publicKey)).toBe(0);

      const rows = await db
        .selectFrom('push_subscriptions')
        .innerJoin('users', 'users.id', 'push_subscriptions.user_id')
        .select(['users.name', 'push_subscriptions.label', 'push_subscriptions.endpoint'])
        .execute();
      expect(rows).toHaveLength(demoUsers.users.length);
      for (const row of rows) {
        expect(row.label).toBe(demoPhoneLabel(row.name));
        expect(row.endpoint.startsWith(`${pushUrl}/push/`)).toBe(true);
      }

      // The push service marks one phone gone (RFC 8030 §7.3: later pushes get 410): the next run replaces it.
      const gone = rows[0];
      const id = gone.endpoint.split('/').at(-1);
      expect((await fetch(`${pushUrl}/_control/subscriptions/${id}/gone`, { method: 'POST' })).status).toBe(200);
      expect(await registerDemoPhones(db, pushUrl!, publicKey)).toBe(1);
      const after = await db.selectFrom('push_subscriptions').select('endpoint').execute();
      expect(after).toHaveLength(demoUsers.users.length);
      expect(after.map((r) => r.endpoint)).not.toContain(gone.endpoint);
    });
  });
});

