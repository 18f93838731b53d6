import { requireUser } from '@/lib/auth/session';
import { calendarSteps } from '@/lib/data/calendar';
import { json, route } from '@/lib/http';
import { calendarEvents } from '@/lib/planning/calendar-events';
import { calendarQuerySchema } from '@/lib/validations/step-edit';

/**
 * Calendar events for every step of every plot the signed-in person belongs to, across properties, in each
 * property's local dates; recurring upkeep expanded into its occurrences within the range.
 * GET /api/calendar?from=YYYY-MM-DD&to=YYYY-MM-DD[&property=&plot=&kind=&assignee=]
 */
export const GET = route(async (request) => {
  const user = await requireUser();
  const params = new URL(request.url).searchParams;
  const query = calendarQuerySchema.parse(Object.fromEntries(['from', 'to', 'property', 'plot', 'kind', 'assignee'].map((k) => [k, params.get(k) ?? undefined])));
  const rows = await calendarSteps({
    userId: user.id,
    from: query.from,
    to: query.to,
    propertyId: query.property,
    plotId: query.plot,
    kind: query.kind,
    assigneeId: query.assignee,
  });
  return json({ from: query.from, to: query.to, events: calendarEvents(rows, user.id, query.from, query.to) });
});
