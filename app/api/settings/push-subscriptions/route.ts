import { requireUser } from '@/lib/auth/session';
import { deleteSubscription, saveSubscription } from '@/lib/data/push-subscriptions';
import { json, parseBody, route } from '@/lib/http';
import { pushSubscriptionSchema } from '@/lib/validations/notification-settings';

const removalSchema = pushSubscriptionSchema.pick({ endpoint: true });

/** Saves this device's subscription, as PushSubscription.toJSON() gives it (plus an optional label). */
export const POST = route(async (request) => {
  const user = await requireUser();
  const input = await parseBody(request, pushSubscriptionSchema);
  const row = await saveSubscription(user.id, input);
  return json({ device: { id: row.id, endpoint: row.endpoint, label: row.label, createdAt: new Date(row.created_at).toISOString() } }, 201);
});

/**
 * Forgets one of the person's devices. Always 204: an endpoint that is not theirs is left alone and answered
 * the same as one that does not exist, so the answer says nothing about other people's devices.
 */
export const DELETE = route(async (request) => {
  const user = await requireUser();
  const { endpoint } = await parseBody(request, removalSchema);
  await deleteSubscription(user.id, endpoint);
  return new Response(null, { status: 204 });
});
