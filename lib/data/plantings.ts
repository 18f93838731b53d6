import { isDeepStrictEqual } from 'node:util';
import { sql, type Kysely, type Selectable, type Transaction } from 'kysely';
import { getDb } from '@/db';
import type { Database, PlantingsTable, StepsTable } from '@/db/database';
import type { Plan, PlanStep, StepChange } from '@/lib/schedule/types';
import type { PlantingFormInput } from '@/lib/validations/planting';

type StepRow = Selectable<StepsTable>;
type Db = Kysely<Database> | Transaction<Database>;

/** Runs `fn` in the caller's transaction when given one, else in a new one. */
function inTransaction<T>(db: Db, fn: (trx: Transaction<Database>) => Promise<T>): Promise<T> {
  return db.isTransaction ? fn(db as Transaction<Database>) : db.transaction().execute(fn);
}

function stepColumns(step: PlanStep, position: number) {
  return {
    key: step.key,
    kind: step.kind,
    title: step.title,
    position,
    local_date: step.date,
    window_start: step.window?.earliest ?? null,
    window_end: step.window?.latest ?? null,
    hours: step.hours ? JSON.stringify(step.hours) : null,
    pinned: step.pinned,
    status: step.status,
    done_on: step.doneOn ?? null,
    after: JSON.stringify(step.after),
    quantities: JSON.stringify(step.quantities),
    cautions: JSON.stringify(step.cautions),
    rules: JSON.stringify(step.rules),
    warnings: JSON.stringify(step.warnings),
    reason: step.reason,
    recurrence: step.recurrence ?? null,
  };
}

/** A stored step as the engine sees it. */
export function rowToPlanStep(row: StepRow): PlanStep {
  return {
    key: row.key,
    kind: row.kind,
    title: row.title,
    date: row.local_date,
    window: row.window_start && row.window_end ? { earliest: row.window_start, latest: row.window_end } : null,
    hours: (row.hours as PlanStep['hours']) ?? null,
    status: row.status,
    pinned: row.pinned,
    doneOn: row.done_on,
    after: row.after as string[],
    quantities: row.quantities as PlanStep['quantities'],
    cautions: row.cautions as PlanStep['cautions'],
    reason: row.reason,
    rules: row.rules as PlanStep['rules'],
    warnings: row.warnings as string[],
    recurrence: row.recurrence,
  };
}

/** Saves a new planting and its planned steps in one transaction. */
export async function createPlanting(o: { plotId: string; form: PlantingFormInput; plan: Plan; createdBy: string | null }) {
  return getDb()
    .transaction()
    .execute(async (trx) => {
      const planting = await trx
        .insertInto('plantings')
        .values({
          plot_id: o.plotId,
          season: o.form.season,
          year: Number(o.form.targetSeedDate.slice(0, 4)),
          method: o.form.method,
          target_seed_date: o.form.targetSeedDate,
          ready_by: o.form.readyBy ?? null,
          input: JSON.stringify(o.form),
          warnings: JSON.stringify(o.plan.warnings),
          created_by: o.createdBy,
        })
        .returningAll()
        .executeTakeFirstOrThrow();
      if (o.plan.steps.length) {
        await trx
          .insertInto('steps')
          .values(o.plan.steps.map((step, i) => ({ planting_id: planting.id, ...stepColumns(step, i) })))
          .execute();
      }
      return planting;
    });
}

export async function getPlanting(id: string, db: Db = getDb()) {
  return db.selectFrom('plantings').selectAll().where('id', '=', id).executeTakeFirst();
}

export async function listPlantingsForPlot(plotId: string) {
  return getDb().selectFrom('plantings').selectAll().where('plot_id', '=', plotId).orderBy('target_seed_date', 'desc').execute();
}

export async function getStepRow(stepId: string, db: Db = getDb()) {
  return db.selectFrom('steps').selectAll().where('id', '=', stepId).executeTakeFirstOrThrow();
}

export async function getStepRows(plantingId: string, db: Db = getDb()) {
  return db.selectFrom('steps').selectAll().where('planting_id', '=', plantingId).orderBy('position').execute();
}

/** The stored plan of a planting, as the engine's `replan` takes it. */
export async function loadPlan(plantingId: string, db: Db = getDb()): Promise<Plan> {
  const [planting, rows] = await Promise.all([getPlanting(plantingId, db), getStepRows(plantingId, db)]);
  return {
    steps: rows.map(rowToPlanStep),
    warnings: (planting?.warnings as string[] | undefined) ?? [],
    forecastThrough: null,
  };
}

type StepColumns = ReturnType<typeof stepColumns>;

// What a replan may change on a planned step (status, done_on and pinned belong to people, never to a
// replan; the key is how the step is found). A Record, so a column added to stepColumns cannot be left out
// of the comparison without the compiler saying so.
type ReplannedColumn = Exclude<keyof StepColumns, 'key' | 'status' | 'done_on' | 'pinned'>;
const REPLANNED: Record<ReplannedColumn, 'value' | 'json'> = {
  kind: 'value',
  title: 'value',
  position: 'value',
  local_date: 'value',
  window_start: 'value',
  window_end: 'value',
  hours: 'json',
  after: 'json',
  quantities: 'json',
  cautions: 'json',
  rules: 'json',
  warnings: 'json',
  reason: 'value',
  recurrence: 'value',
};
const REPLANNED_COLUMNS = Object.entries(REPLANNED) as [ReplannedColumn, 'value' | 'json'][];

