import { latestForecast } from '@/lib/data/forecasts';
import { getStepRows, loadPlan, plantingPlace, saveReplan, toStepDto, withPlantingLock } from '@/lib/data/plantings';
import { lockStep, pinStepToDate, updateStepFields } from '@/lib/data/steps';
import { checkStepDate, replan } from '@/lib/schedule/plan';
import { dayWithMonth, localDateOf } from '@/lib/schedule/local-dates';
import { STEP_KINDS } from '@/lib/schedule/step-kinds';
import type { Forecast, RuleDecision } from '@/lib/schedule/types';
import { plantingSchema } from '@/lib/validations/planting';
import { gridCellKey } from '@/lib/weather/grid';
import { buildPlantingInput } from './input';

/** Why a step stays where it is: a 409 the calendar shows, with the rules' reasons when there are any. */
export class StepMoveRefused extends Error {
  constructor(
    message: string,
    readonly reasons: string[] = [],
    readonly canConfirm = false,
  ) {
    super(message);
  }
}

/** A date the step cannot go to at all (before today). */
export class StepMoveDateError extends RangeError {
  readonly field = 'date';
}

type Place = NonNullable<Awaited<ReturnType<typeof plantingPlace>>>;

async function storedForecast(property: Place['property'], now: Date) {
  const stored = await latestForecast(gridCellKey(property.latitude, property.longitude));
  // Without a stored forecast the engine still counts from the dates; it only has no weather to read.
  const forecast: Forecast = stored
    ? { timeZone: property.time_zone, fetchedAt: stored.fetchedAt, hours: stored.hours }
    : { timeZone: property.time_zone, fetchedAt: now.toISOString(), hours: [] };
  return { stored, forecast };
}

/**
 * Puts a step on the day a person chose. The engine's rules judge the day first; when any fails, nothing
 * changes unless a manager confirms. A moved step is pinned (the engine will not move it back), the move is
 * kept with its reason, and the steps around it are re-placed against the stored forecast — all under the
 * planting's lock, so a worker replan cannot interleave.
 */
export async function moveStep(o: {
  stepId: string;
  plantingId: string;
  date: string;
  confirm: boolean;
  canConfirm: boolean;
  user: { id: string; name: string };
  now: Date;
}) {
  return withPlantingLock(o.plantingId, async (trx, planting) => {
    const place = planting ? await plantingPlace(planting.id, trx) : null;
    const row = await lockStep(trx, o.stepId);
    if (!planting || !place || !row) throw new StepMoveRefused('The step is gone');
    if (row.status === 'done') throw new StepMoveRefused(`This step was done on ${row.done_on ?? row.local_date}; a done step cannot be moved`);
    if (row.status === 'skipped') throw new StepMoveRefused('This step was skipped; a skipped step cannot be moved');
    if (row.recurrence) throw new StepMoveRefused('Recurring upkeep follows its rule; it cannot be moved one occurrence at a time');
    const { plot, property } = place;
    const today = localDateOf(o.now, property.time_zone);
    if (o.date < today) throw new StepMoveDateError(`The date cannot be before today (${today} at ${property.name})`);

    const input = buildPlantingInput(property, plot, plantingSchema.parse(planting.input));
    const { stored, forecast } = await storedForecast(property, o.now);
    const current = await loadPlan(planting.id, trx);
    const decisions: RuleDecision[] = checkStepDate(input, current, row.key, o.date, stored ? forecast : null, o.now);
    const reasons = decisions.filter((d) => !d.ok).map((d) => d.reason);
    if (reasons.length && !(o.confirm && o.canConfirm)) {
      throw new StepMoveRefused(`${row.title} on ${o.date}: ${reasons.join('; ')}`, reasons, o.canConfirm);
    }

    const reason = reasons.length ? `moved by ${o.user.name}, confirmed despite: ${reasons.join('; ')}` : `moved by ${o.user.name}`;
    await pinStepToDate(trx, {
      stepId: row.id,
      from: row.local_date,
      to: o.date,
      reason,
      movedBy: o.user.id,
      forecastFetchedAt: stored?.fetchedAt ?? null,
      at: o.now,
    });
    const { plan, changes } = replan(input, await loadPlan(planting.id, trx), forecast, o.now);
    // What the replan moves now (a spray-and-seed spray carried to the new seeding day, the germination
    // check after it) moved because of this person's move; its history says so beside the engine's reason.
    const because = `with ${STEP_KINDS[row.kind].noun} moved by ${o.user.name} to ${dayWithMonth(o.date)}`;
    const followed = changes.map((change) => ({ ...change, reason: `${change.reason} (${because})` }));
    const moves = await saveReplan({ plantingId: planting.id, plan, changes: followed, movedBy: o.user.id, forecastFetchedAt: stored?.fetchedAt ?? null }, trx);
    const steps = (await getStepRows(planting.id, trx)).map(toStepDto);
    return { steps, decisions, confirmedDespite: reasons, moved: moves.length };
  });
}

/**
 * Assigns a step and/or pins or unpins it. Unpinning hands the date back to the engine, which re-places
 * the step (and what follows it) against the stored forecast at once.
 */
export async function editStep(o: { stepId: string; plantingId: string; assigneeId?: string | null; pinned?: boolean; userId: string; now: Date }) {
  return withPlantingLock(o.plantingId, async (trx, planting) => {
    const place = planting ? await plantingPlace(planting.id, trx) : null;
    const row = await lockStep(trx, o.stepId);
    if (!planting || !place || !row) throw new StepMoveRefused('The step is gone');
    if (o.pinned !== undefined && row.status !== 'planned') {
      throw new StepMoveRefused(`This step is ${row.status}; only a planned step can be pinned or unpinned`);
    }
    await updateStepFields(trx, o.stepId, { assigneeId: o.assigneeId, pinned: o.pinned }, o.now);
    let moved = 0;
    if (o.pinned === false && row.pinned) {
      const { plot, property } = place;
      const input = buildPlantingInput(property, plot, plantingSchema.parse(planting.input));
      const { stored, forecast } = await storedForecast(property, o.now);
      const { plan, changes } = replan(input, await loadPlan(planting.id, trx), forecast, o.now);
      moved = (await saveReplan({ plantingId: planting.id, plan, changes, movedBy: o.userId, forecastFetchedAt: stored?.fetchedAt ?? null }, trx)).length;
    }
    const steps = (await getStepRows(planting.id, trx)).map(toStepDto);
    return { steps, moved };
  });
}
