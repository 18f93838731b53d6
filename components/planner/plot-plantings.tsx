'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Trash2 } from 'lucide-react';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { apiFetch, errorMessage, queryKeys } from '@/lib/client/api';
import { formatLocalDate } from '@/lib/client/format';
import type { MemberDto } from '@/lib/data/memberships';
import type { StepDto } from '@/lib/data/plantings';
import type { PlantingDto } from '@/lib/data/steps';
import { METHOD_LABELS } from '@/lib/validations/planting';
import { plannerKeys } from './keys';
import { PlanSteps } from './plan-steps';
import { StepKindLegend } from './step-kind-style';

type PlantingWithSteps = PlantingDto & { steps: StepDto[] };

/** The plot's plantings, newest season first, each with its plan and the controls the role allows. */
export function PlotPlantings({
  plotId,
  propertyId,
  initial,
  canManage,
  canWork,
  today,
}: {
  plotId: string;
  propertyId: string;
  initial: PlantingWithSteps[];
  canManage: boolean;
  canWork: boolean;
  today: string;
}) {
  const queryClient = useQueryClient();
  const [confirming, setConfirming] = useState<string | null>(null);
  const plantings = useQuery({
    queryKey: plannerKeys.plantings(plotId),
    queryFn: () => apiFetch<{ plantings: PlantingWithSteps[] }>(`/api/plots/${plotId}/plantings`),
    initialData: { plantings: initial },
  });
  const members = useQuery({
    queryKey: queryKeys.members(propertyId),
    queryFn: () => apiFetch<{ members: MemberDto[] }>(`/api/properties/${propertyId}/members`),
  });
  const remove = useMutation({
    mutationFn: (plantingId: string) => apiFetch<void>(`/api/plantings/${plantingId}`, { method: 'DELETE' }),
    onSuccess: async () => {
      setConfirming(null);
      await queryClient.invalidateQueries({ queryKey: plannerKeys.plantings(plotId) });
    },
  });
  // Viewers are not given work, so they are not offered as assignees (the server refuses them too).
  const assignable = (members.data?.members ?? []).filter((m) => m.role !== 'viewer').map((m) => ({ userId: m.userId, name: m.name }));
  const everyone = (members.data?.members ?? []).map((m) => ({ userId: m.userId, name: m.name }));

  return (
    <Card aria-labelledby="plantings-heading">
      <CardHeader id="plantings-heading" title="Plantings and their steps" description={<StepKindLegend />} />
      {plantings.isError ? (
        <Notice tone="error" title="The plantings did not refresh">
          {errorMessage(plantings.error)}
        </Notice>
      ) : null}
      {remove.isError ? <Notice tone="error">{errorMessage(remove.error)}</Notice> : null}
      {plantings.isFetching && !plantings.data ? <LoadingBlock label="Loading plantings" /> : null}
      {plantings.data.plantings.length === 0 ? (
        <p className="text-loam-soft">
          {canManage ? 'No plantings yet. Plan one below: the engine lays out every step from the spray to the germination check.' : 'No plantings have been planned for this plot yet.'}
        </p>
      ) : (
        <div className="space-y-8">
          {plantings.data.plantings.map((planting) => (
            <section key={planting.id} aria-label={`${planting.season} ${planting.year} planting`} className="space-y-3">
              <div className="flex flex-wrap items-start justify-between gap-3">
                <div>
                  <h3 className="text-lg font-semibold capitalize">
                    {planting.season} {planting.year}
                  </h3>
                  <p className="text-sm text-loam-soft">
                    {METHOD_LABELS[planting.method]} · seeding planned {formatLocalDate(planting.targetSeedDate)}
                    {planting.readyBy ? ` · ready by ${formatLocalDate(planting.readyBy)}` : ''}
                  </p>
                </div>
                {canManage ? (
                  confirming === planting.id ? (
                    <div className="flex flex-wrap items-center gap-2">
                      <span className="text-sm font-medium">Remove this planting and its steps?</span>
                      <Button size="sm" variant="secondary" onClick={() => setConfirming(null)}>
                        Keep
                      </Button>
                      <Button size="sm" variant="danger" pending={remove.isPending} onClick={() => remove.mutate(planting.id)}>
                        Remove planting
                      </Button>
                    </div>
                  ) : (
                    <Button size="sm" variant="danger-quiet" onClick={() => setConfirming(planting.id)}>
                      <Trash2 className="size-4" aria-hidden="true" />
                      Remove
                    </Button>
                  )
                ) : null}
              </div>
              <PlanSteps
                steps={planting.steps}
                warnings={planting.warnings}
                plotId={plotId}
                members={canManage ? assignable : everyone}
                canManage={canManage}
                canWork={canWork}
                today={today}
              />
            </section>
          ))}
        </div>
      )}
    </Card>
  );
}
