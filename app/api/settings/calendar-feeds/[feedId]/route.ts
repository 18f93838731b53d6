import { requireUser } from '@/lib/auth/session';
import { revokeFeed } from '@/lib/data/calendar-feeds';
import { notFound, route } from '@/lib/http';
import { now } from '@/lib/clock';
import { uuid } from '@/lib/validations/common';

type Context = { params: Promise<{ feedId: string }> };

/** Revokes one of the person's feeds: its URL answers 404 from now on. Another person's feed is 404 here. */
export const DELETE = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const { feedId } = await params;
  if (!uuid.safeParse(feedId).success || !(await revokeFeed(user.id, feedId, now()))) throw notFound();
  return new Response(null, { status: 204 });
});
