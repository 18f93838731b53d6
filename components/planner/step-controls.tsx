'use client';

import { useMutation, useQueryClient } from '@tanstack/react-query';
import { Check, Pin, PinOff, SkipForward } from 'lucide-react';
import { useId, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Input, Select } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { apiFetch, errorMessage } from '@/lib/client/api';
import type { StepDto } from '@/lib/data/plantings';
import { plannerKeys } from './keys';

export interface AssignableMember {
  userId: string;
  name: string;
}

/**
 * Controls on one saved step. Managers assign and pin; members and up mark it done or skipped with the
 * real date. Each answer from the server refreshes the plot's plantings, since the engine may re-place the
 * steps after this one.
 */
export function StepControls({
  step,
  plotId,
  members,
  canManage,
  canWork,
  today,
}: {
  step: StepDto;
  plotId: string;
  members: AssignableMember[];
  canManage: boolean;
  canWork: boolean;
  today: string;
}) {
  const queryClient = useQueryClient();
  const id = useId();
  const [outcomeDate, setOutcomeDate] = useState(today);
  const refresh = () => queryClient.invalidateQueries({ queryKey: plannerKeys.plantings(plotId) });

  const patch = useMutation({
    mutationFn: (body: { assigneeId?: string | null; pinned?: boolean }) =>
      apiFetch(`/api/steps/${step.id}`, { method: 'PATCH', body }),
    onSuccess: refresh,
  });
  const complete = useMutation({
    mutationFn: (status: 'done' | 'skipped') =>
      apiFetch(`/api/steps/${step.id}/complete`, { method: 'POST', body: { status, ...(outcomeDate ? { date: outcomeDate } : {}) } }),
    onSuccess: refresh,
  });

  if (!canManage && !canWork) return null;
  const error = patch.error ?? complete.error;
  const planned = step.status === 'planned';

  return (
    <div className="space-y-3 border-t border-ground-line pt-3">
      {error ? <Notice tone="error">{errorMessage(error)}</Notice> : null}
      <div className="flex flex-wrap items-end gap-3">
        {canManage ? (
          <>
            <div className="flex min-w-48 flex-col gap-1">
              <label htmlFor={`${id}-assignee`} className="text-xs font-semibold text-loam-soft">
                Assigned to
              </label>
              <Select
                id={`${id}-assignee`}
                value={step.assigneeId ?? ''}
                disabled={patch.isPending}
                onChange={(event) => patch.mutate({ assigneeId: event.target.value || null })}
              >
                <option value="">Nobody yet</option>
                {members.map((m) => (
                  <option key={m.userId} value={m.userId}>
                    {m.name}
                  </option>
                ))}
              </Select>
            </div>
            {planned && !step.recurrence ? (
              <Button
                variant="secondary"
                pending={patch.isPending && patch.variables?.pinned !== undefined}
                onClick={() => patch.mutate({ pinned: !step.pinned })}
                aria-pressed={step.pinned}
              >
                {step.pinned ? <PinOff className="size-4" aria-hidden="true" /> : <Pin className="size-4" aria-hidden="true" />}
                {step.pinned ? 'Unpin the date' : 'Pin the date'}
              </Button>
            ) : null}
          </>
        ) : null}
        {canWork && planned ? (
          <div className="flex flex-wrap items-end gap-2">
            <div className="flex flex-col gap-1">
              <label htmlFor={`${id}-date`} className="text-xs font-semibold text-loam-soft">
                Date it was done
              </label>
              <Input id={`${id}-date`} type="date" value={outcomeDate} max={today} onChange={(e) => setOutcomeDate(e.target.value)} className="w-44" />
            </div>
            <Button pending={complete.isPending && complete.variables === 'done'} onClick={() => complete.mutate('done')}>
              <Check className="size-4" aria-hidden="true" />
              Mark done
            </Button>
            <Button variant="quiet" pending={complete.isPending && complete.variables === 'skipped'} onClick={() => complete.mutate('skipped')}>
              <SkipForward className="size-4" aria-hidden="true" />
              Skip
            </Button>
          </div>
        ) : null}
      </div>
    </div>
  );
}
