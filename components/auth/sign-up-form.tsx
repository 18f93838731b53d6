'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import Link from 'next/link';
import { useRouter } from 'next/navigation';
import { signIn } from 'next-auth/react';
import { useId, useState } from 'react';
import { useForm, type Resolver } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { Field, Input, controlAria } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { useHydrated } from '@/lib/client/use-hydrated';
import { ApiError, apiFetch, errorMessage } from '@/lib/client/api';
import { signInPath } from '@/lib/client/navigation';
import { signUpSchema } from '@/lib/validations/user';

type Values = { name: string; email: string; password: string };
const FIELDS = ['name', 'email', 'password'] as const;

export function SignUpForm({ callbackUrl, email = '' }: { callbackUrl: string; email?: string }) {
  const hydrated = useHydrated();
  const router = useRouter();
  const id = useId();
  const [message, setMessage] = useState<{ text: string; signIn?: boolean } | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<Values>({
    resolver: zodResolver(signUpSchema) as Resolver<Values>,
    defaultValues: { name: '', email, password: '' },
  });

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    try {
      await apiFetch('/api/users', { method: 'POST', body: values });
    } catch (error) {
      if (error instanceof ApiError) {
        for (const field of FIELDS) {
          if (error.fields[field]) setError(field, { type: 'server', message: error.fields[field] });
        }
        setMessage({ text: error.message });
      } else {
        setMessage({ text: errorMessage(error) });
      }
      return;
    }
    const result = await signIn('credentials', { redirect: false, email: values.email, password: values.password }).catch(() => null);
    if (!result?.ok || result.error) {
      // The same words whether the address was new or already had an account (the server says no more).
      setMessage({ text: 'Check your e-mail: we sent a link to confirm the address. If you already have an account, sign in with it.', signIn: true });
      return;
    }
    router.replace(callbackUrl);
    router.refresh();
  });

  const ids = { name: `${id}-name`, email: `${id}-email`, password: `${id}-password` };
  return (
    <form onSubmit={onSubmit} method="post" noValidate className="space-y-5">
      {message ? (
        <Notice tone="error">
          {message.text}
          {message.signIn ? (
            <>
              {' '}
              <Link href={signInPath(callbackUrl)} className="font-semibold text-rain underline">
                Sign in instead
              </Link>
            </>
          ) : null}
        </Notice>
      ) : null}
      <Field label="Your name" htmlFor={ids.name} error={errors.name?.message} hint="Shown to the people you share a property with.">
        <Input {...controlAria(ids.name, errors.name?.message, true)} autoComplete="name" {...register('name')} />
      </Field>
      <Field label="E-mail" htmlFor={ids.email} error={errors.email?.message}>
        <Input
          {...controlAria(ids.email, errors.email?.message)}
          type="email"
          autoComplete="email"
          inputMode="email"
          autoCapitalize="none"
          spellCheck={false}
          {...register('email')}
        />
      </Field>
      <Field label="Password" htmlFor={ids.password} error={errors.password?.message} hint="At least 10 characters. A few unrelated words make a strong one.">
        <Input {...controlAria(ids.password, errors.password?.message, true)} type="password" autoComplete="new-password" {...register('password')} />
      </Field>
      <Button type="submit" pending={isSubmitting} disabled={!hydrated} className="w-full">
        Create account
      </Button>
      <p className="text-center text-sm text-loam-soft">
        Already have an account?{' '}
        <Link href={signInPath(callbackUrl === '/dashboard' ? undefined : callbackUrl)} className="font-semibold text-rain underline-offset-2 hover:underline">
          Sign in
        </Link>
      </p>
    </form>
  );
}
