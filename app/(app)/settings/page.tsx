import type { Metadata } from 'next';
import { redirect } from 'next/navigation';
import { AccountSecurity } from '@/components/settings/account-security';
import { CalendarFeeds } from '@/components/settings/calendar-feeds';
import { NotificationSettingsForm } from '@/components/settings/notification-settings-form';
import { PushDevices } from '@/components/settings/push-devices';
import { PageHeader } from '@/components/ui/page-header';
import { getCurrentUser } from '@/lib/auth/session';
import { signInPath } from '@/lib/client/navigation';
import { getSettings } from '@/lib/data/notification-settings';
import { listPropertiesForUser } from '@/lib/data/properties';

export const metadata: Metadata = { title: 'Settings' };

export default async function SettingsPage() {
  const user = await getCurrentUser();
  if (!user) redirect(signInPath('/settings'));
  const [settings, properties] = await Promise.all([getSettings(user.id), listPropertiesForUser(user.id)]);
  const zones = properties.map((p) => ({ name: p.name, timeZone: p.timeZone }));
  return (
    <div className="mx-auto max-w-3xl space-y-6">
      <PageHeader title="Settings" description="What Sowcast tells you, where and when." />
      <NotificationSettingsForm initial={settings} email={user.email} zones={zones} />
      <PushDevices />
      <CalendarFeeds />
      <AccountSecurity email={user.email} emailVerified={user.emailVerified} />
    </div>
  );
}
