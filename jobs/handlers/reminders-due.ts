// Every minute: make the reminder rows whose time has come (the unique dedupe key turns a second worker's
// identical insert into a no-op), then claim due rows — these and any waiting for a retry — and hand each to
// its sender. Claims use SKIP LOCKED, so two workers never claim the same row. The same heartbeat asks for
// the forecast of a property that has none yet.
import { now } from '@/lib/clock';
import { propertiesAwaitingForecast } from '@/lib/data/forecasts';
import { claimDue, insertNotifications } from '@/lib/data/notifications';
import { notificationAudience, reminderSteps } from '@/lib/data/reminders';
import { appBaseUrl } from '@/lib/links';
import { dueReminders } from '@/lib/notify/reminders';
import { gridCellKey } from '@/lib/weather/grid';
import type { JobContext } from '../context';
import { forecastRefreshJob, QUEUES, type SendJob } from '../queues';

/** How long the job of a second or later claim waits before it starts (see the loop below). */
const LATER_CLAIM_DELAY_SECONDS = 5;

/** Rows handed out per run (SOWCAST_CLAIM_BATCH); the rest wait for the next run. */
export function claimBatch(env: NodeJS.ProcessEnv = process.env): number {
  const value = Number(env.SOWCAST_CLAIM_BATCH);
  return Number.isInteger(value) && value > 0 ? value : 500;
}

export async function runReminders(ctx: JobContext, job: { id: string }) {
  const at = now();
  const steps = await reminderSteps(at);
  const audience = await notificationAudience([...new Set(steps.map((s) => s.propertyId))]);
  const rows = dueReminders({ now: at, baseUrl: appBaseUrl(), steps, ...audience });
  const created = await insertNotifications(rows);

  const claimed = await claimDue({ now: at, workerId: ctx.workerId, limit: claimBatch() });
  let queued = 0;
  for (const row of claimed) {
    const data: SendJob = { notificationId: row.id, claimedBy: ctx.workerId, attempt: row.attempts };
    const queue = row.channel === 'email' ? QUEUES.emailSend : QUEUES.pushSend;
    // singletonKey: at most one job per claim of a row waits and one runs. The key names the claim, not only the
    // row: a claim taken over from a worker that died must not wait behind the job pg-boss still counts as
    // running inside the dead process (until its expiry) — the 'stately' queue would not start it meanwhile.
    // The older job, when it runs at last, finds its claim superseded and does nothing (claimedRow). A later
    // claim also starts a few seconds late, so a send still in flight under the old claim (a live worker whose
    // lease ran out mid-send) marks the row sent first and the new job finds it done.
    const later = row.attempts > 1 ? { startAfter: LATER_CLAIM_DELAY_SECONDS } : {};
    if (await ctx.boss.send(queue, data, { singletonKey: `${row.id}:${row.attempts}`, ...later })) queued++;
  }
  const forecastsAsked = await askForMissingForecasts(ctx, at);
  ctx.log(created || claimed.length || forecastsAsked ? 'info' : 'debug', 'reminders run', {
    queue: QUEUES.remindersDue,
    jobId: job.id,
    now: at.toISOString(),
    candidates: rows.length,
    created,
    claimed: claimed.length,
    queued,
    forecastsAsked,
  });
  return { now: at.toISOString(), created, claimed: claimed.length, queued, forecastsAsked };
}

/**
 * A property just created, or moved to another grid cell, gets its forecast within a minute instead of at the
 * next three-hourly refresh. The minute heartbeat notices it, so the web app needs no queue of its own.
 */
async function askForMissingForecasts(ctx: JobContext, at: Date): Promise<number> {
  let asked = 0;
  for (const property of await propertiesAwaitingForecast(at, gridCellKey)) {
    const job = forecastRefreshJob(property.id);
    if (await ctx.boss.send(job.name, job.data, job.options)) asked++;
  }
  return asked;
}
