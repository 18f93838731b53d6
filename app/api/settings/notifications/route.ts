import { requireUser } from '@/lib/auth/session';
import { getSettings, saveSettings } from '@/lib/data/notification-settings';
import { json, parseBody, route } from '@/lib/http';
import { notificationSettingsSchema } from '@/lib/validations/notification-settings';

/** The signed-in person's own notification settings (defaults until they first save). */
export const GET = route(async () => {
  const user = await requireUser();
  return json({ settings: await getSettings(user.id) });
});

/** The whole settings object each time: the form always sends every field, so nothing is half-saved. */
export const PUT = route(async (request) => {
  const user = await requireUser();
  const input = await parseBody(request, notificationSettingsSchema);
  return json({ settings: await saveSettings(user.id, input) });
});
