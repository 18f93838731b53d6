import Link from 'next/link';
import type { ReactNode } from 'react';
import { Wordmark } from '@/components/layout/wordmark';
import { ButtonLink } from '@/components/ui/button';

export default function MarketingLayout({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col">
      <header className="mx-auto flex w-full max-w-6xl items-center justify-between gap-3 px-5 py-3 sm:px-8">
        <Wordmark />
        <nav aria-label="Account" className="flex items-center gap-2">
          <Link href="/sign-in" className="inline-flex min-h-11 items-center rounded-lg px-3 font-semibold text-loam hover:bg-ground-line/60">
            Sign in
          </Link>
          <span className="hidden sm:block">
            <ButtonLink href="/sign-up">Create account</ButtonLink>
          </span>
        </nav>
      </header>
      <main id="main" className="flex-1">
        {children}
      </main>
      <footer className="border-t border-ground-line">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center justify-between gap-3 px-5 py-6 text-sm text-loam-soft sm:px-8">
          <p>Sowcast — food plot seasons, timed to the weather.</p>
          <p>
            <Link href="/sign-in" className="underline-offset-2 hover:underline">
              Sign in
            </Link>{' '}
            ·{' '}
            <Link href="/sign-up" className="underline-offset-2 hover:underline">
              Create an account
            </Link>
          </p>
        </div>
      </footer>
    </div>
  );
}
