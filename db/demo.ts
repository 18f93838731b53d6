import bcrypt from 'bcryptjs';
import { sql, type Kysely } from 'kysely';
import { now as clockNow } from '@/lib/clock';
import { createPlanting } from '@/lib/data/plantings';
import { buildPlantingInput } from '@/lib/planning/input';
import { addDays, instantOf, localDateOf } from '@/lib/schedule/local-dates';
import { planPlanting, replan } from '@/lib/schedule/plan';
import type { BlendPart, Plan, StepKind } from '@/lib/schedule/types';
import { plantingSchema, type PlantingFormInput } from '@/lib/validations/planting';
import { createDb, createPool, getDb } from './index';
import type { Database, PlotCover, PlotSun, PropertyRole } from './database';
import demoUsers from './demo-users.json';

// The demo club is invented: the club, its people, its grounds and their names. Coordinates are only
// chosen to give two time zones and plausible frost dates.
export const DEMO_PROPERTIES = [
  {
    name: 'Foxglove Hollow Lease',
    latitude: 36.412,
    longitude: -90.118,
    time_zone: 'America/Chicago',
    elevation_m: 105,
    avg_last_spring_frost: '04-02',
    avg_first_fall_frost: '10-29',
    season_opens_on: '2027-09-25',
    tenure: 'leased' as const,
    landowner_name: 'Orrin Bellweather',
    landowner_contact: 'viewer@demo.sowcast.test',
    permission_granted_on: '2026-02-14',
    plots: [
      { name: 'Creekside strip', acres: 0.5, cover: 'grass-weeds', sun: 'full', soil_ph: 5.8, notes: 'Wet in March; seed late.' },
      { name: 'North corner', acres: 1.2, cover: 'existing-stand', sun: 'full', soil_ph: 6.4, notes: 'Clover stand, second year.' },
      { name: 'Cedar gap', acres: 0.25, cover: 'brush', sun: 'partial', soil_ph: null, notes: 'Needs brush cleared first.' },
      { name: 'Old lane', acres: 0.8, cover: 'tilled', sun: 'full', soil_ph: 6.1, notes: null },
    ],
  },
  {
    name: 'Brindle Ridge',
    latitude: 37.905,
    longitude: -80.611,
    time_zone: 'America/New_York',
    elevation_m: 720,
    avg_last_spring_frost: '05-05',
    avg_first_fall_frost: '10-08',
    season_opens_on: '2027-10-02',
    tenure: 'permission' as const,
    landowner_name: 'Perpetua Lindqvist',
    landowner_contact: '+1 555 0142',
    permission_granted_on: '2025-08-30',
    plots: [
      { name: 'Saddle clearing', acres: 2.1, cover: 'grass-weeds', sun: 'full', soil_ph: 5.4, notes: 'Lime before anything.' },
      { name: 'Log landing', acres: 0.35, cover: 'bare-soil', sun: 'partial', soil_ph: 5.9, notes: 'Old skid landing, compacted.' },
      { name: 'Spring seep', acres: 0.6, cover: 'grass-weeds', sun: 'partial', soil_ph: null, notes: null },
    ],
  },
  {
    name: 'Willet Bottoms',
    latitude: 35.771,
    longitude: -91.402,
    time_zone: 'America/Chicago',
    elevation_m: 70,
    avg_last_spring_frost: '03-28',
    avg_first_fall_frost: '11-02',
    season_opens_on: null,
    tenure: 'owned' as const,
    landowner_name: null,
    landowner_contact: null,
    permission_granted_on: null,
    plots: [
      { name: 'Pecan edge', acres: 1.6, cover: 'tilled', sun: 'full', soil_ph: 6.6, notes: null },
      { name: 'Duck pond rim', acres: 0.4, cover: 'grass-weeds', sun: 'full', soil_ph: 6.0, notes: 'Floods after heavy rain.' },
    ],
  },
] as const;

/**
 * Loads the demo club. Idempotent: users match by e-mail, properties by name, plots by (property, name), and a
 * plot that already has a planting keeps it. Plantings are dated relative to `at` (lib/clock.ts by default).
 */
