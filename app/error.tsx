'use client';

import { useEffect } from 'react';
import { Wordmark } from '@/components/layout/wordmark';
import { Button, ButtonLink } from '@/components/ui/button';

export default function AppError({ error, retry }: { error: unknown; retry: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <main className="mx-auto flex min-h-screen max-w-xl flex-col justify-center gap-5 px-5 py-12">
      <Wordmark />
      <h1 className="text-2xl font-bold">Something went wrong on our side</h1>
      <p className="text-loam-soft">
        Sowcast hit a problem showing this page. Nothing you saved was changed. It is often a short hiccup — try
        again, or head back to the start.
      </p>
      <div className="flex flex-wrap gap-3">
        <Button onClick={() => retry()}>Try again</Button>
        <ButtonLink href="/" variant="secondary">
          Go to the start page
        </ButtonLink>
      </div>
    </main>
  );
}
