import { getSpecies } from '@/lib/agronomy/species';
import type { MyStepRow } from '@/lib/data/my-steps';
import { addDays, localDateOf } from '@/lib/schedule/local-dates';
import { expandRecurrence } from '@/lib/schedule/rules/upkeep';
import type { Caution, Quantity, StepKind, StepStatus } from '@/lib/schedule/types';
import { roleAtLeast } from '@/lib/validations/membership';
import { SEED_RECORD_KINDS } from '@/lib/validations/step';

/** How far ahead the phone list looks, in each property's own days (the "next days": two weeks). */
export const MY_STEPS_HORIZON_DAYS = 14;
/** This week = today and the six days after it, as on the dashboard. */
const WEEK_DAYS = 7;
/** Steps done today or yesterday (local) still show, so the person sees what went in. */
export const DONE_LOOKBACK_DAYS = 1;

export const MY_STEP_GROUPS = ['overdue', 'today', 'tomorrow', 'this-week', 'later', 'recorded'] as const;
export type MyStepGroup = (typeof MY_STEP_GROUPS)[number];

export const MY_STEP_GROUP_TITLES: Record<MyStepGroup, string> = {
  overdue: 'Overdue',
  today: 'Today',
  tomorrow: 'Tomorrow',
  'this-week': 'This week',
  later: 'Later (next 14 days)',
  recorded: 'Done today and yesterday',
};

export interface SeedPart {
  speciesId: string;
  name: string;
  plannedLb: number | null;
}

export interface MyStep {
  /** The step id, or `${stepId}:${date}` for one occurrence of recurring upkeep. */
  id: string;
  stepId: string;
  group: MyStepGroup;
  kind: StepKind;
  title: string;
  /** Local date in the property's zone. */
  date: string;
  /** Today in the property's zone, when this answer was made. */
  today: string;
  /** Days from today (negative: overdue). */
  inDays: number;
  status: StepStatus;
  pinned: boolean;
  hours: { start: string; end: string } | null;
  /** Local 'HH:mm' of a recurring occurrence. */
  clock?: string;
  recurring: boolean;
  quantities: Quantity[];
  cautions: Caution[];
  reason: string;
  warnings: string[];
  notes: string | null;
  doneOn: string | null;
  doneAt: string | null;
  doneBy: string | null;
  record: unknown;
  assigneeId: string | null;
  assigneeName: string | null;
  plantingId: string;
  plotId: string;
  plotName: string;
  acres: number;
  propertyId: string;
  propertyName: string;
  timeZone: string;
  /** Whether this person may mark it done or skipped here (members and up; a recurring occurrence has no single outcome). */
  canComplete: boolean;
  /** The seed planned for a seeding, total and per species, to start the record of what was broadcast from. */
  seed: { plannedLb: number | null; parts: SeedPart[] } | null;
}

function seedPlan(row: MyStepRow): MyStep['seed'] {
  if (!(SEED_RECORD_KINDS as readonly string[]).includes(row.kind)) return null;
  const total = row.quantities.find((q) => q.item === 'seed' && q.unit === 'lb');
  const parts = (row.blend ?? []).flatMap((part) => {
    try {
      const species = getSpecies(part.speciesId);
      const planned = row.quantities.find((q) => q.item === species.name && q.unit === 'lb');
      return [{ speciesId: species.id, name: species.name, plannedLb: planned?.amount ?? null }];
    } catch {
      return []; // a species the catalog no longer has cannot be recorded by name
    }
  });
  return { plannedLb: total?.amount ?? null, parts };
}

const dayDiff = (from: string, to: string) => Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000);

function groupOf(inDays: number): MyStepGroup | null {
  if (inDays < 0) return 'overdue';
  if (inDays === 0) return 'today';
  if (inDays === 1) return 'tomorrow';
  if (inDays < WEEK_DAYS) return 'this-week';
  if (inDays <= MY_STEPS_HORIZON_DAYS) return 'later';
  return null;
}

/**
 * The phone list: each step placed by its own property's today — overdue first, then today, tomorrow, the
 * rest of the week and the days after, up to two weeks out; steps done today and yesterday at the end.
 */
export function mySteps(rows: MyStepRow[], now: Date): MyStep[] {
  const out: MyStep[] = [];
  for (const row of rows) {
    const today = localDateOf(now, row.time_zone);
    const base = {
      stepId: row.step_id,
      kind: row.kind,
      title: row.title,
      today,
      status: row.status,
      pinned: row.pinned,
      hours: row.hours,
      quantities: row.quantities,
      cautions: row.cautions,
      reason: row.reason,
      warnings: row.warnings,
      notes: row.notes,
      doneOn: row.done_on,
      doneAt: row.done_at ? new Date(row.done_at).toISOString() : null,
      doneBy: row.done_by_name,
      record: row.done_record ?? null,
      assigneeId: row.assignee_id,
      assigneeName: row.assignee_name,
      plantingId: row.planting_id,
      plotId: row.plot_id,
      plotName: row.plot_name,
      acres: row.acres,
      propertyId: row.property_id,
      propertyName: row.property_name,
      timeZone: row.time_zone,
      seed: seedPlan(row),
    };
    if (row.status !== 'planned') {
      if (row.status !== 'done' || !row.done_on || row.done_on < addDays(today, -DONE_LOOKBACK_DAYS)) continue;
      out.push({ ...base, id: row.step_id, group: 'recorded', date: row.local_date, inDays: dayDiff(today, row.local_date), recurring: false, canComplete: false });
      continue;
    }
    if (row.recurrence) {
      for (const occurrence of expandRecurrence(row.recurrence, today, addDays(today, MY_STEPS_HORIZON_DAYS))) {
        const inDays = dayDiff(today, occurrence.date);
        const group = groupOf(inDays);
        if (!group) continue;
        out.push({ ...base, id: `${row.step_id}:${occurrence.date}`, group, date: occurrence.date, inDays, clock: occurrence.clock, recurring: true, canComplete: false });
      }
      continue;
    }
    const inDays = dayDiff(today, row.local_date);
    const group = groupOf(inDays);
    if (!group) continue;
    out.push({ ...base, id: row.step_id, group, date: row.local_date, inDays, recurring: false, canComplete: roleAtLeast(row.role, 'member') });
  }
  const order = (g: MyStepGroup) => MY_STEP_GROUPS.indexOf(g);
  const position = new Map(rows.map((r) => [r.step_id, r.position]));
  return out.sort(
    (a, b) =>
      order(a.group) - order(b.group) ||
      // What is still to do reads soonest first; what was done, latest first.
      (a.date < b.date ? -1 : a.date > b.date ? 1 : 0) * (a.group === 'recorded' ? -1 : 1) ||
      a.plotName.localeCompare(b.plotName) ||
      a.plantingId.localeCompare(b.plantingId) ||
      position.get(a.stepId)! - position.get(b.stepId)!,
  );
}
