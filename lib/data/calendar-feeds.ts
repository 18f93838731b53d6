import { createHash, randomBytes } from 'node:crypto';
import { getDb } from '@/db';
import type { FeedStepDetail } from '@/lib/planning/ical-feed';
import type { Caution, Quantity } from '@/lib/schedule/types';

export interface CalendarFeedDto {
  id: string;
  label: string | null;
  createdAt: string;
  lastUsedAt: string | null;
}

/** 32 random bytes (256 bits) from the system CSPRNG, base64url (RFC 4648 §5) so it sits in a URL as is. */
export function newFeedToken(): string {
  return randomBytes(32).toString('base64url');
}

/** Only the SHA-256 (FIPS 180-4) of a token is stored; whoever reads the table cannot rebuild a feed URL. */
export const feedTokenHash = (token: string) => createHash('sha256').update(token).digest('hex');

type Row = { id: string; label: string | null; created_at: Date | string; last_used_at: Date | string | null };
const toDto = (r: Row): CalendarFeedDto => ({
  id: r.id,
  label: r.label,
  createdAt: new Date(r.created_at).toISOString(),
  lastUsedAt: r.last_used_at ? new Date(r.last_used_at).toISOString() : null,
});

/** A person's feeds that still work, newest first. Never the token, never its hash. */
export async function listFeeds(userId: string): Promise<CalendarFeedDto[]> {
  const rows = await getDb()
    .selectFrom('calendar_feeds')
    .select(['id', 'label', 'created_at', 'last_used_at'])
    .where('user_id', '=', userId)
    .where('revoked_at', 'is', null)
    .orderBy('created_at', 'desc')
    .execute();
  return rows.map(toDto);
}

/** Makes a feed; the token comes back this once and is not kept. */
export async function createFeed(userId: string, label: string | null): Promise<{ feed: CalendarFeedDto; token: string }> {
  const token = newFeedToken();
  const row = await getDb()
    .insertInto('calendar_feeds')
    .values({ user_id: userId, token_hash: feedTokenHash(token), label })
    .returning(['id', 'label', 'created_at', 'last_used_at'])
    .executeTakeFirstOrThrow();
  return { feed: toDto(row), token };
}

/** Revokes one of the person's own feeds; false when they have no such working feed. */
export async function revokeFeed(userId: string, feedId: string, at: Date): Promise<boolean> {
  const result = await getDb()
    .updateTable('calendar_feeds')
    .set({ revoked_at: at })
    .where('id', '=', feedId)
    .where('user_id', '=', userId)
    .where('revoked_at', 'is', null)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) > 0;
}

/** The owner of a working feed token, noting the use; null for a token that is unknown or revoked. */
export async function useFeedToken(token: string, at: Date): Promise<{ userId: string; name: string } | null> {
  const db = getDb();
  const feed = await db
    .updateTable('calendar_feeds')
    .set({ last_used_at: at })
    .where('token_hash', '=', feedTokenHash(token))
    .where('revoked_at', 'is', null)
    .returning('user_id')
    .executeTakeFirst();
  if (!feed) return null;
  const user = await db.selectFrom('users').select(['id', 'name']).where('id', '=', feed.user_id).executeTakeFirst();
  return user ? { userId: user.id, name: user.name } : null;
}

/** What the feed says about each step beyond the calendar's own columns: hours, what to carry, cautions. */
export async function feedStepDetails(stepIds: string[]): Promise<Map<string, FeedStepDetail>> {
  if (stepIds.length === 0) return new Map();
  const rows = await getDb()
    .selectFrom('steps')
    .select(['id', 'hours', 'quantities', 'cautions', 'reason', 'notes', 'done_on', 'updated_at'])
    .where('id', 'in', stepIds)
    .execute();
  return new Map(
    rows.map((r) => [
      r.id,
      {
        hours: (r.hours as FeedStepDetail['hours']) ?? null,
        quantities: (r.quantities as Quantity[]) ?? [],
        cautions: (r.cautions as Caution[]) ?? [],
        reason: r.reason,
        notes: r.notes,
        doneOn: r.done_on,
        updatedAt: new Date(r.updated_at),
      },
    ]),
  );
}
