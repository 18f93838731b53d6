import type { Metadata } from 'next';
import { VerifyEmail } from '@/components/auth/verify-email';
import { Card } from '@/components/ui/card';

export const metadata: Metadata = { title: 'Confirm your e-mail', referrer: 'no-referrer' };

/** Opening the link changes nothing (a GET has no side effect); the button confirms. */
export default async function VerifyEmailPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  return (
    <Card>
      <h1 className="text-2xl font-bold">Confirm your e-mail</h1>
      <p className="mb-5 mt-1 text-loam-soft">
        Confirming lets people add you to their properties and lets you plan more than one property of your own.
      </p>
      <VerifyEmail token={token} />
    </Card>
  );
}
