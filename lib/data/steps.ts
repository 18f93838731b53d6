import type { Selectable, Transaction } from 'kysely';
import { getDb } from '@/db';
import type { Database, PlantingsTable } from '@/db/database';
import { toStepDto, type StepDto } from '@/lib/data/plantings';
import { roleAtLeast, type Role } from '@/lib/validations/membership';

export interface PlantingDto {
  id: string;
  plotId: string;
  season: 'spring' | 'fall';
  year: number;
  method: Selectable<PlantingsTable>['method'];
  status: Selectable<PlantingsTable>['status'];
  targetSeedDate: string;
  readyBy: string | null;
  /** The planner form as it was saved (the shared planting schema's shape). */
  input: unknown;
  warnings: string[];
  createdBy: string | null;
  createdAt: string;
  updatedAt: string;
}

export function toPlantingDto(row: Selectable<PlantingsTable>): PlantingDto {
  return {
    id: row.id,
    plotId: row.plot_id,
    season: row.season,
    year: row.year,
    method: row.method,
    status: row.status,
    targetSeedDate: row.target_seed_date,
    readyBy: row.ready_by,
    input: row.input,
    warnings: (row.warnings as string[]) ?? [],
    createdBy: row.created_by,
    createdAt: new Date(row.created_at).toISOString(),
    updatedAt: new Date(row.updated_at).toISOString(),
  };
}

/** Every planting of a plot with its steps, newest season first, in two queries. */
export async function listPlantingsWithSteps(plotId: string): Promise<(PlantingDto & { steps: StepDto[] })[]> {
  const db = getDb();
  const plantings = await db.selectFrom('plantings').selectAll().where('plot_id', '=', plotId).orderBy('target_seed_date', 'desc').orderBy('created_at', 'desc').execute();
  if (!plantings.length) return [];
  const steps = await db
    .selectFrom('steps')
    .selectAll()
    .where('planting_id', 'in', plantings.map((p) => p.id))
    .orderBy('planting_id')
    .orderBy('position')
    .execute();
  const byPlanting = new Map<string, StepDto[]>();
  for (const row of steps) {
    const list = byPlanting.get(row.planting_id) ?? [];
    list.push(toStepDto(row));
    byPlanting.set(row.planting_id, list);
  }
  return plantings.map((p) => ({ ...toPlantingDto(p), steps: byPlanting.get(p.id) ?? [] }));
}

/** A planting with the property it belongs to (access checks go through the property). */
export async function getPlantingWithPlace(plantingId: string) {
  return getDb()
    .selectFrom('plantings')
    .innerJoin('plots', 'plots.id', 'plantings.plot_id')
    .selectAll('plantings')
    .select(['plots.property_id'])
    .where('plantings.id', '=', plantingId)
    .executeTakeFirst();
}

export async function deletePlanting(plantingId: string) {
  await getDb().deleteFrom('plantings').where('id', '=', plantingId).execute();
}

/** One step with the names a person needs to read it: planting, plot, property, zone and assignee. */
export async function getStepDetail(stepId: string) {
  return getDb()
    .selectFrom('steps')
    .innerJoin('plantings', 'plantings.id', 'steps.planting_id')
    .innerJoin('plots', 'plots.id', 'plantings.plot_id')
    .innerJoin('properties', 'properties.id', 'plots.property_id')
    .leftJoin('users as assignee', 'assignee.id', 'steps.assignee_id')
    .selectAll('steps')
    .select([
      'plantings.season as planting_season',
      'plantings.year as planting_year',
      'plantings.method as planting_method',
      'plantings.status as planting_status',
      'plots.id as plot_id',
      'plots.name as plot_name',
      'properties.id as property_id',
      'properties.name as property_name',
      'properties.time_zone as time_zone',
      'assignee.name as assignee_name',
    ])
    .where('steps.id', '=', stepId)
    .executeTakeFirst();
}

export interface StepMoveDto {
  id: string;
  from: string;
  to: string;
  reason: string;
  /** null when the engine moved it (a new forecast, a step before it done on another day). */
  movedBy: { id: string; name: string } | null;
  forecastFetchedAt: string | null;
  at: string;
}

/** A step's history of moves, oldest first, with who moved it. */
export async function listStepMovesWithPeople(stepId: string): Promise<StepMoveDto[]> {
  const rows = await getDb()
    .selectFrom('step_moves')
    .leftJoin('users', 'users.id', 'step_moves.moved_by')
    .selectAll('step_moves')
    .select('users.name as moved_by_name')
    .where('step_moves.step_id', '=', stepId)
    .orderBy('step_moves.created_at')
    .orderBy('step_moves.id')
    .execute();
  return rows.map((r) => ({
    id: r.id,
    from: r.from_date,
    to: r.to_date,
    reason: r.reason,
    movedBy: r.moved_by ? { id: r.moved_by, name: r.moved_by_name ?? '' } : null,
    forecastFetchedAt: r.forecast_fetched_at ? new Date(r.forecast_fetched_at).toISOString() : null,
    at: new Date(r.created_at).toISOString(),
  }));
}

/** Whether a user holds at least `needed` on a property (who may be given work). */
export async function hasRoleAtLeast(propertyId: string, userId: string, needed: Role): Promise<boolean> {
  const row = await getDb()
    .selectFrom('memberships')
    .select('role')
    .where('property_id', '=', propertyId)
    .where('user_id', '=', userId)
    .executeTakeFirst();
  return !!row && roleAtLeast(row.role, needed);
}

/** Sets a step's assignee and/or pin, in the caller's transaction. */
export async function updateStepFields(trx: Transaction<Database>, stepId: string, fields: { assigneeId?: string | null; pinned?: boolean }, at: Date) {
  await trx
    .updateTable('steps')
    .set({
      ...(fields.assigneeId !== undefined ? { assignee_id: fields.assigneeId } : {}),
      ...(fields.pinned !== undefined ? { pinned: fields.pinned } : {}),
      updated_at: at,
    })
    .where('id', '=', stepId)
    .execute();
}

/** A step's row, locked for the caller's transaction. */
export async function lockStep(trx: Transaction<Database>, stepId: string) {
  return trx.selectFrom('steps').selectAll().where('id', '=', stepId).forNoKeyUpdate().executeTakeFirst();
}

/** Puts a step on a person's chosen day and pins it there, keeping the move as history. */
export async function pinStepToDate(
  trx: Transaction<Database>,
  o: { stepId: string; from: string; to: string; reason: string; movedBy: string; forecastFetchedAt: string | null; at: Date },
) {
  await trx.updateTable('steps').set({ local_date: o.to, pinned: true, updated_at: o.at }).where('id', '=', o.stepId).execute();
  if (o.from !== o.to) {
    await trx
      .insertInto('step_moves')
      .values({ step_id: o.stepId, from_date: o.from, to_date: o.to, reason: o.reason, moved_by: o.movedBy, forecast_fetched_at: o.forecastFetchedAt })
      .execute();
  }
}