/**
 * True when the stored row already holds what the plan says. jsonb keeps neither key order nor spacing, so
 * JSON columns are compared as values (the new text parsed back), not as text. A false "changed" only costs
 * a write; the comparison is exact for everything jsonb stores.
 */
function sameAsStored(row: StepRow, columns: StepColumns): boolean {
  for (const [name, how] of REPLANNED_COLUMNS) {
    const next = columns[name];
    const stored = row[name] ?? null;
    if (how === 'value' ? stored !== next : !isDeepStrictEqual(stored, next === null ? null : JSON.parse(next as string))) return false;
  }
  return true;
}

/**
 * Writes a replanned plan: steps updated by key (done steps keep their record), new steps added, steps the
 * plan no longer has removed unless done, and one history row per move with its reason.
 * Returns the moves written, each with the step id.
 *
 * A replan usually moves one or two of a planting's ~25 steps, and the worker writes thousands of plantings
 * a cycle: so only steps whose columns differ from the stored row are written (an unchanged step also keeps
 * its updated_at, which the calendar feed's SEQUENCE and LAST-MODIFIED follow), and each kind of write is
 * one statement, whatever the number of steps.
 */
export async function saveReplan(
  o: {
    plantingId: string;
    plan: Plan;
    changes: StepChange[];
    movedBy: string | null;
    forecastFetchedAt: string | null;
  },
  db: Db = getDb(),
) {
  return inTransaction(db, async (trx) => {
    // FOR NO KEY UPDATE, not FOR UPDATE: a worker inserting notifications for these steps holds the foreign
    // key's KEY SHARE lock on them, which FOR UPDATE would wait for (and, with that worker waiting for this
    // planting, deadlock). Step ids never change here, so the weaker lock is enough.
    const existing = await trx.selectFrom('steps').selectAll().where('planting_id', '=', o.plantingId).forNoKeyUpdate().execute();
    const byKey = new Map(existing.map((row) => [row.key, row]));
    const keep = new Set(o.plan.steps.map((s) => s.key));
    const ids = new Map<string, string>();
    const added: (StepColumns & { planting_id: string })[] = [];
    const changed: { id: string; columns: StepColumns }[] = [];
    for (const [position, step] of o.plan.steps.entries()) {
      const row = byKey.get(step.key);
      const columns = stepColumns(step, position);
      if (!row) {
        added.push({ planting_id: o.plantingId, ...columns });
        continue;
      }
      ids.set(step.key, row.id);
      if (row.status !== 'planned') continue; // done and skipped steps are records, not plans
      if (!sameAsStored(row, columns)) changed.push({ id: row.id, columns });
    }
    if (added.length) {
      const inserted = await trx.insertInto('steps').values(added).returning(['id', 'key']).execute();
      for (const row of inserted) ids.set(row.key, row.id);
    }
    if (changed.length) {
      // One UPDATE for every changed step. VALUES has no column types of its own, so each value is cast to
      // its column's type (the first row would otherwise fix them as text).
      const updatedAt = new Date();
      const rows = changed.map(({ id, columns: c }) =>
        sql`(${id}::uuid, ${c.kind}::step_kind, ${c.title}, ${c.position}::integer, ${c.local_date}::date, ${c.window_start}::date, ${c.window_end}::date, ${c.hours}::jsonb, ${c.after}::jsonb, ${c.quantities}::jsonb, ${c.cautions}::jsonb, ${c.rules}::jsonb, ${c.warnings}::jsonb, ${c.reason}, ${c.recurrence})`,
      );
      await sql`
        update steps set
          kind = v.kind, title = v.title, "position" = v."position", local_date = v.local_date,
          window_start = v.window_start, window_end = v.window_end, hours = v.hours, "after" = v."after",
          quantities = v.quantities, cautions = v.cautions, rules = v.rules, warnings = v.warnings,
          reason = v.reason, recurrence = v.recurrence, updated_at = ${updatedAt}::timestamptz
        from (values ${sql.join(rows)}) as v(id, kind, title, "position", local_date, window_start, window_end, hours, "after", quantities, cautions, rules, warnings, reason, recurrence)
        where steps.id = v.id and steps.planting_id = ${o.plantingId}::uuid
      `.execute(trx);
    }
    const gone = existing.filter((row) => !keep.has(row.key) && row.status === 'planned').map((row) => row.id);
    if (gone.length) await trx.deleteFrom('steps').where('id', 'in', gone).execute();
    await trx
      .updateTable('plantings')
      .set({ warnings: JSON.stringify(o.plan.warnings), updated_at: new Date() })
      .where('id', '=', o.plantingId)
      .execute();

    const moves = o.changes
      .filter((change) => ids.has(change.key))
      .map((change) => ({
        step_id: ids.get(change.key)!,
        from_date: change.from,
        to_date: change.to,
        reason: change.reason,
        moved_by: o.movedBy,
        forecast_fetched_at: o.forecastFetchedAt,
      }));
    if (moves.length) await trx.insertInto('step_moves').values(moves).execute();
    return moves;
  });
}

