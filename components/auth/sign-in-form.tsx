'use client';

import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { signIn } from 'next-auth/react';
import { useId, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, controlAria } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { useHydrated } from '@/lib/client/use-hydrated';
import { signUpPath } from '@/lib/client/navigation';
import { signInSchema } from '@/lib/validations/user';

type Errors = Partial<Record<'email' | 'password', string>>;

export function SignInForm({ callbackUrl, initialError }: { callbackUrl: string; initialError?: string }) {
  const router = useRouter();
  const id = useId();
  const [email, setEmail] = useState('');
  const [password, setPassword] = useState('');
  const [errors, setErrors] = useState<Errors>({});
  const [message, setMessage] = useState<string | undefined>(initialError);
  const [pending, setPending] = useState(false);
  const hydrated = useHydrated();

  async function onSubmit(event: FormEvent<HTMLFormElement>) {
    event.preventDefault();
    setMessage(undefined);
    const parsed = signInSchema.safeParse({ email, password });
    if (!parsed.success) {
      const next: Errors = {};
      for (const issue of parsed.error.issues) {
        const key = issue.path[0] as keyof Errors;
        next[key] ??= issue.message;
      }
      setErrors(next);
      return;
    }
    setErrors({});
    setPending(true);
    try {
      const result = await signIn('credentials', { redirect: false, email: parsed.data.email, password });
      if (!result || result.error || !result.ok) {
        // next-auth passes the message thrown by authorize() through as `error`.
        setMessage(result?.error && result.error !== 'CredentialsSignin' ? result.error : 'Sign-in did not work. Check the e-mail and password and try again.');
        setPending(false);
        return;
      }
      router.replace(callbackUrl);
      router.refresh();
    } catch {
      setMessage('Sowcast could not be reached. Check your connection and try again.');
      setPending(false);
    }
  }

  const emailId = `${id}-email`;
  const passwordId = `${id}-password`;
  return (
    <form onSubmit={onSubmit} method="post" noValidate className="space-y-5">
      {message ? <Notice tone="error">{message}</Notice> : null}
      <Field label="E-mail" htmlFor={emailId} error={errors.email}>
        <Input
          {...controlAria(emailId, errors.email)}
          name="email"
          type="email"
          autoComplete="email"
          inputMode="email"
          autoCapitalize="none"
          spellCheck={false}
          value={email}
          onChange={(e) => setEmail(e.target.value)}
          required
        />
      </Field>
      <Field label="Password" htmlFor={passwordId} error={errors.password}>
        <Input
          {...controlAria(passwordId, errors.password)}
          name="password"
          type="password"
          autoComplete="current-password"
          value={password}
          onChange={(e) => setPassword(e.target.value)}
          required
        />
      </Field>
      <Button type="submit" pending={pending} disabled={!hydrated} className="w-full">
        Sign in
      </Button>
      <p className="text-center text-sm text-loam-soft">
        New to Sowcast?{' '}
        <Link href={signUpPath(callbackUrl === '/dashboard' ? undefined : callbackUrl)} className="font-semibold text-rain underline-offset-2 hover:underline">
          Create an account
        </Link>
      </p>
    </form>
  );
}
