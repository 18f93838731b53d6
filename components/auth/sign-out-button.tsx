'use client';

import { LogOut } from 'lucide-react';
import { signOut } from 'next-auth/react';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { forgetOfflineCopy } from '@/lib/client/field-offline';

export function SignOutButton() {
  const [pending, setPending] = useState(false);
  return (
    <Button
      variant="secondary"
      size="sm"
      pending={pending}
      onClick={() => {
        setPending(true);
        // The phone's offline copy of My steps is this person's list: it goes with them.
        void forgetOfflineCopy().finally(() => signOut({ callbackUrl: '/' }));
      }}
    >
      {pending ? null : <LogOut className="size-4" aria-hidden="true" />}
      Sign out
    </Button>
  );
}
