import Link from 'next/link';
import { headers } from 'next/headers';
import { redirect } from 'next/navigation';
import type { ReactNode } from 'react';
import { AppHeader } from '@/components/layout/app-header';
import { Providers } from '@/components/providers';
import { getCurrentUser } from '@/lib/auth/session';
import { safeCallbackUrl, signInPath } from '@/lib/client/navigation';

export default async function SignedInLayout({ children }: { children: ReactNode }) {
  const user = await getCurrentUser();
  if (!user) {
    const path = safeCallbackUrl((await headers()).get('x-sowcast-path'), '/properties');
    redirect(signInPath(path));
  }
  return (
    <Providers>
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-3 focus:top-3 focus:z-10 focus:rounded-lg focus:bg-white focus:px-4 focus:py-2">
        Skip to content
      </a>
      <AppHeader userName={user.name} />
      <main id="main" className="mx-auto w-full max-w-5xl px-4 pb-16 pt-6 sm:px-6 sm:pt-8">
        {user.emailVerified ? null : (
          <p className="mb-6 rounded-lg bg-rain-light px-4 py-3 text-sm">
            Confirm your e-mail with the link we sent to <strong>{user.email}</strong>: until then nobody can add you to their
            property. <Link href="/settings" className="font-semibold underline">Send it again</Link>
          </p>
        )}
        {children}
      </main>
    </Providers>
  );
}