export async function loadDemo(db: Kysely<Database>, at: Date = clockNow()) {
  // Test files (and a start racing a test run) may load the demo at the same moment: one at a time, on one
  // connection that holds a session advisory lock, so the second finds everything there and adds nothing.
  return db.connection().execute(async (conn) => {
    await sql`select pg_advisory_lock(${DEMO_LOCK_KEY})`.execute(conn);
    try {
      return await loadDemoLocked(conn, at);
    } finally {
      await sql`select pg_advisory_unlock(${DEMO_LOCK_KEY})`.execute(conn);
    }
  });
}

/** An arbitrary constant naming the demo loader's advisory lock. */
const DEMO_LOCK_KEY = 7_401_311;

async function loadDemoLocked(db: Kysely<Database>, at: Date) {
  const userIds: Record<string, string> = {};
  for (const u of demoUsers.users) {
    const existing = await db.selectFrom('users').select('id').where('email', '=', u.email).executeTakeFirst();
    if (existing) {
      userIds[u.role] = existing.id;
      continue;
    }
    const row = await db
      .insertInto('users')
      .values({ email: u.email, name: u.name, password_hash: await bcrypt.hash(u.password, 10), email_verified_at: at })
      .returning('id')
      .executeTakeFirstOrThrow();
    userIds[u.role] = row.id;
  }

  for (const { plots, ...property } of DEMO_PROPERTIES) {
    const owner = userIds.owner;
    let propertyId = (
      await db
        .selectFrom('properties')
        .innerJoin('memberships', 'memberships.property_id', 'properties.id')
        .select('properties.id')
        .where('properties.name', '=', property.name)
        .where('memberships.user_id', '=', owner)
        .executeTakeFirst()
    )?.id;
    if (!propertyId) {
      propertyId = (await db.insertInto('properties').values(property).returning('id').executeTakeFirstOrThrow()).id;
    }
    for (const [role, userId] of Object.entries(userIds)) {
      await db
        .insertInto('memberships')
        .values({ property_id: propertyId, user_id: userId, role: role as PropertyRole })
        .onConflict((oc) => oc.columns(['property_id', 'user_id']).doNothing())
        .execute();
    }
    for (const plot of plots) {
      await db
        .insertInto('plots')
        .values({ ...plot, cover: plot.cover as PlotCover, sun: plot.sun as PlotSun, property_id: propertyId })
        .onConflict((oc) => oc.columns(['property_id', 'name']).doNothing())
        .execute();
    }
  }
  await loadDemoBlends(db, userIds);
  await loadDemoExpenses(db, userIds, at);
  await loadDemoPlantings(db, userIds, at);
  return userIds;
}

// ——— the club's saved blends ———————————————————————————————————————————————————————————————————
// Invented mixes the demo club keeps on its lease; shares are parts of each species' pure-stand rate.
const DEMO_BLENDS = [
  { property: 'Foxglove Hollow Lease', name: 'Fall clover and cereal', parts: [{ speciesId: 'white-clover', share: 0.5 }, { speciesId: 'cereal-rye', share: 0.5 }] },
  { property: 'Foxglove Hollow Lease', name: 'Brassica and oats', parts: [{ speciesId: 'turnip', share: 0.4 }, { speciesId: 'forage-radish', share: 0.3 }, { speciesId: 'oats', share: 0.5 }] },
  { property: 'Brindle Ridge', name: 'Summer peas', parts: [{ speciesId: 'cowpeas', share: 0.7 }, { speciesId: 'buckwheat', share: 0.3 }] },
];

async function loadDemoBlends(db: Kysely<Database>, userIds: Record<string, string>) {
  for (const blend of DEMO_BLENDS) {
    const property = await db
      .selectFrom('properties')
      .innerJoin('memberships', 'memberships.property_id', 'properties.id')
      .select('properties.id')
      .where('properties.name', '=', blend.property)
      .where('memberships.user_id', '=', userIds.owner)
      .executeTakeFirst();
    if (!property) continue;
    const existing = await db.selectFrom('blends').select('id').where('property_id', '=', property.id).where('name', '=', blend.name).executeTakeFirst();
    if (existing) continue;
    await db
      .insertInto('blends')
      .values({ property_id: property.id, name: blend.name, parts: JSON.stringify(blend.parts), created_by: userIds.manager })
      .execute();
  }
}

