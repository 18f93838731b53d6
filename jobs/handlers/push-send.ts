// Send one push notification to every device the person registered. A device the push service no longer
// knows (404/410) is forgotten; when none is left the row is closed. Any other failure goes back to the row
// with a backoff, and the reminders run claims it again when due.
import { now } from '@/lib/clock';
import { markDropped, markFailed, markSent } from '@/lib/data/notifications';
import { deleteSubscriptionById, listSubscriptions, markSubscriptionUsed } from '@/lib/data/push-subscriptions';
import { sendPush } from '@/lib/notify/push';
import { checkPushEndpoint, pushAgent } from '@/lib/notify/push-endpoint';
import type { StoredMessage } from '@/lib/notify/reminders';
import type { JobContext } from '../context';
import { errorText } from '../log';
import { QUEUES, type SendJob } from '../queues';
import { claimedRow } from './email-send';

export async function sendPushNotification(ctx: JobContext, job: { id: string; data: SendJob }) {
  const { row, skip } = await claimedRow(job);
  if (!row) return { outcome: skip };
  const devices = row.user_id ? await listSubscriptions(row.user_id) : [];
  if (!devices.length) {
    await markDropped(row.id, now(), 'no phone is registered any more');
    return { outcome: 'dropped' };
  }
  const payload = (row.message as StoredMessage).push;
  let sent = 0;
  let gone = 0;
  const errors: string[] = [];
  for (const device of devices) {
    try {
      // Checked again here, not only when the phone subscribed: the endpoint's name may now point elsewhere.
      await checkPushEndpoint(device.endpoint);
      if ((await sendPush(device, payload, { agent: pushAgent() })) === 'gone') {
        gone++;
        await deleteSubscriptionById(device.id);
        ctx.log('info', 'push subscription gone; removed', { queue: QUEUES.pushSend, jobId: job.id, notificationId: row.id, subscriptionId: device.id });
      } else {
        sent++;
        await markSubscriptionUsed(device.id, now());
      }
    } catch (error) {
      errors.push(errorText(error));
    }
  }
  // Once any device has it, the message is delivered: a retry would show it twice on the others.
  if (sent) {
    await markSent(row.id, now());
    ctx.log('info', 'push sent', { queue: QUEUES.pushSend, jobId: job.id, notificationId: row.id, kind: row.kind, devices: sent, gone, failed: errors.length });
    return { outcome: 'sent', devices: sent };
  }
  if (!errors.length) {
    await markDropped(row.id, now(), 'every registered phone has unsubscribed');
    return { outcome: 'dropped' };
  }
  await markFailed(row.id, now(), errors[0], row.attempts);
  ctx.log('warn', 'push not sent; retried later', { queue: QUEUES.pushSend, jobId: job.id, notificationId: row.id, attempts: row.attempts, error: errors[0] });
  return { outcome: 'retry later' };
}
