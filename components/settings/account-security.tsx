'use client';

import { signOut } from 'next-auth/react';
import { useId, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Field, Input, controlAria } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { apiFetch, ApiError, errorMessage } from '@/lib/client/api';
import { forgetOfflineCopy } from '@/lib/client/field-offline';

type Status = { tone: 'success' | 'error'; text: string } | null;

/** Confirming the e-mail, changing the password, and signing out on every device. */
export function AccountSecurity({ email, emailVerified }: { email: string; emailVerified: boolean }) {
  const id = useId();
  const [status, setStatus] = useState<Status>(null);
  const [fields, setFields] = useState<Record<string, string>>({});
  const [pending, setPending] = useState<'resend' | 'password' | 'everywhere' | null>(null);
  const [currentPassword, setCurrentPassword] = useState('');
  const [newPassword, setNewPassword] = useState('');

  async function run(kind: 'resend' | 'password' | 'everywhere', action: () => Promise<string>) {
    setPending(kind);
    setStatus(null);
    setFields({});
    try {
      setStatus({ tone: 'success', text: await action() });
    } catch (error) {
      if (error instanceof ApiError) setFields(error.fields);
      setStatus({ tone: 'error', text: errorMessage(error) });
    } finally {
      setPending(null);
    }
  }

  const endHere = () => forgetOfflineCopy().finally(() => signOut({ callbackUrl: '/sign-in' }));

  return (
    <Card aria-labelledby={`${id}-heading`}>
      <CardHeader id={`${id}-heading`} title="Your account" description={`Signed in as ${email}.`} />
      <div className="space-y-5">
        {status ? <Notice tone={status.tone}>{status.text}</Notice> : null}
        {emailVerified ? null : (
          <div className="space-y-2">
            <p className="text-sm">
              Your e-mail is not confirmed yet. Until it is, nobody can add you to their property and you can plan one property of your own.
            </p>
            <Button
              variant="secondary"
              size="sm"
              pending={pending === 'resend'}
              onClick={() => run('resend', async () => {
                await apiFetch('/api/settings/email-verification', { method: 'POST' });
                return `A new confirmation link is on its way to ${email}.`;
              })}
            >
              Send the confirmation link again
            </Button>
          </div>
        )}
        <form
          className="space-y-3"
          onSubmit={(event) => {
            event.preventDefault();
            void run('password', async () => {
              await apiFetch('/api/settings/password', { method: 'POST', body: { currentPassword, newPassword } });
              setTimeout(() => void endHere(), 1_500);
              return 'Password changed. Every device is signed out; sign in again with the new password.';
            });
          }}
        >
          <Field label="Current password" htmlFor={`${id}-current`} error={fields.currentPassword}>
            <Input {...controlAria(`${id}-current`, fields.currentPassword)} type="password" autoComplete="current-password" value={currentPassword} onChange={(e) => setCurrentPassword(e.target.value)} />
          </Field>
          <Field label="New password" htmlFor={`${id}-new`} error={fields.newPassword} hint="At least 10 characters. A few unrelated words make a strong one.">
            <Input {...controlAria(`${id}-new`, fields.newPassword, true)} type="password" autoComplete="new-password" value={newPassword} onChange={(e) => setNewPassword(e.target.value)} />
          </Field>
          <Button type="submit" size="sm" pending={pending === 'password'}>
            Change password
          </Button>
        </form>
        <div className="space-y-2 border-t border-loam/10 pt-4">
          <p className="text-sm">Lost a phone, or signed in on a shared computer? End every session of this account, this one included.</p>
          <Button
            variant="secondary"
            size="sm"
            pending={pending === 'everywhere'}
            onClick={() => run('everywhere', async () => {
              await apiFetch('/api/settings/sessions', { method: 'DELETE' });
              void endHere();
              return 'Signed out everywhere.';
            })}
          >
            Sign out everywhere
          </Button>
        </div>
      </div>
    </Card>
  );
}
