import { Lock } from 'lucide-react';
import { ButtonLink } from './button';
import { Card } from './card';

/** Shown instead of a page a member's role does not allow. Says why, and where to go instead. */
export function NoAccess({ message, backHref, backLabel }: { message: string; backHref: string; backLabel: string }) {
  return (
    <Card className="mx-auto max-w-xl">
      <div className="flex items-start gap-3">
        <Lock className="mt-1 size-6 shrink-0 text-frost" aria-hidden="true" />
        <div>
          <h1 className="text-xl font-bold">Not with your role</h1>
          <p className="mt-2 text-loam-soft">{message}.</p>
          <p className="mt-2 text-sm text-loam-soft">
            If you need to change this, ask an owner of the property to give you a different role.
          </p>
          <ButtonLink href={backHref} variant="secondary" className="mt-5">
            {backLabel}
          </ButtonLink>
        </div>
      </div>
    </Card>
  );
}