export async function listStepMoves(stepId: string) {
  return getDb().selectFrom('step_moves').selectAll().where('step_id', '=', stepId).orderBy('created_at').execute();
}

/**
 * Runs `fn` in one transaction holding the planting's row lock, so a replan and a step marked done never
 * interleave: each reads the plan the other wrote. `fn` gets null when the planting does not exist.
 */
export async function withPlantingLock<T>(plantingId: string, fn: (trx: Transaction<Database>, planting: Selectable<PlantingsTable> | null) => Promise<T>): Promise<T> {
  return getDb()
    .transaction()
    .execute(async (trx) => {
      const planting = await trx.selectFrom('plantings').selectAll().where('id', '=', plantingId).forNoKeyUpdate().executeTakeFirst();
      return fn(trx, planting ?? null);
    });
}

/** The plot and property a planting belongs to, as the engine's input needs them. */
export async function plantingPlace(plantingId: string, db: Db = getDb()) {
  const row = await db
    .selectFrom('plantings')
    .innerJoin('plots', 'plots.id', 'plantings.plot_id')
    .select(['plantings.plot_id', 'plots.property_id'])
    .where('plantings.id', '=', plantingId)
    .executeTakeFirst();
  if (!row) return null;
  const [plot, property] = await Promise.all([
    db.selectFrom('plots').selectAll().where('id', '=', row.plot_id).executeTakeFirstOrThrow(),
    db.selectFrom('properties').selectAll().where('id', '=', row.property_id).executeTakeFirstOrThrow(),
  ]);
  return { plot, property };
}

/** A step with the ids of its planting, plot and property (access checks go through the property). */
export async function getStepWithPlace(stepId: string, db: Db = getDb()) {
  return db
    .selectFrom('steps')
    .innerJoin('plantings', 'plantings.id', 'steps.planting_id')
    .innerJoin('plots', 'plots.id', 'plantings.plot_id')
    .selectAll('steps')
    .select(['plantings.plot_id', 'plots.property_id'])
    .where('steps.id', '=', stepId)
    .executeTakeFirst();
}

/**
 * Records what happened to a step: done on its real date (the step then sits on that date, the move kept as
 * history) or skipped. The following steps are re-placed by the caller, in the same transaction.
 */
export async function recordStepOutcome(
  trx: Transaction<Database>,
  o: {
    stepId: string;
    status: 'done' | 'skipped';
    date: string;
    userId: string;
    notes?: string | null;
    at: Date;
    /** When the work was really done (default `at`, the moment it is recorded). */
    doneAt?: Date;
    /** What was really done (e.g. the seed actually broadcast), kept as given; untouched when undefined. */
    record?: unknown;
  },
) {
  const row = await trx.selectFrom('steps').selectAll().where('id', '=', o.stepId).forNoKeyUpdate().executeTakeFirstOrThrow();
  const moveTo = o.status === 'done' && row.local_date !== o.date ? o.date : null;
  await trx
    .updateTable('steps')
    .set({
      status: o.status,
      done_on: o.status === 'done' ? o.date : null,
      done_at: o.doneAt ?? o.at,
      done_by: o.userId,
      ...(o.notes !== undefined ? { notes: o.notes } : {}),
      ...(o.record !== undefined ? { done_record: o.record === null ? null : JSON.stringify(o.record) } : {}),
      ...(moveTo ? { local_date: moveTo } : {}),
      updated_at: o.at,
    })
    .where('id', '=', o.stepId)
    .execute();
  if (moveTo) {
    await trx
      .insertInto('step_moves')
      .values({
        step_id: o.stepId,
        from_date: row.local_date,
        to_date: moveTo,
        reason: `done on ${moveTo} (it was planned for ${row.local_date})`,
        moved_by: o.userId,
        forecast_fetched_at: null,
      })
      .execute();
  }
}

/** Active plantings on these properties: the ones a new forecast replans. */
export async function activePlantingIds(propertyIds: string[]): Promise<string[]> {
  if (!propertyIds.length) return [];
  const rows = await getDb()
    .selectFrom('plantings')
    .innerJoin('plots', 'plots.id', 'plantings.plot_id')
    .select('plantings.id')
    .where('plots.property_id', 'in', propertyIds)
    .where('plantings.status', '=', 'active')
    .orderBy('plantings.id')
    .execute();
  return rows.map((r) => r.id);
}

export interface StepDto extends PlanStep {
  id: string;
  assigneeId: string | null;
  notes: string | null;
}

export function toStepDto(row: StepRow): StepDto {
  return { id: row.id, ...rowToPlanStep(row), assigneeId: row.assignee_id, notes: row.notes };
}
