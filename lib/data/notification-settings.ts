import { getDb } from '@/db';
import type { NotificationSettingsInput } from '@/lib/validations/notification-settings';

export interface NotificationSettings {
  emailEnabled: boolean;
  pushEnabled: boolean;
  reminderHour: number;
  quietStartHour: number | null;
  quietEndHour: number | null;
  dueReminders: boolean;
  digest: boolean;
}

/** Everyone starts with e-mail and push on, reminders at 07:00 local, no quiet hours, no digest. */
export const DEFAULT_SETTINGS: NotificationSettings = {
  emailEnabled: true,
  pushEnabled: true,
  reminderHour: 7,
  quietStartHour: null,
  quietEndHour: null,
  dueReminders: true,
  digest: false,
};

export async function getSettings(userId: string): Promise<NotificationSettings> {
  const row = await getDb().selectFrom('notification_settings').selectAll().where('user_id', '=', userId).executeTakeFirst();
  return row ? toSettings(row) : DEFAULT_SETTINGS;
}

export async function settingsFor(userIds: string[]): Promise<Map<string, NotificationSettings>> {
  const map = new Map<string, NotificationSettings>();
  for (const id of userIds) map.set(id, DEFAULT_SETTINGS);
  if (userIds.length === 0) return map;
  const rows = await getDb().selectFrom('notification_settings').selectAll().where('user_id', 'in', userIds).execute();
  for (const row of rows) map.set(row.user_id, toSettings(row));
  return map;
}

function toSettings(row: {
  email_enabled: boolean; push_enabled: boolean; reminder_hour: number; quiet_start_hour: number | null;
  quiet_end_hour: number | null; due_reminders: boolean; digest: boolean;
}): NotificationSettings {
  return {
    emailEnabled: row.email_enabled,
    pushEnabled: row.push_enabled,
    reminderHour: row.reminder_hour,
    quietStartHour: row.quiet_start_hour,
    quietEndHour: row.quiet_end_hour,
    dueReminders: row.due_reminders,
    digest: row.digest,
  };
}

export async function saveSettings(userId: string, input: NotificationSettingsInput): Promise<NotificationSettings> {
  const values = {
    email_enabled: input.emailEnabled,
    push_enabled: input.pushEnabled,
    reminder_hour: input.reminderHour,
    quiet_start_hour: input.quietStartHour ?? null,
    quiet_end_hour: input.quietEndHour ?? null,
    due_reminders: input.dueReminders,
    digest: input.digest,
  };
  const row = await getDb()
    .insertInto('notification_settings')
    .values({ user_id: userId, ...values })
    .onConflict((oc) => oc.column('user_id').doUpdateSet({ ...values, updated_at: new Date() }))
    .returningAll()
    .executeTakeFirstOrThrow();
  return toSettings(row);
}
