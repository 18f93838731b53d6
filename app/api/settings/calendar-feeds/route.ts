import { requireUser } from '@/lib/auth/session';
import { createFeed, listFeeds } from '@/lib/data/calendar-feeds';
import { json, parseBody, route } from '@/lib/http';
import { appBaseUrl } from '@/lib/links';
import { calendarFeedSchema } from '@/lib/validations/calendar-feed';

/** The person's working calendar feeds, without their tokens (only a hash is kept). */
export const GET = route(async () => {
  const user = await requireUser();
  return json({ feeds: await listFeeds(user.id) });
});

/** Makes a feed and answers its secret URL this once. */
export const POST = route(async (request) => {
  const user = await requireUser();
  const input = await parseBody(request, calendarFeedSchema);
  const { feed, token } = await createFeed(user.id, input.label ?? null);
  return json({ feed, url: `${appBaseUrl()}/api/calendar-feed/${token}` }, 201);
});
