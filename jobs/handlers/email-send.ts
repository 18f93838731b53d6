// Send one e-mail notification. The Message-ID comes from the dedupe key, so a resend after a crash between
// "sent" and "marked sent" is the same message, not a second one. A failed send goes back to its row with a
// backoff (lib/data/notifications.ts markFailed); the reminders run claims it again when it is due.
import { now } from '@/lib/clock';
import { getNotification, markDropped, markFailed, markSent } from '@/lib/data/notifications';
import { userEmail } from '@/lib/data/reminders';
import { messageIdFor, sendEmail } from '@/lib/notify/email';
import type { StoredMessage } from '@/lib/notify/reminders';
import type { JobContext } from '../context';
import { errorText } from '../log';
import { QUEUES, type SendJob } from '../queues';

/**
 * The row as this job may act on it, or why not. The queue runs at most one job per claim at a time ('stately',
 * singleton key = row id and attempt). A row whose claim was released (a failed try waiting out its backoff)
 * waits for its next claim and a fresh job; a job whose claim another worker took over (its own worker died or
 * stalled past the claim's lease) leaves the row to the job of the newer claim.
 */
export async function claimedRow(job: { data: SendJob }) {
  const row = await getNotification(job.data.notificationId);
  if (!row) return { skip: 'gone' as const };
  if (row.sent_at) return { skip: 'already sent' as const };
  if (row.failed_at) return { skip: 'closed' as const };
  if (!row.claimed_at) return { skip: 'not claimed (waiting for a retry)' as const };
  if (row.attempts !== job.data.attempt) return { skip: 'superseded by a later claim' as const };
  return { row };
}

export async function sendEmailNotification(ctx: JobContext, job: { id: string; data: SendJob }) {
  const { row, skip } = await claimedRow(job);
  if (!row) return { outcome: skip };
  if (row.invitation_open === false) {
    await markDropped(row.id, now(), 'the invitation was revoked, accepted or expired before its e-mail was sent');
    return { outcome: 'dropped' };
  }
  const to = row.email_to ?? (row.user_id ? await userEmail(row.user_id) : null);
  if (!to) {
    await markDropped(row.id, now(), 'the recipient has no e-mail address');
    return { outcome: 'dropped' };
  }
  const message = row.message as StoredMessage;
  try {
    await sendEmail({
      to,
      subject: message.subject,
      text: message.text,
      html: message.html,
      messageId: message.messageId ?? messageIdFor(row.dedupe_key),
      headers: { 'X-Sowcast-Kind': row.kind },
    });
  } catch (error) {
    await markFailed(row.id, now(), errorText(error), row.attempts);
    ctx.log('warn', 'e-mail not sent; retried later', { queue: QUEUES.emailSend, jobId: job.id, notificationId: row.id, attempts: row.attempts, error: errorText(error) });
    return { outcome: 'retry later' };
  }
  await markSent(row.id, now());
  ctx.log('info', 'e-mail sent', { queue: QUEUES.emailSend, jobId: job.id, notificationId: row.id, kind: row.kind, attempts: row.attempts });
  return { outcome: 'sent' };
}
