import { getDb } from '@/db';
import type { PushSubscriptionInput } from '@/lib/validations/notification-settings';

/**
 * Stores a device's subscription; the same endpoint again from the same person (re-subscribe) updates its
 * keys and label. An endpoint registered to someone else is never moved: undefined, and nothing changes.
 */
export async function saveSubscription(userId: string, input: PushSubscriptionInput) {
  return getDb()
    .insertInto('push_subscriptions')
    .values({ user_id: userId, endpoint: input.endpoint, p256dh: input.keys.p256dh, auth: input.keys.auth, label: input.label ?? null })
    .onConflict((oc) =>
      oc
        .column('endpoint')
        .doUpdateSet({ p256dh: input.keys.p256dh, auth: input.keys.auth, label: input.label ?? null })
        .where('push_subscriptions.user_id', '=', userId),
    )
    .returning(['id', 'endpoint', 'label', 'created_at'])
    .executeTakeFirst();
}

export async function listSubscriptions(userId: string) {
  return getDb()
    .selectFrom('push_subscriptions')
    .select(['id', 'endpoint', 'p256dh', 'auth', 'label', 'created_at', 'last_sent_at'])
    .where('user_id', '=', userId)
    .orderBy('created_at')
    .execute();
}

export async function deleteSubscription(userId: string, endpoint: string) {
  const result = await getDb().deleteFrom('push_subscriptions').where('user_id', '=', userId).where('endpoint', '=', endpoint).executeTakeFirst();
  return Number(result.numDeletedRows) > 0;
}

/** The push service said the subscription is gone (404/410): forget it. */
export async function deleteSubscriptionById(id: string) {
  await getDb().deleteFrom('push_subscriptions').where('id', '=', id).execute();
}

export async function markSubscriptionUsed(id: string, at: Date) {
  await getDb().updateTable('push_subscriptions').set({ last_sent_at: at }).where('id', '=', id).execute();
}
