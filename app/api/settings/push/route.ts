import { requireUser } from '@/lib/auth/session';
import { listSubscriptions } from '@/lib/data/push-subscriptions';
import { json, route } from '@/lib/http';
import { vapidKeys } from '@/lib/notify/push';

/** Where a subscription's messages go, without the secret part of its address. */
function serviceOf(endpoint: string): string {
  try {
    return new URL(endpoint).host;
  } catch {
    return 'unknown push service';
  }
}

/**
 * What the settings page needs to subscribe this device (the VAPID public key it must pass to
 * PushManager.subscribe) and the person's devices. The endpoint is returned to its owner only, so the page
 * can tell which entry is this browser and remove one.
 */
export const GET = route(async () => {
  const user = await requireUser();
  const { publicKey } = vapidKeys(process.env, process.env.SOWCAST_DATA_DIR ?? '.data');
  const rows = await listSubscriptions(user.id);
  return json({
    publicKey,
    devices: rows.map((row) => ({
      id: row.id,
      label: row.label,
      endpoint: row.endpoint,
      service: serviceOf(row.endpoint),
      createdAt: new Date(row.created_at).toISOString(),
      lastSentAt: row.last_sent_at ? new Date(row.last_sent_at).toISOString() : null,
    })),
  });
});
