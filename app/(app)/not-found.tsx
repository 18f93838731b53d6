import { MapPinOff } from 'lucide-react';
import { ButtonLink } from '@/components/ui/button';
import { Card } from '@/components/ui/card';

export default function SignedInNotFound() {
  return (
    <Card className="mx-auto max-w-xl">
      <div className="flex items-start gap-3">
        <MapPinOff className="mt-1 size-6 shrink-0 text-frost" aria-hidden="true" />
        <div>
          <h1 className="text-xl font-bold">Nothing planted here</h1>
          <p className="mt-2 text-loam-soft">
            This page does not exist, or it belongs to a property you are not a member of. If someone sent you a
            link, check that it was copied whole, or ask them to invite you to the property.
          </p>
          <ButtonLink href="/properties" className="mt-5">
            Your properties
          </ButtonLink>
        </div>
      </div>
    </Card>
  );
}
