'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Pencil, Plus, Trash2 } from 'lucide-react';
import Link from 'next/link';
import { useState } from 'react';
import { Button, ButtonLink } from '@/components/ui/button';
import { LoadError } from '@/components/ui/load-error';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { apiFetch, errorMessage, queryKeys } from '@/lib/client/api';
import { formatAcres, formatNumber } from '@/lib/client/format';
import type { PlotDto } from '@/lib/data/plots';
import { PLOT_COVER_LABELS, PLOT_SUN_LABELS } from '@/lib/validations/plot';

export function PlotsSection({ propertyId, canEdit }: { propertyId: string; canEdit: boolean }) {
  const queryClient = useQueryClient();
  const [confirming, setConfirming] = useState<string | null>(null);
  const query = useQuery({
    queryKey: queryKeys.plots(propertyId),
    queryFn: () => apiFetch<{ plots: PlotDto[] }>(`/api/properties/${propertyId}/plots`),
  });
  const remove = useMutation({
    mutationFn: (plotId: string) => apiFetch<void>(`/api/plots/${plotId}`, { method: 'DELETE' }),
    onSuccess: async () => {
      setConfirming(null);
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.plots(propertyId) }),
        queryClient.invalidateQueries({ queryKey: queryKeys.properties, exact: true }),
      ]);
    },
  });

  const addButton = canEdit ? (
    <ButtonLink href={`/properties/${propertyId}/plots/new`}>
      <Plus className="size-5" aria-hidden="true" />
      Add plot
    </ButtonLink>
  ) : null;

  const totalAcres = query.data?.plots.reduce((sum, plot) => sum + plot.acres, 0) ?? 0;

  return (
    <section aria-labelledby="plots-heading" className="rounded-card border border-ground-line bg-ground-raised shadow-sm">
      <div className="flex flex-wrap items-start justify-between gap-3 p-5 pb-4 sm:px-6">
        <div>
          <h2 id="plots-heading" className="text-lg font-semibold">
            Plots
          </h2>
          {query.data && query.data.plots.length > 0 ? (
            <p className="tabular text-sm text-loam-soft">
              {query.data.plots.length} {query.data.plots.length === 1 ? 'plot' : 'plots'}, {formatAcres(totalAcres)} in all
            </p>
          ) : null}
        </div>
        {addButton}
      </div>

      {remove.isError ? (
        <div className="px-5 pb-4 sm:px-6">
          <Notice tone="error">{errorMessage(remove.error)}</Notice>
        </div>
      ) : null}

      {query.isPending ? (
        <div className="px-5 pb-5 sm:px-6">
          <LoadingBlock label="Loading plots" rows={3} />
        </div>
      ) : query.isError ? (
        <LoadError className="px-5 pb-5 sm:px-6" title="The plots did not load" error={query.error} onRetry={() => void query.refetch()} />
      ) : query.data.plots.length === 0 ? (
        <p className="px-5 pb-6 text-loam-soft sm:px-6">
          {canEdit
            ? 'No plots yet. Add each food plot with its size, what covers it now and how much sun it gets — that is what its plan is built from.'
            : 'No plots have been added to this property yet.'}
        </p>
      ) : (
        <div className="overflow-x-auto border-t border-ground-line">
          <p className="px-5 pt-2 text-xs text-loam-soft sm:hidden">Slide the table sideways to see every column.</p>
          <table className="w-full border-collapse text-left text-sm">
            <caption className="sr-only">Plots on this property</caption>
            <thead className="bg-ground text-xs text-loam-soft">
              <tr>
                <th scope="col" className="sticky left-0 bg-ground px-5 py-3 font-semibold sm:pl-6">Name</th>
                <th scope="col" className="px-3 py-3 text-right font-semibold">Acres</th>
                <th scope="col" className="px-3 py-3 font-semibold">Cover</th>
                <th scope="col" className="px-3 py-3 font-semibold">Sun</th>
                <th scope="col" className="px-3 py-3 text-right font-semibold">Soil pH</th>
                <th scope="col" className="min-w-48 px-3 py-3 font-semibold">Notes</th>
                {canEdit ? (
                  <th scope="col" className="px-5 py-3 text-right font-semibold sm:pr-6">
                    <span className="sr-only">Actions</span>
                  </th>
                ) : null}
              </tr>
            </thead>
            <tbody className="divide-y divide-ground-line">
              {query.data.plots.map((plot) => (
                <tr key={plot.id} className="align-top">
                  <th scope="row" className="sticky left-0 max-w-40 bg-ground-raised px-5 py-3 font-semibold text-loam shadow-[1px_0_0_#e4ddcc] sm:max-w-none sm:pl-6 sm:shadow-none">
                    <Link href={`/plots/${plot.id}`} className="inline-flex min-h-10 items-center text-rain hover:underline">
                      {plot.name}
                    </Link>
                  </th>
                  <td className="tabular px-3 py-3 text-right">{formatNumber(plot.acres)}</td>
                  <td className="min-w-36 px-3 py-3">{PLOT_COVER_LABELS[plot.cover]}</td>
                  <td className="whitespace-nowrap px-3 py-3">{PLOT_SUN_LABELS[plot.sun]}</td>
                  <td className="tabular whitespace-nowrap px-3 py-3 text-right">
                    {plot.soilPh === null ? <span className="text-loam-faint">Not tested</span> : plot.soilPh.toFixed(1)}
                  </td>
                  <td className="min-w-48 max-w-72 px-3 py-3 text-loam-soft">{plot.notes ?? ''}</td>
                  {canEdit ? (
                    <td className="px-5 py-2 sm:pr-6">
                      {confirming === plot.id ? (
                        <div className="flex flex-col items-end gap-2">
                          <span className="text-right text-xs font-medium">Remove {plot.name} for good?</span>
                          <div className="flex gap-2">
                            <Button size="sm" variant="secondary" onClick={() => setConfirming(null)}>
                              Keep
                            </Button>
                            <Button size="sm" variant="danger" pending={remove.isPending} onClick={() => remove.mutate(plot.id)}>
                              Remove plot
                            </Button>
                          </div>
                        </div>
                      ) : (
                        <div className="flex justify-end gap-2">
                          <ButtonLink href={`/plots/${plot.id}/edit`} size="sm" variant="secondary">
                            <Pencil className="size-4" aria-hidden="true" />
                            Edit<span className="sr-only"> {plot.name}</span>
                          </ButtonLink>
                          <Button
                            size="sm"
                            variant="danger-quiet"
                            onClick={() => {
                              remove.reset();
                              setConfirming(plot.id);
                            }}
                          >
                            <Trash2 className="size-4" aria-hidden="true" />
                            Remove<span className="sr-only"> {plot.name}</span>
                          </Button>
                        </div>
                      )}
                    </td>
                  ) : null}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
