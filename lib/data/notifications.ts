import { sql, type Kysely, type Transaction } from 'kysely';
import { getDb } from '@/db';
import type { Database, NotificationChannel } from '@/db/database';

export interface NewNotification {
  dedupeKey: string;
  /** The recipient's account; null only for an e-mail to an address without one (invitations). */
  userId: string | null;
  emailTo?: string | null;
  propertyId: string | null;
  stepId: string | null;
  kind: string;
  channel: NotificationChannel;
  message: unknown;
  sendAfter: Date;
  /** An invitation e-mail's invitation: the sender drops the e-mail when it was revoked meanwhile. */
  invitationId?: string | null;
}

/** Inserts what is not there yet; the unique dedupe key makes a second worker's insert a no-op. */
export async function insertNotifications(rows: NewNotification[], db: Kysely<Database> | Transaction<Database> = getDb()): Promise<number> {
  if (rows.length === 0) return 0;
  const result = await db
    .insertInto('notifications')
    .values(
      rows.map((r) => ({
        dedupe_key: r.dedupeKey,
        user_id: r.userId,
        email_to: r.emailTo ?? null,
        property_id: r.propertyId,
        step_id: r.stepId,
        kind: r.kind,
        channel: r.channel,
        message: JSON.stringify(r.message),
        send_after: r.sendAfter,
        invitation_id: r.invitationId ?? null,
      })),
    )
    .onConflict((oc) => oc.column('dedupe_key').doNothing())
    .executeTakeFirst();
  return Number(result.numInsertedOrUpdatedRows ?? 0);
}

/** How long a claim holds before another worker may take the row again (its sender died). */
export const CLAIM_TIMEOUT_MINUTES = 10;
export const MAX_ATTEMPTS = 8;

/**
 * Claims due rows for one worker: rows no one holds (or whose holder went silent), locked with SKIP LOCKED
 * so two workers never claim the same row.
 */
export async function claimDue(o: { now: Date; workerId: string; limit: number }) {
  const stale = new Date(o.now.getTime() - CLAIM_TIMEOUT_MINUTES * 60_000);
  return getDb()
    .updateTable('notifications')
    .set({ claimed_at: o.now, claimed_by: o.workerId, attempts: sql`attempts + 1` })
    .where('id', 'in', (eb) =>
      eb
        .selectFrom('notifications')
        .select('id')
        .where('sent_at', 'is', null)
        .where('failed_at', 'is', null)
        .where('send_after', '<=', o.now)
        .where((w) => w.or([w('claimed_at', 'is', null), w('claimed_at', '<', stale)]))
        .orderBy('send_after')
        .limit(o.limit)
        .forUpdate()
        .skipLocked(),
    )
    .returning(['id', 'channel', 'user_id', 'dedupe_key', 'attempts'])
    .execute();
}

/**
 * The row, with whether an invitation e-mail's invitation is still open (not revoked, accepted or expired)
 * at this moment: read in the same statement the sender acts on, so a revocation before sending wins.
 */
export async function getNotification(id: string) {
  return getDb()
    .selectFrom('notifications')
    .leftJoin('invitations', 'invitations.id', 'notifications.invitation_id')
    .selectAll('notifications')
    .select(
      sql<boolean | null>`case when notifications.invitation_id is null then null
        else invitations.revoked_at is null and invitations.accepted_at is null and invitations.expires_at > now() end`.as('invitation_open'),
    )
    .where('notifications.id', '=', id)
    .executeTakeFirst();
}

// An invitation's or a verification's message holds a link that is a bearer secret (their tables keep only its
// hash). Once the e-mail is sent or given up, the row keeps the subject and push title, never the link.
const withoutSecrets = sql<string>`case when kind in ('invitation', 'email-verification') then jsonb_build_object(
  'subject', message->'subject',
  'text', 'Sent. The link is not kept after sending.',
  'html', '',
  'push', jsonb_build_object('title', message->'push'->'title', 'body', message->'push'->'body', 'url', '', 'tag', kind)
) else message end`;

export async function markSent(id: string, at: Date) {
  await getDb().updateTable('notifications').set({ sent_at: at, last_error: null, message: withoutSecrets }).where('id', '=', id).execute();
}

/** A failed send: retried later with backoff, given up after MAX_ATTEMPTS (kept, with the error). */
export async function markFailed(id: string, at: Date, error: string, attempts: number) {
  const giveUp = attempts >= MAX_ATTEMPTS;
  const backoffMs = Math.min(60 * 60_000, 30_000 * 2 ** Math.max(0, attempts - 1));
  await getDb()
    .updateTable('notifications')
    .set({
      claimed_at: null,
      claimed_by: null,
      last_error: error.slice(0, 500),
      ...(giveUp ? { failed_at: at, message: withoutSecrets } : { send_after: new Date(at.getTime() + backoffMs) }),
    })
    .where('id', '=', id)
    .execute();
}

/** The row was for a channel or device that no longer exists: close it without sending. */
export async function markDropped(id: string, at: Date, why: string) {
  await getDb()
    .updateTable('notifications')
    .set({ failed_at: at, last_error: why.slice(0, 500), message: withoutSecrets })
    .where('id', '=', id)
    .execute();
}
