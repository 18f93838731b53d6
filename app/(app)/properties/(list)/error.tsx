'use client';

import { useEffect } from 'react';
import { Button, ButtonLink } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';

export default function PropertiesError({ error, retry }: { error: unknown; retry: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <div className="space-y-4">
      <Notice tone="error" title="Your properties did not load">
        Sowcast could not put the page together just now. Nothing you saved was changed.
      </Notice>
      <div className="flex flex-wrap gap-3">
        <Button onClick={() => retry()}>Try again</Button>
        <ButtonLink href="/properties" variant="secondary">
          All properties
        </ButtonLink>
      </div>
    </div>
  );
}
