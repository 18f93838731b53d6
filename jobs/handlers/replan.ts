// Replan one planting against the newest stored forecast for its cell: the engine keeps what people did and
// decided, moves what the weather asks, and every move is written as history with its reason. The people who
// should know get one "moved" message for the whole replan, written in the same transaction as the moves.
import { now } from '@/lib/clock';
import { latestForecast } from '@/lib/data/forecasts';
import { insertNotifications } from '@/lib/data/notifications';
import { getStepRows, loadPlan, plantingPlace, saveReplan, withPlantingLock } from '@/lib/data/plantings';
import { notificationAudience } from '@/lib/data/reminders';
import { appBaseUrl } from '@/lib/links';
import { buildPlantingInput } from '@/lib/planning/input';
import { movedNotifications } from '@/lib/notify/reminders';
import { replan } from '@/lib/schedule/plan';
import { plantingSchema } from '@/lib/validations/planting';
import { gridCellKey } from '@/lib/weather/grid';
import type { JobContext } from '../context';
import type { ReplanJob } from '../queues';

export async function replanPlanting(ctx: JobContext, job: { id: string; data: ReplanJob }) {
  const { plantingId } = job.data;
  const result = await withPlantingLock(plantingId, async (trx, planting) => {
    if (!planting) return { outcome: 'gone' };
    if (planting.status !== 'active') return { outcome: planting.status };
    const place = await plantingPlace(plantingId, trx);
    if (!place) return { outcome: 'gone' };
    const { plot, property } = place;
    const stored = await latestForecast(gridCellKey(property.latitude, property.longitude));
    if (!stored) return { outcome: 'no forecast yet' };

    const form = plantingSchema.safeParse(planting.input);
    if (!form.success) throw new Error(`planting ${plantingId}: stored input no longer validates: ${form.error.issues[0]?.message}`);
    const input = buildPlantingInput(property, plot, form.data);
    const at = now();
    const current = await loadPlan(plantingId, trx);
    const { plan, changes } = replan(input, current, { timeZone: property.time_zone, fetchedAt: stored.fetchedAt, hours: stored.hours }, at);
    const written = await saveReplan({ plantingId, plan, changes, movedBy: null, forecastFetchedAt: stored.fetchedAt }, trx);
    if (!changes.length) return { outcome: 'unchanged', forecastId: stored.id };

    const rows = await getStepRows(plantingId, trx);
    const byKey = new Map(rows.map((r) => [r.key, r]));
    const moves = changes
      .filter((c) => byKey.has(c.key))
      .map((c) => {
        const row = byKey.get(c.key)!;
        return { stepId: row.id, title: row.title, from: c.from, to: c.to, reason: c.reason, assigneeId: row.assignee_id };
      });
    const audience = await notificationAudience([property.id], trx);
    const notifications = movedNotifications({
      now: at,
      baseUrl: appBaseUrl(),
      plantingId,
      forecastId: stored.id,
      propertyId: property.id,
      propertyName: property.name,
      plotName: plot.name,
      timeZone: property.time_zone,
      moves,
      ...audience,
    });
    const queued = await insertNotifications(notifications, trx);
    return {
      outcome: 'moved',
      forecastId: stored.id,
      moves: written.length,
      changes: changes.map((c) => `${c.key} ${c.from}→${c.to}`),
      notifications: queued,
    };
  });
  // Logged once committed: whoever reads the log may read the new plan.
  if (result.outcome === 'moved') ctx.log('info', 'planting replanned', { queue: 'replan', jobId: job.id, plantingId, ...result });
  return result;
}
