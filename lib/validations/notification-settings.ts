import { z } from 'zod';
import { hasControlCharacter, optionalText } from './common';

const hour = (label: string) =>
  z
    .number({ error: `${label} must be an hour from 0 to 23` })
    .int(`${label} must be a whole hour`)
    .min(0, `${label} must be an hour from 0 to 23`)
    .max(23, `${label} must be an hour from 0 to 23`);

export const notificationSettingsSchema = z
  .object({
    emailEnabled: z.boolean({ error: 'E-mail must be on or off' }),
    pushEnabled: z.boolean({ error: 'Phone notifications must be on or off' }),
    reminderHour: hour('Reminder hour'),
    quietStartHour: hour('Quiet hours start').nullable().optional(),
    quietEndHour: hour('Quiet hours end').nullable().optional(),
    dueReminders: z.boolean({ error: 'Due reminders must be on or off' }),
    digest: z.boolean({ error: 'Morning digest must be on or off' }),
  })
  .strict()
  .refine((s) => (s.quietStartHour == null) === (s.quietEndHour == null), {
    message: 'Give both the start and the end of quiet hours, or neither',
    path: ['quietEndHour'],
  })
  .refine((s) => s.quietStartHour == null || s.quietStartHour !== s.quietEndHour, {
    message: 'Quiet hours must start and end at different hours',
    path: ['quietEndHour'],
  });

export type NotificationSettingsInput = z.infer<typeof notificationSettingsSchema>;

export const pushSubscriptionSchema = z.object({
  // Whether the host is a public push service is checked after parsing (lib/notify/push-endpoint.ts: DNS).
  endpoint: z
    .url({ error: 'Endpoint must be an https URL' })
    .max(2000, 'Endpoint is too long')
    .refine((u) => u.startsWith('https://'), 'Endpoint must be an https URL')
    .refine((u) => !hasControlCharacter(u), 'Endpoint must not contain control characters'),
  keys: z.object({
    p256dh: z.string().regex(/^[A-Za-z0-9_-]{80,100}$/, 'p256dh must be a base64url P-256 public key'),
    auth: z.string().regex(/^[A-Za-z0-9_-]{16,32}$/, 'auth must be a base64url secret'),
  }),
  label: optionalText('Label', 120),
});
export type PushSubscriptionInput = z.infer<typeof pushSubscriptionSchema>;
