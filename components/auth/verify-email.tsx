'use client';

import { useState } from 'react';
import { Button, ButtonLink } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { apiFetch, errorMessage } from '@/lib/client/api';
import { useHydrated } from '@/lib/client/use-hydrated';

export function VerifyEmail({ token }: { token: string }) {
  const hydrated = useHydrated();
  const [state, setState] = useState<{ done: boolean; error: string | null; pending: boolean }>({ done: false, error: null, pending: false });
  if (state.done) {
    return (
      <div className="space-y-4">
        <Notice tone="success">Your e-mail is confirmed. Thank you.</Notice>
        <ButtonLink href="/dashboard">Go to Today</ButtonLink>
      </div>
    );
  }
  return (
    <div className="space-y-4">
      {state.error ? <Notice tone="error">{state.error}</Notice> : null}
      <Button
        pending={state.pending}
        disabled={!hydrated}
        onClick={async () => {
          setState({ done: false, error: null, pending: true });
          try {
            await apiFetch('/api/users/verification', { method: 'POST', body: { token } });
            setState({ done: true, error: null, pending: false });
          } catch (error) {
            setState({ done: false, error: errorMessage(error), pending: false });
          }
        }}
      >
        Confirm my e-mail
      </Button>
    </div>
  );
}
