import { latestForecast } from '@/lib/data/forecasts';
import { getStepRow, getStepRows, loadPlan, plantingPlace, recordStepOutcome, saveReplan, toStepDto, withPlantingLock } from '@/lib/data/plantings';
import { replan } from '@/lib/schedule/plan';
import { localClock, localDateOf } from '@/lib/schedule/local-dates';
import type { Forecast } from '@/lib/schedule/types';
import { plantingSchema } from '@/lib/validations/planting';
import { SEED_RECORD_KINDS, type StepRecord } from '@/lib/validations/step';
import { gridCellKey } from '@/lib/weather/grid';
import { buildPlantingInput } from './input';

/** A date a person cannot have done the work on. */
export class StepDateError extends RangeError {
  readonly field: 'date' | 'doneAt' = 'date';
}

/** A moment the work cannot have been done at: after now, or on another day than the date given. */
export class StepTimeError extends StepDateError {
  override readonly field = 'doneAt' as const;
}

/** A record that does not fit the step (a seed amount on a spraying, a record on a skipped step). */
export class StepRecordError extends RangeError {
  readonly field = 'record';
}

/** A phone's clock may run a little ahead of the server's (common practice, no source). */
const CLOCK_SKEW_MS = 5 * 60_000;

/**
 * Marks a step done (on its real date) or skipped, then lets the engine re-place the steps that follow from
 * the real dates — against the last stored forecast when there is one — all under the planting's lock, so a
 * replan running in the worker at the same moment cannot undo it.
 */
export async function completeStep(o: {
  stepId: string;
  plantingId: string;
  status: 'done' | 'skipped';
  date?: string;
  /** RFC 3339 instant the work was done at; default now. */
  doneAt?: string;
  notes?: string;
  record?: StepRecord;
  userId: string;
  now: Date;
}) {
  return withPlantingLock(o.plantingId, async (trx, planting) => {
    const place = planting ? await plantingPlace(planting.id, trx) : null;
    if (!planting || !place) throw new Error(`planting ${o.plantingId} is gone`);
    const { plot, property } = place;
    const today = localDateOf(o.now, property.time_zone);
    const doneAt = o.doneAt === undefined ? undefined : new Date(o.doneAt);
    if (doneAt && doneAt.getTime() > o.now.getTime() + CLOCK_SKEW_MS) {
      throw new StepTimeError(`The time it was done cannot be after now (${localClock(o.now.getTime(), property.time_zone)} at ${property.name})`);
    }
    const dayOfDoneAt = doneAt ? localDateOf(doneAt, property.time_zone) : undefined;
    if (o.date && dayOfDoneAt && dayOfDoneAt !== o.date) {
      throw new StepTimeError(`The time it was done falls on ${dayOfDoneAt} at ${property.name}, not on ${o.date}`);
    }
    const date = o.date ?? (dayOfDoneAt && dayOfDoneAt <= today ? dayOfDoneAt : today);
    if (date > today) {
      throw new StepDateError(`The date cannot be after today (${today} at ${property.name})`);
    }
    const row = await getStepRow(o.stepId, trx);
    if (o.record && o.status !== 'done') throw new StepRecordError('Only a step that was done has a record of what was done');
    if (o.record && !(SEED_RECORD_KINDS as readonly string[]).includes(row.kind)) {
      throw new StepRecordError('Only a seeding records the seed broadcast');
    }
    // The same outcome sent again (a phone's queue retrying after a lost answer) is already recorded: say so, change nothing.
    if (row.status === o.status && (o.status === 'skipped' || row.done_on === date)) {
      const steps = (await getStepRows(planting.id, trx)).map(toStepDto);
      return { date, steps, changes: [], moves: 0, repeated: true, record: row.done_record ?? null };
    }
    await recordStepOutcome(trx, {
      stepId: o.stepId,
      status: o.status,
      date,
      userId: o.userId,
      notes: o.notes,
      at: o.now,
      doneAt,
      // A new outcome replaces what an earlier one recorded; a skipped step keeps no record.
      record: o.record ?? null,
    });

    const input = buildPlantingInput(property, plot, plantingSchema.parse(planting.input));
    const current = await loadPlan(planting.id, trx);
    const stored = await latestForecast(gridCellKey(property.latitude, property.longitude));
    // Without a stored forecast the engine still counts from the real dates; it only has no weather to read.
    const forecast: Forecast = stored
      ? { timeZone: property.time_zone, fetchedAt: stored.fetchedAt, hours: stored.hours }
      : { timeZone: property.time_zone, fetchedAt: o.now.toISOString(), hours: [] };
    const { plan, changes } = replan(input, current, forecast, o.now);
    const moves = await saveReplan(
      { plantingId: planting.id, plan, changes, movedBy: o.userId, forecastFetchedAt: stored?.fetchedAt ?? null },
      trx,
    );
    const steps = (await getStepRows(planting.id, trx)).map(toStepDto);
    return { date, steps, changes, moves: moves.length, repeated: false, record: o.record ?? null };
  });
}
