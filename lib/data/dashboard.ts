import { sql } from 'kysely';
import { getDb } from '@/db';
import { calendarSteps } from '@/lib/data/calendar';
import { calendarEvents, type CalendarEvent } from '@/lib/planning/calendar-events';
import { addDays, localDateOf } from '@/lib/schedule/local-dates';
import type { StepKind } from '@/lib/schedule/types';
import { gridCellKey } from '@/lib/weather/grid';

/** How far back "moved since your last visit" looks for someone who has never opened the dashboard. */
const FIRST_VISIT_LOOKBACK_DAYS = 14;
/** This week = today and the six days after it, in each property's own zone. */
const WEEK_DAYS = 7;

export interface DashboardMove {
  id: string;
  stepId: string;
  kind: StepKind;
  stepTitle: string;
  plotId: string;
  plotName: string;
  propertyName: string;
  fromDate: string;
  toDate: string;
  reason: string;
  /** Null when the plan moved it (a new forecast), not a person. */
  movedBy: string | null;
  movedAt: string;
}

export interface GerminationDue {
  stepId: string;
  plotId: string;
  plotName: string;
  propertyName: string;
  date: string;
  /** Days past the planned check in the property's zone (0 = today). */
  daysLate: number;
}

export interface StaleForecast {
  propertyId: string;
  propertyName: string;
  failingSince: string;
  lastSuccessAt: string | null;
}

export interface Dashboard {
  /** When this answer was made: what the page reports as seen (POST /api/dashboard/visit). */
  asOf: string;
  /** The instant "moved since" counts from: the previous visit, or the first-visit lookback. */
  since: string;
  firstVisit: boolean;
  today: CalendarEvent[];
  thisWeek: CalendarEvent[];
  moves: DashboardMove[];
  germination: GerminationDue[];
  staleForecasts: StaleForecast[];
}

const iso = (v: Date | string | null) => (v === null ? null : new Date(v).toISOString());

/** The person's last recorded dashboard visit (null before the first). Reading it changes nothing. */
export async function lastDashboardVisit(userId: string): Promise<Date | null> {
  const row = await getDb().selectFrom('users').select('last_seen_at').where('id', '=', userId).executeTakeFirst();
  return row?.last_seen_at ? new Date(row.last_seen_at) : null;
}

/**
 * Marks the dashboard as seen up to `seenAt` (the instant the dashboard the person read was made). Never
 * moves backwards, so a slow tab reporting an older view cannot bring back moves already shown.
 */
export async function recordDashboardVisit(userId: string, seenAt: Date): Promise<void> {
  await getDb()
    .updateTable('users')
    .set({ last_seen_at: sql<Date>`greatest(coalesce(last_seen_at, ${seenAt}), ${seenAt})` })
    .where('id', '=', userId)
    .execute();
}

/** The local date of `now` in each zone asked for, worked out once per zone (date-fns-tz is slow per call). */
function localTodays(now: Date): (timeZone: string) => string {
  const byZone = new Map<string, string>();
  return (timeZone) => {
    let today = byZone.get(timeZone);
    if (today === undefined) byZone.set(timeZone, (today = localDateOf(now, timeZone)));
    return today;
  };
}

/** Steps of mine: assigned to me, or nobody's yet on a property where I run the work (manager or owner). */
async function myUpcomingSteps(userId: string, now: Date) {
  // Zones run from UTC−12 to UTC+14, so one UTC day either side covers every property's "today".
  const utcToday = localDateOf(now, 'UTC');
  const from = addDays(utcToday, -1);
  const to = addDays(utcToday, WEEK_DAYS + 1);
  const rows = await calendarSteps({ userId, from, to, plannedForMe: true });
  const events = calendarEvents(rows, userId, from, to);
  const localToday = localTodays(now);
  const today: CalendarEvent[] = [];
  const thisWeek: CalendarEvent[] = [];
  for (const event of events) {
    const day = localToday(event.timeZone);
    if (event.start === day) today.push(event);
    else if (event.start > day && event.start < addDays(day, WEEK_DAYS)) thisWeek.push(event);
  }
  return { today, thisWeek };
}

