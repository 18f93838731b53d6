import type { Metadata } from 'next';
import { SignUpForm } from '@/components/auth/sign-up-form';
import { Card } from '@/components/ui/card';
import { safeCallbackUrl } from '@/lib/client/navigation';

export const metadata: Metadata = { title: 'Create an account' };

type SearchParams = Promise<Record<string, string | string[] | undefined>>;

export default async function SignUpPage({ searchParams }: { searchParams: SearchParams }) {
  const query = await searchParams;
  const callbackUrl = safeCallbackUrl(query.callbackUrl, '/dashboard');
  const email = typeof query.email === 'string' ? query.email.slice(0, 254) : '';
  return (
    <Card>
      <h1 className="text-2xl font-bold">Create your account</h1>
      <p className="mb-5 mt-1 text-loam-soft">
        One account for every property you plant, whether you own it, lease it or hunt it by invitation.
      </p>
      <SignUpForm callbackUrl={callbackUrl} email={email} />
    </Card>
  );
}
