import type { Metadata } from 'next';
import { Wordmark } from '@/components/layout/wordmark';
import { ButtonLink } from '@/components/ui/button';

export const metadata: Metadata = { title: 'Not found' };

export default function NotFound() {
  return (
    <main className="mx-auto flex min-h-screen max-w-xl flex-col justify-center gap-5 px-5 py-12">
      <Wordmark />
      <h1 className="text-2xl font-bold">Nothing planted here</h1>
      <p className="text-loam-soft">
        This page does not exist, or it belongs to a property you are not a member of. If someone sent you a
        link, check that it was copied whole, or ask them to invite you to the property.
      </p>
      <div className="flex flex-wrap gap-3">
        <ButtonLink href="/properties">Your properties</ButtonLink>
        <ButtonLink href="/" variant="secondary">
          Start page
        </ButtonLink>
      </div>
    </main>
  );
}
