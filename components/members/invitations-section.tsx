'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Check, Copy, UserPlus } from 'lucide-react';
import { useRef, useState } from 'react';
import { useForm, type Resolver } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { Field, Input, Select, controlAria } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { apiFetch, errorMessage, queryKeys } from '@/lib/client/api';
import { formatInstantDate } from '@/lib/client/format';
import { applyServerErrors } from '@/lib/client/forms';
import type { InvitationDto } from '@/lib/data/invitations';
import { invitationSchema, ROLE_HINTS, ROLE_LABELS, ROLES, type Role } from '@/lib/validations/membership';

type InviteFields = { email: string; role: Role };
type Created = { invitation: { id: string; email: string; role: Role; expiresAt: string }; link: string };

function CreatedLink({ created, onDone }: { created: Created; onDone: () => void }) {
  const input = useRef<HTMLInputElement>(null);
  const [copied, setCopied] = useState<'yes' | 'select' | null>(null);

  async function copy() {
    try {
      await navigator.clipboard.writeText(created.link);
      setCopied('yes');
    } catch {
      // Without clipboard access (e.g. plain http on another host) the text is selected for a manual copy.
      input.current?.select();
      setCopied('select');
    }
  }

  return (
    <Notice tone="success" title={`Invitation for ${created.invitation.email} as ${ROLE_LABELS[created.invitation.role]}`}>
      <p>
        This link is shown once. Copy it now and send it to them yourself, by text or e-mail. It works until{' '}
        <span className="tabular">{formatInstantDate(created.invitation.expiresAt)}</span> and only for that address.
      </p>
      <div className="mt-3 flex flex-col gap-2 sm:flex-row">
        <label htmlFor="invitation-link" className="sr-only">
          Invitation link
        </label>
        <Input
          ref={input}
          id="invitation-link"
          readOnly
          value={created.link}
          className="font-mono text-sm"
          onFocus={(event) => event.currentTarget.select()}
        />
        <Button variant="secondary" onClick={() => void copy()} className="shrink-0">
          {copied === 'yes' ? <Check className="size-4 text-clover" aria-hidden="true" /> : <Copy className="size-4" aria-hidden="true" />}
          {copied === 'yes' ? 'Copied' : 'Copy link'}
        </Button>
      </div>
      {copied === 'select' ? <p className="mt-2 text-xs">The link is selected: copy it with your device’s copy command.</p> : null}
      <Button variant="quiet" size="sm" className="mt-2 -ml-3" onClick={onDone}>
        Done
      </Button>
    </Notice>
  );
}

function stateOf(invitation: InvitationDto, now: number) {
  if (invitation.revokedAt) return 'Withdrawn';
  if (invitation.acceptedAt) return 'Accepted';
  if (new Date(invitation.expiresAt).getTime() < now) return 'Expired';
  return 'Open';
}