// ——— the club's expenses ————————————————————————————————————————————————————————————————————
// Invented bills for the lease, in cents; an empty split means everyone who shares the club's costs.
const DEMO_EXPENSES = [
  { plot: 'Creekside strip', category: 'seed', description: 'Clover and cereal rye seed, two bags', amount_cents: 14_250, labour_hours: null, paidBy: 'manager', split: [] },
  { plot: null, category: 'herbicide', description: 'Glyphosate 41%, one gallon', amount_cents: 3_899, labour_hours: null, paidBy: 'owner', split: [] },
  { plot: 'Old lane', category: 'lime', description: 'Pelletized lime, ten bags', amount_cents: 6_490, labour_hours: null, paidBy: 'member', split: ['owner', 'manager', 'member'] },
  { plot: null, category: 'fuel', description: 'Tractor diesel', amount_cents: 2_735, labour_hours: null, paidBy: 'manager', split: ['manager', 'member'] },
  { plot: 'Old lane', category: 'labour', description: 'Disking and rolling the seedbed', amount_cents: 0, labour_hours: 3.5, paidBy: 'member', split: [] },
] as const;

async function loadDemoExpenses(db: Kysely<Database>, userIds: Record<string, string>, at: Date) {
  const property = await db
    .selectFrom('properties')
    .innerJoin('memberships', 'memberships.property_id', 'properties.id')
    .select(['properties.id', 'properties.time_zone'])
    .where('properties.name', '=', 'Foxglove Hollow Lease')
    .where('memberships.user_id', '=', userIds.owner)
    .executeTakeFirst();
  if (!property) return;
  const today = localDateOf(at, property.time_zone);
  for (const [i, e] of DEMO_EXPENSES.entries()) {
    const existing = await db.selectFrom('expenses').select('id').where('property_id', '=', property.id).where('description', '=', e.description).executeTakeFirst();
    if (existing) continue;
    const plot = e.plot
      ? await db.selectFrom('plots').select('id').where('property_id', '=', property.id).where('name', '=', e.plot).executeTakeFirst()
      : undefined;
    const spentOn = addDays(today, -30 + i * 5);
    await db
      .insertInto('expenses')
      .values({
        property_id: property.id,
        plot_id: plot?.id ?? null,
        season: Number(spentOn.slice(5, 7)) <= 6 ? 'spring' : 'fall',
        year: Number(spentOn.slice(0, 4)),
        spent_on: spentOn,
        category: e.category,
        description: e.description,
        amount_cents: e.amount_cents,
        labour_hours: e.labour_hours,
        paid_by: userIds[e.paidBy],
        split_among: JSON.stringify(e.split.map((role) => userIds[role])),
        created_by: userIds.manager,
      })
      .execute();
  }
}

// ——— plantings at every stage ————————————————————————————————————————————————————————————————
//
// Four plantings, each at another stage on the day the demo is loaded (T, the property's local date):
//   kill wait     Creekside strip — prepared seedbed, sprayed T−13: the 14-day kill wait ends tomorrow
//   seeded        Duck pond rim   — spray-and-seed, seeded T−7: the germination check comes up about now
//   waiting       Old lane        — prepared seedbed on tilled ground, seeding planned T+3; the demo puts a
//                                   rain on T+2 into the fake forecast, so the engine moves the seeding ahead of it
//   next month    planned for the 12th of next month: a frost seeding into North corner's clover, a fall
//                 planting on Pecan edge, or a spring/summer one on Saddle clearing
// Blends follow the month, so the demo reads plausibly whenever it is loaded (Sowcast's own choice, common
// practice, no source — the engine still warns where a date is late, as it would for a real club):
//   Nov–Dec  late fall: cereal rye (the grain that still establishes close to frost; the engine says the date is
//            past its fall deadline), rye + winter wheat on the tilled plot; next month a frost seeding of red and
//            white clover into the established clover
//   Jan–Apr  late winter and spring: oats as a nurse crop for red clover; next month a frost seeding (Jan–Feb),
//            oats and clover (Mar), warm-season soybeans and cowpeas after the last frost (Apr)
//   May–Jul  summer: soybeans and cowpeas, buckwheat; turnips, radish and crimson clover for August
//   Aug–Oct  fall: brassicas with crimson clover (Aug), winter wheat with crimson clover (Sep), cereal rye (Oct)

const blend = (...parts: [string, number][]): BlendPart[] => parts.map(([speciesId, share]) => ({ speciesId, share }));

