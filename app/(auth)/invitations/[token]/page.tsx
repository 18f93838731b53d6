import type { Metadata } from 'next';
import { InvitationDetails } from '@/components/auth/invitation-view';
import { Card } from '@/components/ui/card';
import { getCurrentUser } from '@/lib/auth/session';

export const metadata: Metadata = { title: 'Invitation', referrer: 'no-referrer' };

export default async function InvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const user = await getCurrentUser();
  return (
    <Card>
      <InvitationDetails token={token} user={user ? { name: user.name, email: user.email } : null} />
    </Card>
  );
}
