'use client';

import { useMutation, useQuery } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { Button, ButtonLink } from '@/components/ui/button';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { ApiError, apiFetch, errorMessage, queryKeys } from '@/lib/client/api';
import { formatInstantDate } from '@/lib/client/format';
import { signInPath, signUpPath } from '@/lib/client/navigation';
import { ROLE_HINTS, ROLE_LABELS, type Role } from '@/lib/validations/membership';

interface InvitationView {
  propertyName: string;
  role: Role;
  email: string;
  inviter: string | null;
  expiresAt: string;
  state: 'open' | 'accepted' | 'revoked' | 'expired';
}

const CLOSED: Record<Exclude<InvitationView['state'], 'open'>, string> = {
  accepted: 'This invitation has already been used. If it was you, the property is in your list.',
  revoked: 'The owner withdrew this invitation. Ask them for a new one if you still need access.',
  expired: 'This invitation has expired. Ask the owner to send a new one.',
};

export function InvitationDetails({ token, user }: { token: string; user: { name: string; email: string } | null }) {
  const router = useRouter();
  const here = `/invitations/${token}`;
  const query = useQuery({
    queryKey: queryKeys.invitation(token),
    queryFn: () => apiFetch<{ invitation: InvitationView }>(`/api/invitations/${encodeURIComponent(token)}`),
  });
  const accept = useMutation({
    mutationFn: () =>
      apiFetch<{ propertyId: string; role: Role }>(`/api/invitations/${encodeURIComponent(token)}/accept`, { method: 'POST' }),
    onSuccess: ({ propertyId }) => {
      router.push(`/properties/${propertyId}`);
      router.refresh();
    },
  });

  if (query.isPending) return <LoadingBlock label="Loading the invitation" rows={3} />;
  if (query.isError) {
    const gone = query.error instanceof ApiError && query.error.status === 404;
    return (
      <div className="space-y-4">
        <h1 className="text-2xl font-bold">{gone ? 'This invitation link does not work' : 'The invitation did not load'}</h1>
        <Notice tone="error">
          {gone
            ? 'No invitation matches this link. Check that the whole link was copied, or ask the owner of the property to invite you again.'
            : errorMessage(query.error)}
        </Notice>
        {!gone ? <Button onClick={() => void query.refetch()}>Try again</Button> : null}
      </div>
    );
  }

  const invitation = query.data.invitation;
  const open = invitation.state === 'open';
  const otherAddress = user && user.email !== invitation.email;
  return (
    <div className="space-y-5">
      <div>
        <p className="text-sm font-semibold uppercase tracking-wide text-clover">Invitation</p>
        <h1 className="mt-1 text-2xl font-bold">{invitation.propertyName}</h1>
        <p className="mt-2 text-loam-soft">
          {invitation.inviter ? <strong className="text-loam">{invitation.inviter}</strong> : 'The owner'} invited{' '}
          <strong className="break-all text-loam">{invitation.email}</strong> to join this property.
        </p>
      </div>

      <dl className="grid gap-3 rounded-lg border border-ground-line bg-white px-4 py-3 text-sm">
        <div>
          <dt className="font-semibold">Role</dt>
          <dd>
            {ROLE_LABELS[invitation.role]} — <span className="text-loam-soft">{ROLE_HINTS[invitation.role]}</span>
          </dd>
        </div>
        <div>
          <dt className="font-semibold">{open ? 'Open until' : 'State'}</dt>
          <dd className="tabular">
            {open ? formatInstantDate(invitation.expiresAt) : invitation.state === 'accepted' ? 'Used' : invitation.state === 'revoked' ? 'Withdrawn' : 'Expired'}
          </dd>
        </div>
      </dl>

      {!open ? (
        <Notice tone="info">{CLOSED[invitation.state as keyof typeof CLOSED]}</Notice>
      ) : user ? (
        <div className="space-y-4">
          {otherAddress ? (
            <Notice tone="caution" title="A different address">
              You are signed in as {user.email}, but the invitation is for {invitation.email}. Sign out and sign in with
              that address, or ask the owner to invite {user.email}.
            </Notice>
          ) : null}
          {accept.isError ? <Notice tone="error">{errorMessage(accept.error)}</Notice> : null}
          <Button className="w-full" pending={accept.isPending || accept.isSuccess} onClick={() => accept.mutate()}>
            Accept invitation
          </Button>
          <p className="text-center text-sm text-loam-soft">Signed in as {user.name}.</p>
        </div>
      ) : (
        <div className="space-y-3">
          <p className="text-loam-soft">Sign in or create an account with {invitation.email} to accept.</p>
          <ButtonLink href={signInPath(here)} className="w-full">
            Sign in to accept
          </ButtonLink>
          <ButtonLink href={signUpPath(here, invitation.email)} variant="secondary" className="w-full">
            Create an account
          </ButtonLink>
        </div>
      )}
    </div>
  );
}
