import type { ReactNode } from 'react';
import { Wordmark } from '@/components/layout/wordmark';
import { Providers } from '@/components/providers';

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <Providers>
      <div className="flex min-h-screen flex-col">
        <header className="mx-auto w-full max-w-md px-5 pt-6">
          <Wordmark />
        </header>
        <main id="main" className="mx-auto w-full max-w-md flex-1 px-5 pb-16 pt-6">
          {children}
        </main>
      </div>
    </Providers>
  );
}
