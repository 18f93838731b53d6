'use client';

import { errorMessage } from '@/lib/client/api';
import { Button } from './button';
import { Notice } from './notice';

/** What a client-fetched section shows when its data did not load: the reason, and a way to try again. */
export function LoadError({ title, error, onRetry, className = '' }: { title: string; error: unknown; onRetry: () => void; className?: string }) {
  return (
    <div className={`space-y-3 ${className}`}>
      <Notice tone="error" title={title}>
        {errorMessage(error)}
      </Notice>
      <Button variant="secondary" onClick={onRetry}>
        Try again
      </Button>
    </div>
  );
}
