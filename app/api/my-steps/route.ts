import { requireUser } from '@/lib/auth/session';
import { now } from '@/lib/clock';
import { myStepRows } from '@/lib/data/my-steps';
import { json, route } from '@/lib/http';
import { DONE_LOOKBACK_DAYS, MY_STEPS_HORIZON_DAYS, mySteps } from '@/lib/planning/my-steps';
import { addDays, localDateOf } from '@/lib/schedule/local-dates';

/**
 * GET /api/my-steps — the signed-in person's steps for the phone: assigned to them, or to nobody on a
 * property where they may work; overdue, today, tomorrow, this week and the next two weeks, each in its
 * property's own zone; steps recorded in the last day. The phone keeps the last answer for reading offline.
 */
export const GET = route(async () => {
  const user = await requireUser();
  const at = now();
  // Zones run from UTC−12 to UTC+14, so one UTC day beyond the horizon covers every property's last day.
  const utcToday = localDateOf(at, 'UTC');
  const rows = await myStepRows({ userId: user.id, to: addDays(utcToday, MY_STEPS_HORIZON_DAYS + 1), doneFrom: addDays(utcToday, -DONE_LOOKBACK_DAYS - 1) });
  return json({ userId: user.id, generatedAt: at.toISOString(), steps: mySteps(rows, at) });
});
