import { requireUser } from '@/lib/auth/session';
import { now } from '@/lib/clock';
import { dashboardFor } from '@/lib/data/dashboard';
import { json, route } from '@/lib/http';

/**
 * GET /api/dashboard — the signed-in person's steps for today and this week, steps moved since their last
 * visit (with the reasons), germination checks due and properties whose forecast is failing. Reading it
 * changes nothing; the page marks the visit with POST /api/dashboard/visit.
 */
export const GET = route(async () => {
  const user = await requireUser();
  return json(await dashboardFor(user.id, now()));
});