const BLENDS = {
  lateRye: blend(['cereal-rye', 1]),
  ryeWheat: blend(['cereal-rye', 0.6], ['winter-wheat', 0.4]),
  frostClover: blend(['red-clover', 0.6], ['white-clover', 0.4]),
  oatsClover: blend(['oats', 0.5], ['red-clover', 0.5]),
  oats: blend(['oats', 1]),
  warmBeans: blend(['soybeans', 0.5], ['cowpeas', 0.5]),
  buckwheat: blend(['buckwheat', 1]),
  brassicaClover: blend(['turnip', 0.3], ['forage-radish', 0.3], ['crimson-clover', 0.4]),
  wheatClover: blend(['winter-wheat', 0.5], ['crimson-clover', 0.5]),
} satisfies Record<string, BlendPart[]>;

type Season = PlantingFormInput['season'];
type Choice = { season: Season; blend: BlendPart[] };
type NextMonth = Choice & { frostSeeding?: boolean };

interface DemoSeason {
  killWait: Choice;
  seeded: Choice;
  waiting: Choice;
  nextMonth: NextMonth;
}

const fall = (b: BlendPart[]): Choice => ({ season: 'fall', blend: b });
const spring = (b: BlendPart[]): Choice => ({ season: 'spring', blend: b });

/** The four plantings' seasons and blends for a local month (1–12). */
export function demoSeasonFor(month: number): DemoSeason {
  const frost: NextMonth = { ...spring(BLENDS.frostClover), frostSeeding: true };
  switch (month) {
    case 11:
    case 12:
      return { killWait: fall(BLENDS.lateRye), seeded: fall(BLENDS.lateRye), waiting: fall(BLENDS.ryeWheat), nextMonth: frost };
    case 1:
    case 2:
    case 3:
    case 4: {
      const nextMonth = month <= 2 ? frost : month === 3 ? spring(BLENDS.oatsClover) : spring(BLENDS.warmBeans);
      return { killWait: spring(BLENDS.oatsClover), seeded: spring(BLENDS.oatsClover), waiting: spring(BLENDS.oats), nextMonth };
    }
    case 5:
    case 6:
    case 7:
      return {
        killWait: spring(BLENDS.warmBeans),
        seeded: spring(BLENDS.buckwheat),
        waiting: spring(BLENDS.warmBeans),
        nextMonth: month === 7 ? fall(BLENDS.brassicaClover) : spring(BLENDS.buckwheat),
      };
    case 8:
      return { killWait: fall(BLENDS.brassicaClover), seeded: fall(BLENDS.brassicaClover), waiting: fall(BLENDS.brassicaClover), nextMonth: fall(BLENDS.wheatClover) };
    case 9:
      return { killWait: fall(BLENDS.wheatClover), seeded: fall(BLENDS.wheatClover), waiting: fall(BLENDS.wheatClover), nextMonth: fall(BLENDS.lateRye) };
    default:
      return { killWait: fall(BLENDS.lateRye), seeded: fall(BLENDS.lateRye), waiting: fall(BLENDS.lateRye), nextMonth: fall(BLENDS.lateRye) };
  }
}

// An invented generic burndown: the active ingredient and a common broadcast rate (1.5 qt/acre of a 41 %
// product). Demo numbers only — the product label is the law.
const DEMO_HERBICIDE = {
  productName: 'Glyphosate 41% (generic)',
  activeIngredientPct: 41,
  rateKind: 'fl-oz-per-acre' as const,
  rate: 48,
};
const DEMO_SPRAYER = { tankGal: 25, carrierGalPerAcre: 15 };

/** Which demo person does which step: the member works the ground, the manager tests, waits and checks. */
const FIELD_WORK: StepKind[] = ['clear-brush', 'spray', 'burn', 'rake-till', 'seed', 'cover-seed', 'frost-seed', 'mow', 'spot-spray-grass', 'fertilize', 'lime'];

export type DemoStage = 'kill-wait' | 'seeded' | 'waiting' | 'next-month';

interface DemoPlanting {
  stage: DemoStage;
  property: string;
  plot: string;
  form: Omit<PlantingFormInput, 'targetSeedDate'>;
  /** Local days from today to the planned seeding. */
  seedInDays: number | 'next-month';
  /** How long before today the planting was planned. */
  plannedDaysAgo: number;
  /** Steps already done, with how many days ago. */
  done: Partial<Record<string, number>>;
}

