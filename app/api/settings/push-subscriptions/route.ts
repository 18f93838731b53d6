import { requireUser } from '@/lib/auth/session';
import { deleteSubscription, saveSubscription } from '@/lib/data/push-subscriptions';
import { HttpError, json, parseBody, route } from '@/lib/http';
import { checkPushEndpoint, PushEndpointRefused } from '@/lib/notify/push-endpoint';
import { pushSubscriptionSchema } from '@/lib/validations/notification-settings';

const removalSchema = pushSubscriptionSchema.pick({ endpoint: true });

/**
 * Saves this device's subscription, as PushSubscription.toJSON() gives it (plus an optional label). The
 * endpoint must be a public https push service (lib/notify/push-endpoint.ts). One already registered to
 * another account is refused with 409 and not moved; the answer does not say whose it is.
 */
export const POST = route(async (request) => {
  const user = await requireUser();
  const input = await parseBody(request, pushSubscriptionSchema);
  try {
    await checkPushEndpoint(input.endpoint);
  } catch (error) {
    if (error instanceof PushEndpointRefused) throw new HttpError(400, error.message, { endpoint: error.message });
    throw error;
  }
  const row = await saveSubscription(user.id, input);
  if (!row) {
    const message = 'This browser’s subscription is registered to another account. Subscribe again to get a new one.';
    throw new HttpError(409, message, { endpoint: message });
  }
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
