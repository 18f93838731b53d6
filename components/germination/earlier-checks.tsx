'use client';

import { useQuery } from '@tanstack/react-query';
import { Sprout } from 'lucide-react';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { LoadError } from '@/components/ui/load-error';
import { Notice } from '@/components/ui/notice';
import { apiFetch, errorMessage } from '@/lib/client/api';
import { formatLocalDate } from '@/lib/client/format';
import type { ObservationDto } from '@/lib/data/observations';
import type { ReseedProposal as Proposal } from '@/lib/planning/stand-check';
import { ReseedProposal } from './reseed-proposal';
import { VerdictBadge } from './verdict-badge';

/**
 * The planting's checks so far, so a manager who was not in the field sees what was found, the photos, and
 * the reseeding a thin stand calls for.
 */
export function EarlierChecks({ plotId, plantingId, canManage, today }: { plotId: string; plantingId: string; canManage: boolean; today: string }) {
  const checks = useQuery({
    queryKey: ['plantings', plantingId, 'observations'],
    queryFn: () => apiFetch<{ observations: ObservationDto[] }>(`/api/plantings/${plantingId}/observations`),
  });
  const [open, setOpen] = useState<{ id: string; proposal?: Proposal; error?: string; pending?: boolean } | null>(null);

  async function show(id: string) {
    setOpen({ id, pending: true });
    try {
      const answer = await apiFetch<{ reseed: Proposal }>(`/api/plantings/${plantingId}/reseed/preview`, { method: 'POST', body: { observationId: id } });
      setOpen({ id, proposal: answer.reseed });
    } catch (error) {
      setOpen({ id, error: errorMessage(error) });
    }
  }

  if (checks.isError) return <LoadError title="The earlier checks could not be loaded" error={checks.error} onRetry={() => checks.refetch()} />;
  const list = checks.data?.observations ?? [];
  if (!list.length) return null;
  return (
    <Card aria-labelledby="earlier-heading">
      <CardHeader id="earlier-heading" title="Checks of this planting" />
      <ol className="space-y-4">
        {list.map((o) => (
          <li key={o.id} className="space-y-2 rounded-lg border border-ground-line bg-white/60 p-3 text-sm" data-observation={o.id}>
            <div className="flex flex-wrap items-center gap-2">
              <span className="font-semibold">{formatLocalDate(o.observedOn)}</span>
              <VerdictBadge verdict={o.verdict} />
              <span className="tabular">{o.plantsPerSqFt >= 10 ? o.plantsPerSqFt.toFixed(0) : o.plantsPerSqFt.toFixed(1)} plants per sq ft</span>
            </div>
            <p className="text-loam-soft">
              {o.observer ? `By ${o.observer.name}` : 'By a former member'} · weeds {o.weedPressure}
              {o.notes ? ` · ${o.notes}` : ''}
            </p>
            {o.photos.length ? (
              <div className="flex flex-wrap gap-2">
                {o.photos.map((p) => (
                  <a key={p.id} href={p.url} target="_blank" rel="noreferrer">
                    <img src={p.thumbUrl ?? p.url} alt={p.caption ?? `Photo of the check on ${o.observedOn}`} className="size-20 rounded-md object-cover" />
                  </a>
                ))}
              </div>
            ) : null}
            {o.verdict !== 'good' && o.reseedPlantingId ? <Notice tone="success">A reseeding from this check is planned.</Notice> : null}
            {o.verdict !== 'good' && !o.reseedPlantingId && open?.id !== o.id ? (
              <Button variant="secondary" className="min-h-12 w-full" onClick={() => show(o.id)}>
                <Sprout className="size-5" aria-hidden="true" /> See the reseeding for this check
              </Button>
            ) : null}
            {open?.id === o.id && open.pending ? <p className="text-loam-soft">Planning the reseeding…</p> : null}
            {open?.id === o.id && open.error ? <Notice tone="error">{open.error}</Notice> : null}
            {open?.id === o.id && open.proposal ? (
              <ReseedProposal
                plotId={plotId}
                plantingId={plantingId}
                observationId={o.id}
                proposal={open.proposal}
                canManage={canManage}
                today={today}
                onAccepted={() => checks.refetch()}
              />
            ) : null}
          </li>
        ))}
      </ol>
    </Card>
  );
}
