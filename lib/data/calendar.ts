import { getDb } from '@/db';
import type { PropertyRole, StepKindColumn } from '@/db/database';

export interface CalendarStepRow {
  step_id: string;
  key: string;
  kind: StepKindColumn;
  title: string;
  local_date: string;
  /** The step's place in its planting's plan (plan order: by date, then the method's order). */
  position: number;
  status: 'planned' | 'done' | 'skipped';
  pinned: boolean;
  recurrence: string | null;
  assignee_id: string | null;
  assignee_name: string | null;
  planting_id: string;
  plot_id: string;
  plot_name: string;
  property_id: string;
  property_name: string;
  time_zone: string;
  role: PropertyRole;
}

/**
 * Steps of every plot the user belongs to (any role) that can fall in [from, to] — local dates in each
 * property's own zone, so no conversion happens here. A recurring step is returned when its first
 * occurrence is on or before `to`; the caller expands it. Filters narrow; an id the user cannot see just
 * matches nothing.
 */
export async function calendarSteps(o: {
  userId: string;
  from: string;
  to: string;
  propertyId?: string;
  plotId?: string;
  kind?: StepKindColumn;
  assigneeId?: string;
  /**
   * Only the planned steps that are this person's to do: given to them, or given to nobody on a property
   * where they are manager or owner (the dashboard's "my steps").
   */
  plannedForMe?: boolean;
}): Promise<CalendarStepRow[]> {
  let query = getDb()
    .selectFrom('steps')
    .innerJoin('plantings', 'plantings.id', 'steps.planting_id')
    .innerJoin('plots', 'plots.id', 'plantings.plot_id')
    .innerJoin('properties', 'properties.id', 'plots.property_id')
    .innerJoin('memberships', (join) => join.onRef('memberships.property_id', '=', 'properties.id').on('memberships.user_id', '=', o.userId))
    .leftJoin('users as assignee', 'assignee.id', 'steps.assignee_id')
    .select([
      'steps.id as step_id',
      'steps.key',
      'steps.kind',
      'steps.title',
      'steps.local_date',
      'steps.position',
      'steps.status',
      'steps.pinned',
      'steps.recurrence',
      'steps.assignee_id',
      'assignee.name as assignee_name',
      'plantings.id as planting_id',
      'plots.id as plot_id',
      'plots.name as plot_name',
      'properties.id as property_id',
      'properties.name as property_name',
      'properties.time_zone',
      'memberships.role',
    ])
    .where('steps.local_date', '<=', o.to)
    .where((eb) => eb.or([eb('steps.local_date', '>=', o.from), eb('steps.recurrence', 'is not', null)]));
  if (o.propertyId) query = query.where('properties.id', '=', o.propertyId);
  if (o.plotId) query = query.where('plots.id', '=', o.plotId);
  if (o.kind) query = query.where('steps.kind', '=', o.kind);
  if (o.assigneeId) query = query.where('steps.assignee_id', '=', o.assigneeId);
  if (o.plannedForMe) {
    query = query
      .where('steps.status', '=', 'planned')
      .where((eb) =>
        eb.or([
          eb('steps.assignee_id', '=', o.userId),
          eb.and([eb('steps.assignee_id', 'is', null), eb('memberships.role', 'in', ['manager', 'owner'])]),
        ]),
      );
  }
  return query.orderBy('steps.local_date').orderBy('plots.name').orderBy('steps.position').execute();
}