function demoPlantings(season: DemoSeason): DemoPlanting[] {
  const next = season.nextMonth;
  return [
    {
      stage: 'kill-wait',
      property: 'Foxglove Hollow Lease',
      plot: 'Creekside strip',
      form: { ...season.killWait, method: 'prepared-seedbed', herbicide: DEMO_HERBICIDE, sprayer: DEMO_SPRAYER, killWaitDays: 14 },
      seedInDays: 2,
      plannedDaysAgo: 21,
      done: { 'soil-test': 20, spray: 13 },
    },
    {
      stage: 'seeded',
      property: 'Willet Bottoms',
      plot: 'Duck pond rim',
      form: { ...season.seeded, method: 'spray-and-seed', herbicide: DEMO_HERBICIDE, sprayer: DEMO_SPRAYER },
      seedInDays: -7,
      plannedDaysAgo: 30,
      done: { 'soil-test': 28, spray: 8, seed: 7 },
    },
    {
      stage: 'waiting',
      property: 'Foxglove Hollow Lease',
      plot: 'Old lane',
      form: { ...season.waiting, method: 'prepared-seedbed' },
      seedInDays: 3,
      plannedDaysAgo: 10,
      done: { 'soil-test': 9 },
    },
    next.frostSeeding
      ? {
          stage: 'next-month',
          property: 'Foxglove Hollow Lease',
          plot: 'North corner',
          form: { season: next.season, method: 'frost-seeding', blend: next.blend },
          seedInDays: 'next-month',
          plannedDaysAgo: 0,
          done: {},
        }
      : next.season === 'fall'
        ? {
            stage: 'next-month',
            property: 'Willet Bottoms',
            plot: 'Pecan edge',
            form: { season: next.season, method: 'prepared-seedbed', blend: next.blend },
            seedInDays: 'next-month',
            plannedDaysAgo: 0,
            done: {},
          }
        : {
            stage: 'next-month',
            property: 'Brindle Ridge',
            plot: 'Saddle clearing',
            form: { season: next.season, method: 'spray-and-seed', blend: next.blend, herbicide: DEMO_HERBICIDE, sprayer: DEMO_SPRAYER },
            seedInDays: 'next-month',
            plannedDaysAgo: 0,
            done: {},
          },
  ];
}

/** The 12th of the month after `today`. */
function twelfthOfNextMonth(today: string): string {
  const [y, m] = today.split('-').map(Number);
  return m === 12 ? `${y + 1}-01-12` : `${y}-${String(m + 1).padStart(2, '0')}-12`;
}

const DAY_MS = 86_400_000;

/**
 * A planting as the club would have made it: planned through the engine on the day it was planned, its done
 * steps recorded with their real dates, then re-placed by the engine as of today (following steps count from
 * the real dates, as every replan does).
 */
function demoPlan(
  entry: DemoPlanting,
  property: Parameters<typeof buildPlantingInput>[0],
  plot: Parameters<typeof buildPlantingInput>[1],
  at: Date,
) {
  const today = localDateOf(at, property.time_zone);
  const targetSeedDate = entry.seedInDays === 'next-month' ? twelfthOfNextMonth(today) : addDays(today, entry.seedInDays);
  const form = plantingSchema.parse({ ...entry.form, targetSeedDate });
  const input = buildPlantingInput(property, plot, form);
  const plannedAt = new Date(at.getTime() - entry.plannedDaysAgo * DAY_MS);
  let plan: Plan = planPlanting(input, null, plannedAt);
  const doneKeys = Object.keys(entry.done);
  if (doneKeys.length) {
    for (const step of plan.steps) {
      const daysAgo = entry.done[step.key];
      if (daysAgo === undefined) continue;
      const doneOn = addDays(today, -daysAgo);
      Object.assign(step, { status: 'done', doneOn, date: doneOn });
    }
    const missing = doneKeys.filter((key) => !plan.steps.some((s) => s.key === key));
    if (missing.length) throw new Error(`demo planting on ${entry.plot}: the plan has no ${missing.join(', ')} step`);
    // No forecast is stored when the demo loads: replanning against an empty one keeps planned dates where the
    // weather would decide and re-places the rest from the real dates.
    plan = replan(input, plan, { timeZone: property.time_zone, fetchedAt: at.toISOString(), hours: [] }, at).plan;
  }
  return { form, plan };
}

