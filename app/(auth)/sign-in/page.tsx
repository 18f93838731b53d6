import type { Metadata } from 'next';
import Link from 'next/link';
import { SignInForm } from '@/components/auth/sign-in-form';
import { Card } from '@/components/ui/card';
import { isSignInMessage } from '@/lib/auth/options';
import { getCurrentUser } from '@/lib/auth/session';
import { safeCallbackUrl } from '@/lib/client/navigation';

export const metadata: Metadata = { title: 'Sign in' };

type SearchParams = Promise<Record<string, string | string[] | undefined>>;

// Without JavaScript next-auth sends the visitor back here with ?error=…; only its own messages are shown,
// so a crafted link cannot put arbitrary words on the sign-in page.

export default async function SignInPage({ searchParams }: { searchParams: SearchParams }) {
  const query = await searchParams;
  const callbackUrl = safeCallbackUrl(query.callbackUrl, '/dashboard');
  const errorParam = typeof query.error === 'string' ? query.error : undefined;
  const initialError = errorParam ? (isSignInMessage(errorParam) ? errorParam : 'Sign-in did not work. Try again.') : undefined;
  // A database hiccup must not hide the form; signing in will then say what is wrong.
  const user = await getCurrentUser().catch(() => null);
  return (
    <Card>
      <h1 className="text-2xl font-bold">Sign in</h1>
      <p className="mb-5 mt-1 text-loam-soft">Welcome back. Your plots and their plans are where you left them.</p>
      {user ? (
        <p className="mb-5 rounded-lg bg-clover-light px-4 py-3 text-sm">
          You are already signed in as <strong>{user.name}</strong>.{' '}
          <Link href={callbackUrl} className="font-semibold text-clover-dark underline">
            Continue
          </Link>{' '}
          or sign in as someone else below.
        </p>
      ) : null}
      <SignInForm callbackUrl={callbackUrl} initialError={initialError} />
    </Card>
  );
}
