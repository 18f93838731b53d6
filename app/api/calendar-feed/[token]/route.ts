import { now } from '@/lib/clock';
import { calendarSteps } from '@/lib/data/calendar';
import { feedStepDetails, useFeedToken } from '@/lib/data/calendar-feeds';
import { notFound, route } from '@/lib/http';
import { appBaseUrl } from '@/lib/links';
import { buildCalendarFeed } from '@/lib/planning/ical-feed';
import { addDays } from '@/lib/schedule/local-dates';
import { feedToken } from '@/lib/validations/calendar-feed';

type Context = { params: Promise<{ token: string }> };

/** A year back and two ahead: what a phone calendar needs; recurring upkeep runs on through its RRULE. */
const DAYS_BACK = 365;
const DAYS_AHEAD = 730;

/**
 * The iCalendar feed of the person who holds the token. No session: phone calendars fetch it on their own, so
 * the secret in the URL is the credential. An unknown or revoked token is a plain 404 that says nothing more.
 */
export const GET = route(async (_request, { params }: Context) => {
  const { token } = await params;
  if (!feedToken.safeParse(token).success) throw notFound();
  const at = now();
  const owner = await useFeedToken(token, at);
  if (!owner) throw notFound();
  const today = at.toISOString().slice(0, 10);
  const rows = await calendarSteps({ userId: owner.userId, from: addDays(today, -DAYS_BACK), to: addDays(today, DAYS_AHEAD) });
  const details = await feedStepDetails(rows.map((r) => r.step_id));
  const body = buildCalendarFeed({ rows, details, now: at, baseUrl: appBaseUrl(), ownerName: owner.name });
  return new Response(body, {
    headers: {
      'Content-Type': 'text/calendar; charset=utf-8',
      'Content-Disposition': 'inline; filename="sowcast.ics"',
      'Cache-Control': 'private, no-store',
    },
  });
});
