import bcrypt from 'bcryptjs';
import type { Kysely } from 'kysely';
import { createDb, createPool } from './index';
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

/** Loads the demo club. Idempotent: users match by e-mail, properties by name, plots by (property, name). */
export async function loadDemo(db: Kysely<Database>) {
  const userIds: Record<string, string> = {};
  for (const u of demoUsers.users) {
    const existing = await db.selectFrom('users').select('id').where('email', '=', u.email).executeTakeFirst();
    if (existing) {
      userIds[u.role] = existing.id;
      continue;
    }
    const row = await db
      .insertInto('users')
      .values({ email: u.email, name: u.name, password_hash: await bcrypt.hash(u.password, 10) })
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
  return userIds;
}

async function main() {
  const pool = createPool();
  const db = createDb(pool);
  try {
    await loadDemo(db);
    console.log('demo club loaded (Foxglove Hollow Lease, Brindle Ridge, Willet Bottoms)');
  } finally {
    await db.destroy();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  main().catch((error) => {
    console.error('demo load failed:', error);
    process.exit(1);
  });
}