/** The plantings go through lib/data (the process's database); make sure that is the database being loaded. */
async function assertSameDatabase(db: Kysely<Database>) {
  const where = sql<{ name: string; port: number | null; address: string | null }>`select current_database() as name, inet_server_port() as port, host(inet_server_addr()) as address`;
  const [mine, shared] = await Promise.all([where.execute(db), where.execute(getDb())]);
  if (JSON.stringify(mine.rows[0]) !== JSON.stringify(shared.rows[0])) {
    throw new Error('loadDemo was given a database other than DATABASE_URL; plantings are saved through lib/data, which uses DATABASE_URL');
  }
}

async function loadDemoPlantings(db: Kysely<Database>, userIds: Record<string, string>, at: Date) {
  const plots = await db
    .selectFrom('plots')
    .innerJoin('properties', 'properties.id', 'plots.property_id')
    .innerJoin('memberships', (join) => join.onRef('memberships.property_id', '=', 'properties.id').on('memberships.user_id', '=', userIds.owner))
    .selectAll('plots')
    .select(['properties.name as property_name', 'properties.time_zone', 'properties.latitude', 'properties.longitude', 'properties.elevation_m', 'properties.avg_last_spring_frost', 'properties.avg_first_fall_frost'])
    .where('properties.name', 'in', DEMO_PROPERTIES.map((p) => p.name))
    .execute();
  const planted = new Set(
    (await db.selectFrom('plantings').select('plot_id').where('plot_id', 'in', plots.map((p) => p.id)).execute()).map((r) => r.plot_id),
  );
  const month = Number(localDateOf(at, DEMO_PROPERTIES[0].time_zone).slice(5, 7));
  const todo = demoPlantings(demoSeasonFor(month)).filter((entry) => {
    const plot = plots.find((p) => p.property_name === entry.property && p.name === entry.plot);
    return plot && !planted.has(plot.id);
  });
  if (todo.length === 0) return;
  await assertSameDatabase(db);

  for (const entry of todo) {
    const plot = plots.find((p) => p.property_name === entry.property && p.name === entry.plot)!;
    const { form, plan } = demoPlan(entry, plot, plot, at);
    const planting = await createPlanting({ plotId: plot.id, form, plan, createdBy: userIds.manager });
    const steps = await db.selectFrom('steps').select(['id', 'kind', 'status', 'done_on']).where('planting_id', '=', planting.id).execute();
    for (const step of steps) {
      const assignee = FIELD_WORK.includes(step.kind) ? userIds.member : userIds.manager;
      await db
        .updateTable('steps')
        .set({
          assignee_id: assignee,
          ...(step.status === 'done' && step.done_on
            ? { done_by: assignee, done_at: instantOf(step.done_on, '11:00', plot.time_zone) }
            : {}),
        })
        .where('id', '=', step.id)
        .execute();
    }
  }
}

/**
 * The weather the demo's waiting planting is timed against, for the fake weather service's control API
 * (POST /_control/events): 0.75 in on the afternoon two days out at its property, then a dry week, so the
 * engine has one clear rain to move the seeding ahead of (the invented season might otherwise put another
 * rain just after the planned date, and the seeding would stay where it is).
 */
export function demoWeatherEvents(at: Date = clockNow()) {
  const property = DEMO_PROPERTIES.find((p) => p.name === 'Foxglove Hollow Lease')!;
  const place = { latitude: property.latitude, longitude: property.longitude, timeZone: property.time_zone };
  const rainDate = addDays(localDateOf(at, property.time_zone), 2);
  const rain = { kind: 'rain' as const, ...place, date: rainDate, totalMm: 19, startHour: 14, hours: 5 };
  const dry = { kind: 'dry' as const, ...place, date: addDays(rainDate, 1), days: 7 };
  return [rain, dry] as const;
}

async function main() {
  const pool = createPool();
  const db = createDb(pool);
  try {
    await loadDemo(db);
    console.log('demo club loaded (Foxglove Hollow Lease, Brindle Ridge, Willet Bottoms), with plantings at every stage');
  } finally {
    await db.destroy();
    // The plantings were saved through lib/data's process-wide pool.
    await getDb().destroy();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  main().catch((error) => {
    console.error('demo load failed:', error);
    process.exit(1);
  });
}
