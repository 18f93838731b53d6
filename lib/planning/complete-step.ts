import { latestForecast } from '@/lib/data/forecasts';
import { getStepRows, loadPlan, plantingPlace, recordStepOutcome, saveReplan, toStepDto, withPlantingLock } from '@/lib/data/plantings';
import { replan } from '@/lib/schedule/plan';
import { localDateOf } from '@/lib/schedule/local-dates';
import type { Forecast } from '@/lib/schedule/types';
import { plantingSchema } from '@/lib/validations/planting';
import { gridCellKey } from '@/lib/weather/grid';
import { buildPlantingInput } from './input';

/** A date a person cannot have done the work on. */
export class StepDateError extends RangeError {
  readonly field = 'date';
}

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
  notes?: string;
  userId: string;
  now: Date;
}) {
  return withPlantingLock(o.plantingId, async (trx, planting) => {
    const place = planting ? await plantingPlace(planting.id, trx) : null;
    if (!planting || !place) throw new Error(`planting ${o.plantingId} is gone`);
    const { plot, property } = place;
    const today = localDateOf(o.now, property.time_zone);
    const date = o.date ?? today;
    if (date > today) {
      throw new StepDateError(`The date cannot be after today (${today} at ${property.name})`);
    }
    await recordStepOutcome(trx, { stepId: o.stepId, status: o.status, date, userId: o.userId, notes: o.notes, at: o.now });

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
    return { date, steps, changes, moves: moves.length };
  });
}
