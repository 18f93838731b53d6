// What the worker reads to decide who is told what: the steps around today and the people of their
// properties, with their settings and whether they have a phone registered.
import type { Kysely, Transaction } from 'kysely';
import { getDb } from '@/db';
import type { Database } from '@/db/database';
import type { Membership, Person, ReminderStep } from '@/lib/notify/reminders';
import type { Caution, Quantity } from '@/lib/schedule/types';
import { settingsFor } from './notification-settings';

type Db = Kysely<Database> | Transaction<Database>;

const DAY_MS = 86_400_000;
const utcDate = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/**
 * Every step of the active plantings that have a step within two days of `now` (wide enough for any zone's
 * yesterday, today and tomorrow; the pure reminder rules narrow it to the property's own dates).
 */
export async function reminderSteps(now: Date, db: Db = getDb()): Promise<ReminderStep[]> {
  const from = utcDate(now.getTime() - 2 * DAY_MS);
  const to = utcDate(now.getTime() + 2 * DAY_MS);
  const rows = await db
    .selectFrom('steps')
    .innerJoin('plantings', 'plantings.id', 'steps.planting_id')
    .innerJoin('plots', 'plots.id', 'plantings.plot_id')
    .innerJoin('properties', 'properties.id', 'plots.property_id')
    .select([
      'steps.id',
      'steps.planting_id',
      'steps.key',
      'steps.kind',
      'steps.title',
      'steps.local_date',
      'steps.status',
      'steps.done_on',
      'steps.assignee_id',
      'steps.hours',
      'steps.quantities',
      'steps.cautions',
      'steps.reason',
      'steps.warnings',
      'plots.id as plot_id',
      'plots.name as plot_name',
      'properties.id as property_id',
      'properties.name as property_name',
      'properties.time_zone',
    ])
    .where('plantings.status', '=', 'active')
    .where('steps.planting_id', 'in', (eb) =>
      eb.selectFrom('steps as near').select('near.planting_id').where('near.local_date', '>=', from).where('near.local_date', '<=', to),
    )
    .orderBy('steps.planting_id')
    .orderBy('steps.position')
    .execute();
  return rows.map((r) => ({
    stepId: r.id,
    plantingId: r.planting_id,
    key: r.key,
    kind: r.kind,
    title: r.title,
    date: r.local_date,
    status: r.status,
    doneOn: r.done_on,
    assigneeId: r.assignee_id,
    hours: (r.hours as ReminderStep['hours']) ?? null,
    carry: ((r.quantities as Quantity[] | null) ?? []).map((q) => q.detail),
    cautions: ((r.cautions as Caution[] | null) ?? []).map((c) => c.text),
    reason: r.reason,
    warnings: (r.warnings as string[] | null) ?? [],
    plotId: r.plot_id,
    plotName: r.plot_name,
    propertyId: r.property_id,
    propertyName: r.property_name,
    timeZone: r.time_zone,
  }));
}

/** The members of these properties and, for each person, what and where Sowcast may send them. */
export async function notificationAudience(propertyIds: string[], db: Db = getDb()): Promise<{ people: Person[]; memberships: Membership[] }> {
  if (!propertyIds.length) return { people: [], memberships: [] };
  const memberships = await db
    .selectFrom('memberships')
    .select(['property_id', 'user_id', 'role'])
    .where('property_id', 'in', propertyIds)
    .execute();
  const userIds = [...new Set(memberships.map((m) => m.user_id))];
  if (!userIds.length) return { people: [], memberships: [] };
  const [users, settings, devices, homes] = await Promise.all([
    db.selectFrom('users').select(['id', 'email']).where('id', 'in', userIds).execute(),
    settingsFor(userIds),
    db.selectFrom('push_subscriptions').select('user_id').distinct().where('user_id', 'in', userIds).execute(),
    // A person's first property sets the clock of their morning digest.
    db
      .selectFrom('memberships')
      .innerJoin('properties', 'properties.id', 'memberships.property_id')
      .select(['memberships.user_id', 'properties.time_zone'])
      .distinctOn('memberships.user_id')
      .where('memberships.user_id', 'in', userIds)
      .orderBy('memberships.user_id')
      .orderBy('memberships.created_at')
      .execute(),
  ]);
  const withDevice = new Set(devices.map((d) => d.user_id));
  const home = new Map(homes.map((h) => [h.user_id, h.time_zone]));
  return {
    memberships: memberships.map((m) => ({ propertyId: m.property_id, userId: m.user_id, role: m.role })),
    people: users.map((u) => ({
      userId: u.id,
      email: u.email,
      settings: settings.get(u.id)!,
      hasPushDevices: withDevice.has(u.id),
      homeTimeZone: home.get(u.id) ?? null,
    })),
  };
}

export async function userEmail(userId: string): Promise<string | null> {
  const row = await getDb().selectFrom('users').select('email').where('id', '=', userId).executeTakeFirst();
  return row?.email ?? null;
}
