'use client';

import { useEffect } from 'react';
import { Button, ButtonLink } from '@/components/ui/button';
import { Card } from '@/components/ui/card';

export default function SignedInError({ error, retry }: { error: unknown; retry: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <Card className="mx-auto max-w-xl">
      <h1 className="text-xl font-bold">This page did not load</h1>
      <p className="mt-2 text-loam-soft">
        Something went wrong while Sowcast put this page together. Nothing you saved was changed. Try again in a
        moment; if it keeps happening, go back to your properties and start from there.
      </p>
      <div className="mt-5 flex flex-wrap gap-3">
        <Button onClick={() => retry()}>Try again</Button>
        <ButtonLink href="/properties" variant="secondary">
          Back to properties
        </ButtonLink>
      </div>
    </Card>
  );
}