export function InvitationsSection({ propertyId }: { propertyId: string }) {
  const queryClient = useQueryClient();
  const key = queryKeys.invitations(propertyId);
  const [created, setCreated] = useState<Created | null>(null);
  const [formMessage, setFormMessage] = useState<string | null>(null);

  const query = useQuery({
    queryKey: key,
    queryFn: () => apiFetch<{ invitations: InvitationDto[] }>(`/api/properties/${propertyId}/invitations`),
  });

  const revoke = useMutation({
    mutationFn: (invitationId: string) =>
      apiFetch<void>(`/api/properties/${propertyId}/invitations/${invitationId}`, { method: 'DELETE' }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: key }),
  });

  const {
    register,
    handleSubmit,
    setError,
    reset,
    watch,
    formState: { errors, isSubmitting },
  } = useForm<InviteFields>({
    resolver: zodResolver(invitationSchema) as Resolver<InviteFields>,
    defaultValues: { email: '', role: 'member' },
  });
  const role = watch('role');

  const onSubmit = handleSubmit(async (values) => {
    setFormMessage(null);
    try {
      const result = await apiFetch<Created>(`/api/properties/${propertyId}/invitations`, { method: 'POST', body: values });
      setCreated(result);
      reset({ email: '', role: values.role });
      await queryClient.invalidateQueries({ queryKey: key });
    } catch (error) {
      setFormMessage(applyServerErrors(error, ['email', 'role'], setError));
    }
  });

  const now = Date.now();
  const invitations = query.data?.invitations ?? [];
  const open = invitations.filter((i) => stateOf(i, now) === 'Open');
  const closed = invitations.filter((i) => stateOf(i, now) !== 'Open');

  return (
    <div className="space-y-5">
      <form onSubmit={onSubmit} noValidate className="space-y-4 rounded-lg border border-ground-line bg-white p-4">
        <h3 className="font-semibold">Invite someone</h3>
        {formMessage ? <Notice tone="error">{formMessage}</Notice> : null}
        <div className="grid gap-4 sm:grid-cols-[2fr_1fr_auto] sm:items-start">
          <Field label="E-mail" htmlFor="invite-email" error={errors.email?.message}>
            <Input
              {...controlAria('invite-email', errors.email?.message)}
              type="email"
              inputMode="email"
              autoCapitalize="none"
              autoComplete="off"
              spellCheck={false}
              {...register('email')}
            />
          </Field>
          <Field label="Role" htmlFor="invite-role" error={errors.role?.message}>
            <Select {...controlAria('invite-role', errors.role?.message, true)} {...register('role')}>
              {ROLES.map((r) => (
                <option key={r} value={r}>
                  {ROLE_LABELS[r]}
                </option>
              ))}
            </Select>
          </Field>
          <Button type="submit" pending={isSubmitting} className="sm:mt-7">
            <UserPlus className="size-5" aria-hidden="true" />
            Invite
          </Button>
        </div>
        <p id="invite-role-hint" className="text-sm text-loam-soft">
          {ROLE_LABELS[role] ?? ''}: {ROLE_HINTS[role] ?? ''}
        </p>
      </form>

      {created ? <CreatedLink created={created} onDone={() => setCreated(null)} /> : null}

      <div>
        <h3 className="mb-2 font-semibold">Open invitations</h3>
        {revoke.isError ? <Notice tone="error" className="mb-3">{errorMessage(revoke.error)}</Notice> : null}
        {query.isPending ? (
          <LoadingBlock label="Loading invitations" rows={1} />
        ) : query.isError ? (
          <Notice tone="error">{errorMessage(query.error)}</Notice>
        ) : open.length === 0 ? (
          <p className="text-sm text-loam-soft">No open invitations.</p>
        ) : (
          <ul className="divide-y divide-ground-line rounded-lg border border-ground-line bg-white">
            {open.map((invitation) => (
              <li key={invitation.id} className="flex flex-col gap-2 px-4 py-3 sm:flex-row sm:items-center sm:justify-between">
                <div className="min-w-0 text-sm">
                  <p className="break-all font-semibold text-base">{invitation.email}</p>
                  <p className="text-loam-soft">
                    {ROLE_LABELS[invitation.role]} · invited by {invitation.invitedBy ?? 'a former member'} · open until{' '}
                    <span className="tabular">{formatInstantDate(invitation.expiresAt)}</span>
                  </p>
                </div>
                <Button
                  size="sm"
                  variant="secondary"
                  pending={revoke.isPending && revoke.variables === invitation.id}
                  onClick={() => revoke.mutate(invitation.id)}
                >
                  Revoke<span className="sr-only"> the invitation for {invitation.email}</span>
                </Button>
              </li>
            ))}
          </ul>
        )}
        {closed.length > 0 ? (
          <details className="mt-3 text-sm">
            <summary className="cursor-pointer py-2 font-medium">Used, withdrawn and expired ({closed.length})</summary>
            <ul className="mt-1 space-y-1 text-loam-soft">
              {closed.map((invitation) => (
                <li key={invitation.id}>
                  <span className="break-all">{invitation.email}</span> · {ROLE_LABELS[invitation.role]} · {stateOf(invitation, now)}
                </li>
              ))}
            </ul>
          </details>
        ) : null}
      </div>
    </div>
  );
}
