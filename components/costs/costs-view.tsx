'use client';

import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { ArrowRight, Download, Trash2 } from 'lucide-react';
import { useMemo, useState } from 'react';
import { Button, buttonClasses } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Field, Select } from '@/components/ui/field';
import { LoadError } from '@/components/ui/load-error';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { apiFetch, errorMessage } from '@/lib/client/api';
import { formatAcres, formatLocalDate } from '@/lib/client/format';
import type { ExpenseDto } from '@/lib/data/expenses';
import { balanceSentence, costSplit, costSummary, formatCents, type CostPerson, type CostPlot } from '@/lib/planning/costs';
import { EXPENSE_CATEGORIES, EXPENSE_CATEGORY_LABELS } from '@/lib/validations/expense';
import { ExpenseForm } from './expense-form';

interface CostsAnswer {
  expenses: ExpenseDto[];
  plots: CostPlot[];
  sharers: CostPerson[];
  others: CostPerson[];
}

const SEASON_LABEL = { spring: 'Spring', fall: 'Fall' } as const;
const th = 'px-3 py-2 text-left text-xs font-semibold uppercase tracking-wide text-loam-soft';
const td = 'px-3 py-2 align-top';
const money = 'px-3 py-2 text-right align-top tabular';

export function CostsView({ propertyId, currentUserId }: { propertyId: string; currentUserId: string }) {
  const queryClient = useQueryClient();
  const key = ['properties', propertyId, 'expenses'] as const;
  const query = useQuery({ queryKey: key, queryFn: () => apiFetch<CostsAnswer>(`/api/properties/${propertyId}/expenses`) });
  const remove = useMutation({
    mutationFn: (id: string) => apiFetch<void>(`/api/properties/${propertyId}/expenses/${id}`, { method: 'DELETE' }),
    onSettled: () => queryClient.invalidateQueries({ queryKey: key }),
  });
  const [season, setSeason] = useState('');

  const data = query.data;
  const seasons = useMemo(() => {
    const seen = new Map<string, { season: 'spring' | 'fall'; year: number }>();
    for (const e of data?.expenses ?? []) seen.set(`${e.season}-${e.year}`, { season: e.season, year: e.year });
    return [...seen.entries()].sort((a, b) => b[1].year - a[1].year || (a[1].season === 'fall' ? -1 : 1));
  }, [data]);
  const shown = useMemo(
    () => (data?.expenses ?? []).filter((e) => !season || `${e.season}-${e.year}` === season),
    [data, season],
  );
  // The same pure functions the server and the CSV use, over the season picked here.
  const summary = useMemo(() => (data ? costSummary(shown, data.plots) : null), [data, shown]);
  const split = useMemo(() => (data ? costSplit(shown, data.sharers, data.others) : null), [data, shown]);

  if (query.isPending) return <LoadingBlock label="Loading the costs" rows={6} />;
  if (query.isError || !data || !summary || !split) {
    return <LoadError title="The costs did not load" error={query.error} onRetry={() => void query.refetch()} />;
  }

  const names = new Map([...data.sharers, ...data.others].map((p) => [p.id, p.name]));
  const exportQuery = season ? `?season=${season.split('-')[0]}&year=${season.split('-')[1]}` : '';
  const everyone = data.sharers.map((s) => s.name).join(', ');

  return (
    <div className="space-y-6">
      <Card aria-labelledby="add-expense-heading">
        <CardHeader id="add-expense-heading" title="Add an expense" description="Seed, herbicide, fertilizer, lime, fuel, equipment, labour — for one plot or the whole property." />
        <ExpenseForm
          propertyId={propertyId}
          plots={data.plots}
          sharers={data.sharers}
          currentUserId={currentUserId}
          onSaved={() => queryClient.invalidateQueries({ queryKey: key })}
        />
      </Card>

      <div className="flex flex-col gap-3 sm:flex-row sm:items-end sm:justify-between">
        <Field label="Season" htmlFor="costs-season" className="sm:w-64">
          <Select id="costs-season" value={season} onChange={(e) => setSeason(e.target.value)}>
            <option value="">All seasons</option>
            {seasons.map(([k, s]) => (
              <option key={k} value={k}>
                {SEASON_LABEL[s.season]} {s.year}
              </option>
            ))}
          </Select>
        </Field>
        {/* A plain link: the browser downloads the attachment; a client-side navigation would not. */}
        <a href={`/api/properties/${propertyId}/expenses/export${exportQuery}`} className={buttonClasses('secondary')} download>
          <Download className="size-4" aria-hidden="true" />
          Export CSV
        </a>
      </div>

      <Card aria-labelledby="totals-heading">
        <CardHeader
          id="totals-heading"
          title="Totals"
          description="Costs booked to a plot stay with it; costs for the whole property are spread over the plots in proportion to their acres. Cost per acre is a plot’s total over its acres."
        />
        <dl className="mb-4 grid grid-cols-2 gap-3 sm:grid-cols-4">
          <Stat label="Total" value={formatCents(summary.totalCents)} />
          <Stat label="Per acre" value={summary.perAcreCents === null ? '—' : formatCents(Math.round(summary.perAcreCents))} hint={`over ${formatAcres(summary.totalAcres)}`} />
          <Stat label="Whole-property costs" value={formatCents(summary.propertyWideCents)} />
          <Stat label="Labour" value={`${summary.labourHours.toLocaleString('en-US', { maximumFractionDigits: 2 })} h`} />
        </dl>
        {summary.unspreadCents > 0 ? (
          <Notice tone="info" className="mb-4">
            {formatCents(summary.unspreadCents)} of whole-property costs cannot be spread: the property has no plots with acres yet.
          </Notice>
        ) : null}
        <div className="overflow-x-auto">
          <table className="w-full min-w-[36rem] text-sm" aria-label="Costs per plot">
            <thead className="border-b border-ground-line">
              <tr>
                <th className={th}>Plot</th>
                <th className={`${th} text-right`}>Acres</th>
                <th className={`${th} text-right`}>Booked to it</th>
                <th className={`${th} text-right`}>Share of property</th>
                <th className={`${th} text-right`}>Total</th>
                <th className={`${th} text-right`}>Per acre</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-ground-line">
              {summary.plots.map((p) => (
                <tr key={p.plotId}>
                  <td className={`${td} font-semibold`}>{p.plotName}</td>
                  <td className={money}>{formatAcres(p.acres)}</td>
                  <td className={money}>{formatCents(p.directCents)}</td>
                  <td className={money}>{formatCents(p.sharedCents)}</td>
                  <td className={`${money} font-semibold`}>{formatCents(p.totalCents)}</td>
                  <td className={money}>{formatCents(Math.round(p.perAcreCents))}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>

        {summary.seasons.length ? (
          <div className="mt-6 overflow-x-auto">
            <h3 className="mb-2 font-semibold">By season and category</h3>
            <table className="w-full min-w-[36rem] text-sm" aria-label="Costs per season">
              <thead className="border-b border-ground-line">
                <tr>
                  <th className={th}>Season</th>
                  {EXPENSE_CATEGORIES.filter((c) => summary.byCategory[c] !== undefined).map((c) => (
                    <th key={c} className={`${th} text-right`}>
                      {EXPENSE_CATEGORY_LABELS[c]}
                    </th>
                  ))}
                  <th className={`${th} text-right`}>Total</th>
                </tr>
              </thead>
              <tbody className="divide-y divide-ground-line">
                {summary.seasons.map((s) => (
                  <tr key={`${s.season}-${s.year}`}>
                    <td className={`${td} font-semibold`}>
                      {SEASON_LABEL[s.season]} {s.year}
                    </td>
                    {EXPENSE_CATEGORIES.filter((c) => summary.byCategory[c] !== undefined).map((c) => (
                      <td key={c} className={money}>
                        {s.byCategory[c] !== undefined ? formatCents(s.byCategory[c]!) : '—'}
                      </td>
                    ))}
                    <td className={`${money} font-semibold`}>{formatCents(s.totalCents)}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        ) : null}
      </Card>

      <Card aria-labelledby="split-heading">
        <CardHeader
          id="split-heading"
          title="Who paid, who owes"
          description={`Each expense is shared equally among the people it names; one that names nobody is shared by everyone who shares the club’s costs today (${everyone}). Odd cents go to one person each, so the shares add up to the cent.`}
        />
        <div className="overflow-x-auto">
          <table className="w-full min-w-[32rem] text-sm" aria-label="The split">
            <thead className="border-b border-ground-line">
              <tr>
                <th className={th}>Person</th>
                <th className={`${th} text-right`}>Paid</th>
                <th className={`${th} text-right`}>Share</th>
                <th className={`${th} text-right`}>Balance</th>
              </tr>
            </thead>
            <tbody className="divide-y divide-ground-line">
              {split.people.map((p) => (
                <tr key={p.personId} data-person={p.name}>
                  <td className={td}>
                    <span className="font-semibold">{p.name}</span>
                    <span className="block text-xs text-loam-soft">{balanceSentence(p)}</span>
                  </td>
                  <td className={money}>{formatCents(p.paidCents)}</td>
                  <td className={money}>{formatCents(p.shareCents)}</td>
                  <td className={`${money} font-semibold ${p.balanceCents > 0 ? 'text-clover-dark' : p.balanceCents < 0 ? 'text-ember' : ''}`}>
                    {p.balanceCents > 0 ? `is owed ${formatCents(p.balanceCents)}` : p.balanceCents < 0 ? `owes ${formatCents(-p.balanceCents)}` : 'even'}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
        <h3 className="mb-2 mt-5 font-semibold">To settle up</h3>
        {split.transfers.length === 0 ? (
          <p className="text-sm text-loam-soft">Everyone is even.</p>
        ) : (
          <ul className="space-y-2" aria-label="Payments to settle up">
            {split.transfers.map((t) => (
              <li key={`${t.fromId}-${t.toId}`} className="flex flex-wrap items-center gap-2 rounded-lg border border-ground-line bg-white px-3 py-2 text-sm">
                <span className="font-semibold">{t.fromName}</span> pays <span className="font-semibold">{t.toName}</span>
                <ArrowRight className="size-4 text-loam-faint" aria-hidden="true" />
                <span className="tabular font-semibold">{formatCents(t.amountCents)}</span>
              </li>
            ))}
          </ul>
        )}
        {split.unsplitCents > 0 ? (
          <p className="mt-3 text-sm text-loam-soft">{formatCents(split.unsplitCents)} was paid from an account that no longer exists and is left out of the split.</p>
        ) : null}
      </Card>

      <Card aria-labelledby="expenses-heading">
        <CardHeader id="expenses-heading" title="Expenses" description={season ? 'This season’s expenses, newest first.' : 'All expenses, newest first.'} />
        {remove.isError ? <Notice tone="error" className="mb-3">{errorMessage(remove.error)}</Notice> : null}
        {shown.length === 0 ? (
          <p className="text-sm text-loam-soft">No expenses yet. Add the first one above.</p>
        ) : (
          <ul className="divide-y divide-ground-line rounded-lg border border-ground-line bg-white" aria-label="Expense list">
            {shown.map((e) => (
              <li key={e.id} className="flex flex-col gap-2 px-4 py-3 sm:flex-row sm:items-start sm:justify-between">
                <div className="min-w-0 text-sm">
                  <p className="text-base font-semibold">
                    {e.description} <span className="tabular">· {formatCents(e.amountCents)}</span>
                  </p>
                  <p className="text-loam-soft">
                    {formatLocalDate(e.spentOn)} · {SEASON_LABEL[e.season]} {e.year} · {EXPENSE_CATEGORY_LABELS[e.category]} · {e.plotName ?? 'Whole property'}
                    {e.labourHours !== null ? ` · ${e.labourHours} h` : ''}
                  </p>
                  <p className="text-loam-soft">
                    Paid by {e.paidByName ?? 'a former member'} · split among{' '}
                    {e.splitAmong.length ? e.splitAmong.map((id) => names.get(id) ?? 'a former member').join(', ') : 'everyone who shares costs'}
                  </p>
                </div>
                <Button size="sm" variant="danger-quiet" pending={remove.isPending && remove.variables === e.id} onClick={() => remove.mutate(e.id)}>
                  <Trash2 className="size-4" aria-hidden="true" />
                  Delete<span className="sr-only"> {e.description}</span>
                </Button>
              </li>
            ))}
          </ul>
        )}
      </Card>
    </div>
  );
}

function Stat({ label, value, hint }: { label: string; value: string; hint?: string }) {
  return (
    <div className="rounded-lg border border-ground-line bg-white px-3 py-2">
      <dt className="text-xs font-semibold uppercase tracking-wide text-loam-soft">{label}</dt>
      <dd className="tabular text-lg font-semibold">{value}</dd>
      {hint ? <dd className="text-xs text-loam-soft">{hint}</dd> : null}
    </div>
  );
}