async function movesSince(userId: string, since: Date): Promise<DashboardMove[]> {
  const rows = await getDb()
    .selectFrom('step_moves')
    .innerJoin('steps', 'steps.id', 'step_moves.step_id')
    .innerJoin('plantings', 'plantings.id', 'steps.planting_id')
    .innerJoin('plots', 'plots.id', 'plantings.plot_id')
    .innerJoin('properties', 'properties.id', 'plots.property_id')
    .innerJoin('memberships', (join) => join.onRef('memberships.property_id', '=', 'properties.id').on('memberships.user_id', '=', userId))
    .leftJoin('users as mover', 'mover.id', 'step_moves.moved_by')
    .select([
      'step_moves.id',
      'steps.id as step_id',
      'steps.kind',
      'steps.title',
      'plots.id as plot_id',
      'plots.name as plot_name',
      'properties.name as property_name',
      'step_moves.from_date',
      'step_moves.to_date',
      'step_moves.reason',
      'mover.name as mover_name',
      'step_moves.created_at',
    ])
    .where('step_moves.created_at', '>', since)
    .orderBy('step_moves.created_at', 'desc')
    .limit(50)
    .execute();
  return rows.map((r) => ({
    id: r.id,
    stepId: r.step_id,
    kind: r.kind,
    stepTitle: r.title,
    plotId: r.plot_id,
    plotName: r.plot_name,
    propertyName: r.property_name,
    fromDate: r.from_date,
    toDate: r.to_date,
    reason: r.reason,
    movedBy: r.mover_name,
    movedAt: iso(r.created_at)!,
  }));
}

async function germinationDue(userId: string, now: Date): Promise<GerminationDue[]> {
  const rows = await getDb()
    .selectFrom('steps')
    .innerJoin('plantings', 'plantings.id', 'steps.planting_id')
    .innerJoin('plots', 'plots.id', 'plantings.plot_id')
    .innerJoin('properties', 'properties.id', 'plots.property_id')
    .innerJoin('memberships', (join) => join.onRef('memberships.property_id', '=', 'properties.id').on('memberships.user_id', '=', userId))
    .select(['steps.id as step_id', 'steps.local_date', 'plots.id as plot_id', 'plots.name as plot_name', 'properties.name as property_name', 'properties.time_zone'])
    .where('steps.kind', '=', 'check-germination')
    .where('steps.status', '=', 'planned')
    .where('steps.local_date', '<=', addDays(localDateOf(now, 'UTC'), 1))
    .orderBy('steps.local_date')
    .orderBy('plots.name')
    .execute();
  const localToday = localTodays(now);
  return rows.flatMap((r) => {
    const today = localToday(r.time_zone);
    if (r.local_date > today) return [];
    const daysLate = Math.round((Date.parse(today) - Date.parse(r.local_date)) / 86_400_000);
    return [{ stepId: r.step_id, plotId: r.plot_id, plotName: r.plot_name, propertyName: r.property_name, date: r.local_date, daysLate }];
  });
}

async function staleForecasts(userId: string): Promise<StaleForecast[]> {
  const properties = await getDb()
    .selectFrom('properties')
    .innerJoin('memberships', 'memberships.property_id', 'properties.id')
    .select(['properties.id', 'properties.name', 'properties.latitude', 'properties.longitude'])
    .where('memberships.user_id', '=', userId)
    .orderBy('properties.name')
    .execute();
  if (!properties.length) return [];
  const keyOf = new Map(properties.map((p) => [p.id, gridCellKey(p.latitude, p.longitude)]));
  const failing = await getDb()
    .selectFrom('forecast_status')
    .select(['grid_key', 'failing_since', 'last_success_at'])
    .where('grid_key', 'in', [...new Set(keyOf.values())])
    .where('failing_since', 'is not', null)
    .execute();
  const byKey = new Map(failing.map((f) => [f.grid_key, f]));
  return properties.flatMap((p) => {
    const status = byKey.get(keyOf.get(p.id)!);
    return status ? [{ propertyId: p.id, propertyName: p.name, failingSince: iso(status.failing_since)!, lastSuccessAt: iso(status.last_success_at) }] : [];
  });
}

/**
 * What a person should see first after signing in. Side-effect free: the page marks it seen afterwards with
 * POST /api/dashboard/visit and `asOf`, so a GET from a link on another site changes nothing.
 */
export async function dashboardFor(userId: string, now: Date): Promise<Dashboard> {
  const previousVisit = await lastDashboardVisit(userId);
  const since = previousVisit ?? new Date(now.getTime() - FIRST_VISIT_LOOKBACK_DAYS * 86_400_000);
  const [{ today, thisWeek }, moves, germination, stale] = await Promise.all([
    myUpcomingSteps(userId, now),
    movesSince(userId, since),
    germinationDue(userId, now),
    staleForecasts(userId),
  ]);
  return { asOf: now.toISOString(), since: since.toISOString(), firstVisit: previousVisit === null, today, thisWeek, moves, germination, staleForecasts: stale };
}
