import { requireUser } from '@/lib/auth/session';
import { now } from '@/lib/clock';
import { recordDashboardVisit } from '@/lib/data/dashboard';
import { parseBody, route } from '@/lib/http';
import { dashboardVisitSchema } from '@/lib/validations/dashboard';

/**
 * POST /api/dashboard/visit — the dashboard page says it has shown the person their overview made at
 * `seenAt`; the next one lists moves after it. A time ahead of the server's clock counts as now.
 */
export const POST = route(async (request) => {
  const user = await requireUser();
  const { seenAt } = await parseBody(request, dashboardVisitSchema);
  const at = now();
  const seen = new Date(seenAt);
  await recordDashboardVisit(user.id, seen > at ? at : seen);
  return new Response(null, { status: 204 });
});
