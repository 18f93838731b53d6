import { sql } from 'kysely';
import { getDb } from '@/db';
import type { PlantingMethodColumn, PropertyRole, StepKindColumn } from '@/db/database';
import type { BlendPart } from '@/lib/agronomy/species';
import type { Caution, Quantity } from '@/lib/schedule/types';

export interface MyStepRow {
  step_id: string;
  kind: StepKindColumn;
  title: string;
  local_date: string;
  position: number;
  status: 'planned' | 'done' | 'skipped';
  pinned: boolean;
  recurrence: string | null;
  hours: { start: string; end: string } | null;
  quantities: Quantity[];
  cautions: Caution[];
  reason: string;
  warnings: string[];
  notes: string | null;
  done_on: string | null;
  done_at: Date | null;
  done_by_name: string | null;
  done_record: unknown;
  assignee_id: string | null;
  assignee_name: string | null;
  planting_id: string;
  method: PlantingMethodColumn;
  blend: BlendPart[] | null;
  plot_id: string;
  plot_name: string;
  acres: number;
  property_id: string;
  property_name: string;
  time_zone: string;
  role: PropertyRole;
}

/**
 * The steps that are a person's to do, on every property they belong to: the ones given to them, and the ones
 * given to nobody yet where they may work (member and up). Planned steps up to `to` (a local date; every
 * earlier one too, so nothing overdue is forgotten), recurring upkeep (the caller expands it), and steps
 * done on or after `doneFrom` (a local date). Local dates are each property's own; no conversion here.
 */
export async function myStepRows(o: { userId: string; to: string; doneFrom: string }): Promise<MyStepRow[]> {
  const rows = await getDb()
    .selectFrom('steps')
    .innerJoin('plantings', 'plantings.id', 'steps.planting_id')
    .innerJoin('plots', 'plots.id', 'plantings.plot_id')
    .innerJoin('properties', 'properties.id', 'plots.property_id')
    .innerJoin('memberships', (join) => join.onRef('memberships.property_id', '=', 'properties.id').on('memberships.user_id', '=', o.userId))
    .leftJoin('users as assignee', 'assignee.id', 'steps.assignee_id')
    .leftJoin('users as doer', 'doer.id', 'steps.done_by')
    .select([
      'steps.id as step_id',
      'steps.kind',
      'steps.title',
      'steps.local_date',
      'steps.position',
      'steps.status',
      'steps.pinned',
      'steps.recurrence',
      'steps.hours',
      'steps.quantities',
      'steps.cautions',
      'steps.reason',
      'steps.warnings',
      'steps.notes',
      'steps.done_on',
      'steps.done_at',
      'doer.name as done_by_name',
      'steps.done_record',
      'steps.assignee_id',
      'assignee.name as assignee_name',
      'plantings.id as planting_id',
      'plantings.method',
      sql<BlendPart[] | null>`plantings.input -> 'blend'`.as('blend'),
      'plots.id as plot_id',
      'plots.name as plot_name',
      'plots.acres',
      'properties.id as property_id',
      'properties.name as property_name',
      'properties.time_zone',
      'memberships.role',
    ])
    .where('plantings.status', '=', 'active')
    .where((eb) =>
      eb.or([
        eb('steps.assignee_id', '=', o.userId),
        eb.and([eb('steps.assignee_id', 'is', null), eb('memberships.role', 'in', ['member', 'manager', 'owner'])]),
      ]),
    )
    .where((eb) =>
      eb.or([
        eb.and([eb('steps.status', '=', 'planned'), eb.or([eb('steps.local_date', '<=', o.to), eb('steps.recurrence', 'is not', null)])]),
        eb.and([eb('steps.status', '=', 'done'), eb('steps.done_on', '>=', o.doneFrom)]),
      ]),
    )
    .orderBy('steps.local_date')
    .orderBy('plots.name')
    .orderBy('steps.position')
    .execute();
  return rows.map((r) => ({
    ...r,
    acres: Number(r.acres),
    hours: (r.hours as MyStepRow['hours']) ?? null,
    quantities: r.quantities as Quantity[],
    cautions: r.cautions as Caution[],
    warnings: r.warnings as string[],
  }));
}
