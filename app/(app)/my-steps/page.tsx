import type { Metadata } from 'next';
import { MyStepsView } from '@/components/field/my-steps-view';
import { PageHeader } from '@/components/ui/page-header';
import { redirect } from 'next/navigation';
import { getCurrentUser } from '@/lib/auth/session';
import { signInPath } from '@/lib/client/navigation';

export const metadata: Metadata = { title: 'My steps · Sowcast' };

/**
 * The phone page for the field: the person's steps for today and the next days, marked done where the work
 * happens — offline too (the service worker keeps the page and the last list; outcomes wait on the phone).
 */
export default async function MyStepsPage() {
  const user = await getCurrentUser();
  if (!user) redirect(signInPath('/my-steps'));
  return (
    <div className="mx-auto max-w-2xl">
      <PageHeader title="My steps" description="Yours, and the unassigned ones you may do: overdue first, then today and the next two weeks." />
      <MyStepsView userId={user.id} userName={user.name} />
    </div>
  );
}
