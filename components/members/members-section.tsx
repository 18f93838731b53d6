'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { RoleBadge } from '@/components/properties/role-badge';
import { Button } from '@/components/ui/button';
import { Select } from '@/components/ui/field';
import { LoadError } from '@/components/ui/load-error';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { apiFetch, errorMessage, queryKeys } from '@/lib/client/api';
import { ROLE_HINTS, ROLE_LABELS, ROLES, type Role } from '@/lib/validations/membership';

interface Member {
  userId: string;
  name: string;
  // Only owners are sent the e-mail addresses.
  email: string | null;
  role: Role;
  since: string;
}

export function MembersSection({
  propertyId,
  propertyName,
  currentUserId,
  isOwner,
}: {
  propertyId: string;
  propertyName: string;
  currentUserId: string;
  isOwner: boolean;
}) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [confirming, setConfirming] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const key = queryKeys.members(propertyId);
  const query = useQuery({
    queryKey: key,
    queryFn: () => apiFetch<{ members: Member[] }>(`/api/properties/${propertyId}/members`),
  });

  const changeRole = useMutation({
    mutationFn: ({ userId, role }: { userId: string; role: Role }) =>
      apiFetch(`/api/properties/${propertyId}/members/${userId}`, { method: 'PATCH', body: { role } }),
    onMutate: () => setProblem(null),
    onSuccess: async (_data, { userId }) => {
      await queryClient.invalidateQueries({ queryKey: key });
      // One's own role decides what this page shows.
      if (userId === currentUserId) {
        await queryClient.invalidateQueries({ queryKey: queryKeys.properties, exact: true });
        router.refresh();
      }
    },
    onError: (error) => setProblem(errorMessage(error)),
  });

  const remove = useMutation({
    mutationFn: (userId: string) => apiFetch<void>(`/api/properties/${propertyId}/members/${userId}`, { method: 'DELETE' }),
    onMutate: () => setProblem(null),
    onSuccess: async (_data, userId) => {
      setConfirming(null);
      if (userId === currentUserId) {
        // Dropped, not just marked stale: the list must not flash a property that is gone.
        queryClient.removeQueries({ queryKey: ['properties', propertyId] });
        queryClient.removeQueries({ queryKey: queryKeys.properties, exact: true });
        router.push('/properties');
        router.refresh();
        return;
      }
      await queryClient.invalidateQueries({ queryKey: key });
    },
    onError: (error) => setProblem(errorMessage(error)),
  });

  if (query.isPending) return <LoadingBlock label="Loading the people on this property" rows={2} />;
  if (query.isError) {
    return <LoadError title="The members did not load" error={query.error} onRetry={() => void query.refetch()} />;
  }

  const ownerCount = query.data.members.filter((m) => m.role === 'owner').length;

  return (
    <div className="space-y-4">
      {problem ? <Notice tone="error">{problem}</Notice> : null}
      <ul className="divide-y divide-ground-line rounded-lg border border-ground-line bg-white">
        {query.data.members.map((member) => {
          const self = member.userId === currentUserId;
          const selectId = `member-role-${member.userId}`;
          return (
            <li key={member.userId} className="flex flex-col gap-3 px-4 py-3 sm:flex-row sm:items-center sm:justify-between">
              <div className="min-w-0">
                <p className="font-semibold">
                  {member.name}
                  {self ? <span className="ml-2 text-sm font-normal text-loam-soft">(you)</span> : null}
                </p>
                {member.email ? <p className="break-all text-sm text-loam-soft">{member.email}</p> : null}
                {!isOwner ? <RoleBadge role={member.role} className="mt-1" /> : null}
              </div>

              {confirming === member.userId ? (
                <div className="flex flex-col gap-2 sm:items-end">
                  <p className="text-sm font-medium">
                    {self
                      ? `Leave ${propertyName}? You will no longer see it.`
                      : `Remove ${member.name} from ${propertyName}?`}
                  </p>
                  <div className="flex gap-2">
                    <Button size="sm" variant="secondary" onClick={() => setConfirming(null)}>
                      {self ? 'Stay' : 'Keep'}
                    </Button>
                    <Button size="sm" variant="danger" pending={remove.isPending} onClick={() => remove.mutate(member.userId)}>
                      {self ? 'Leave property' : 'Remove member'}
                    </Button>
                  </div>
                </div>
              ) : (
                <div className="flex flex-wrap items-center gap-2">
                  {isOwner ? (
                    <div className="flex items-center gap-2">
                      <label htmlFor={selectId} className="sr-only">
                        Role for {member.name}
                      </label>
                      <Select
                        id={selectId}
                        className="w-36"
                        value={member.role}
                        disabled={changeRole.isPending}
                        title={ROLE_HINTS[member.role]}
                        onChange={(event) => changeRole.mutate({ userId: member.userId, role: event.target.value as Role })}
                      >
                        {ROLES.map((role) => (
                          <option key={role} value={role}>
                            {ROLE_LABELS[role]}
                          </option>
                        ))}
                      </Select>
                    </div>
                  ) : null}
                  {self && member.role === 'owner' && ownerCount === 1 ? (
                    // The last owner cannot leave; the API would refuse, so the button is not offered.
                    <span className="text-xs text-loam-soft">Only owner</span>
                  ) : self ? (
                    <Button size="sm" variant="secondary" onClick={() => setConfirming(member.userId)}>
                      Leave
                    </Button>
                  ) : isOwner ? (
                    <Button size="sm" variant="danger-quiet" onClick={() => setConfirming(member.userId)}>
                      Remove<span className="sr-only"> {member.name}</span>
                    </Button>
                  ) : null}
                </div>
              )}
            </li>
          );
        })}
      </ul>
      <details className="text-sm text-loam-soft">
        <summary className="cursor-pointer py-2 font-medium text-loam">What each role can do</summary>
        <dl className="mt-1 grid gap-2">
          {ROLES.map((role) => (
            <div key={role}>
              <dt className="inline font-semibold text-loam">{ROLE_LABELS[role]}: </dt>
              <dd className="inline">{ROLE_HINTS[role]}</dd>
            </div>
          ))}
        </dl>
      </details>
    </div>
  );
}
