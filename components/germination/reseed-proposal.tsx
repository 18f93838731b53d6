'use client';

import { Sprout } from 'lucide-react';
import Link from 'next/link';
import { useState } from 'react';
import { PlanSteps } from '@/components/planner/plan-steps';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Notice } from '@/components/ui/notice';
import { apiFetch, errorMessage } from '@/lib/client/api';
import { formatLocalDate } from '@/lib/client/format';
import type { ReseedProposal as Proposal } from '@/lib/planning/stand-check';

/**
 * The reseeding a thin stand calls for, as the engine planned it: the steps with what to carry. A manager
 * accepts it in one tap; everyone else sees it and who can accept it.
 */
export function ReseedProposal({
  plotId,
  plantingId,
  observationId,
  proposal,
  canManage,
  today,
  acceptedPlantingId,
  onAccepted,
}: {
  plotId: string;
  plantingId: string;
  observationId: string;
  proposal: Proposal;
  canManage: boolean;
  today: string;
  acceptedPlantingId?: string | null;
  onAccepted?: () => void;
}) {
  const [state, setState] = useState<{ accepted?: string; error?: string; pending?: boolean }>({ accepted: acceptedPlantingId ?? undefined });
  const planned = proposal.plan.steps.filter((s) => s.status === 'planned');
  const leftOut = proposal.plan.steps.filter((s) => s.status === 'skipped').map((s) => s.title.toLowerCase());

  async function accept() {
    setState({ pending: true });
    try {
      const answer = await apiFetch<{ planting: { id: string } }>(`/api/plantings/${plantingId}/reseed`, { method: 'POST', body: { observationId } });
      setState({ accepted: answer.planting.id });
      onAccepted?.();
    } catch (error) {
      setState({ error: errorMessage(error) });
    }
  }

  return (
    <Card aria-labelledby="reseed-heading">
      <CardHeader
        id="reseed-heading"
        title="Proposed reseeding"
        description={`Sow ${Math.round(proposal.rateShare * 100)} % of the blend's rate on ${formatLocalDate(proposal.seedDate)}, ahead of rain where the forecast shows it.`}
      />
      <p className="mb-3 text-sm text-loam">Why this day: {proposal.reason}.</p>
      {leftOut.length ? (
        <p className="mb-3 text-sm text-loam-soft">No new burndown or ground work: {leftOut.join(', ')} went in with the first seeding, and tilling would tear out the plants that did come up.</p>
      ) : null}
      <PlanSteps steps={planned} warnings={proposal.plan.warnings} plotId={plotId} today={today} linkToSteps={false} />
      <details className="mt-3 text-xs text-loam-soft">
        <summary className="cursor-pointer font-medium">Where the rate comes from</summary>
        <p className="mt-1">{proposal.source}</p>
      </details>
      <div className="mt-4 space-y-3">
        {state.accepted ? (
          <Notice tone="success" title="Reseeding planned">
            It is saved as a new planting of this plot.{' '}
            <Link href={`/plots/${plotId}`} className="font-medium text-rain hover:underline">
              See it in the plot&apos;s plan
            </Link>
            .
          </Notice>
        ) : canManage ? (
          <Button className="min-h-14 w-full text-lg" pending={state.pending} onClick={accept}>
            <Sprout className="size-5" aria-hidden="true" />
            Accept the reseeding
          </Button>
        ) : (
          <Notice tone="info">A manager or owner of the property can accept this reseeding.</Notice>
        )}
        {state.error ? <Notice tone="error">{state.error}</Notice> : null}
      </div>
    </Card>
  );
}
