'use client';

import { useMutation } from '@tanstack/react-query';
import { CalendarCheck, CircleCheck, CircleX, Scale } from 'lucide-react';
import { useState } from 'react';
import { Button } from '@/components/ui/button';
import { Input } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { apiFetch, errorMessage } from '@/lib/client/api';
import { formatLocalDate } from '@/lib/client/format';
import type { SeedingOption } from '@/lib/planning/compare-seeding';
import { addDays } from '@/lib/schedule/local-dates';

/**
 * What-if: the same planting seeded on two or three days, judged by the engine side by side — expected
 * emergence, seed-zone moisture and the frost margin — so a person can pick the day with reasons.
 */
export function SeedingCompare({
  plotId,
  planting,
  defaultDate,
  onPick,
}: {
  plotId: string;
  planting: () => Record<string, unknown>;
  defaultDate: string;
  /** Puts the chosen day into the planting form as its planned seeding date. */
  onPick: (date: string) => void;
}) {
  const [picked, setPicked] = useState<string | null>(null);
  const [dates, setDates] = useState<string[]>([defaultDate, addDays(defaultDate, 7), '']);
  const compare = useMutation({
    mutationFn: (seedDates: string[]) =>
      apiFetch<{ options: SeedingOption[] }>(`/api/plots/${plotId}/plan/compare`, { method: 'POST', body: { planting: planting(), seedDates } }),
    onSuccess: () => setPicked(null),
  });
  const chosen = dates.filter(Boolean);

  return (
    <section aria-labelledby="compare-heading" className="mt-6 space-y-3 border-t border-ground-line pt-6">
      <div>
        <h3 id="compare-heading" className="text-lg font-semibold">
          Compare seeding dates
        </h3>
        <p className="text-sm text-loam-soft">Two or three days for the blend above, judged against the stored forecast. Nothing is saved; picking a day puts it in the form as the planned seeding date.</p>
      </div>
      <div className="flex flex-wrap items-end gap-3">
        {dates.map((date, i) => (
          <div key={i} className="flex flex-col gap-1">
            <label htmlFor={`compare-date-${i}`} className="text-xs font-semibold text-loam-soft">
              Seeding day {i + 1}
              {i === 2 ? ' (optional)' : ''}
            </label>
            <Input
              id={`compare-date-${i}`}
              type="date"
              value={date}
              className="w-44"
              onChange={(e) => setDates((list) => list.map((d, j) => (j === i ? e.target.value : d)))}
            />
          </div>
        ))}
        <Button variant="secondary" pending={compare.isPending} disabled={chosen.length < 2} onClick={() => compare.mutate(chosen)}>
          <Scale className="size-4" aria-hidden="true" />
          Compare
        </Button>
      </div>
      {compare.isError ? <Notice tone="error">{errorMessage(compare.error)}</Notice> : null}
      {compare.data ? (
        <div className="grid gap-3 md:grid-cols-3">
          {compare.data.options.map((option) => (
            <article key={option.seedDate} className="space-y-2 rounded-lg border border-ground-line bg-white/60 p-4 text-sm">
              <h4 className="flex items-center gap-2 text-base font-semibold">
                {option.ok ? (
                  <CircleCheck className="size-5 text-clover" aria-hidden="true" />
                ) : (
                  <CircleX className="size-5 text-ember" aria-hidden="true" />
                )}
                {formatLocalDate(option.seedDate)}
              </h4>
              <p className="font-medium">{option.ok ? 'Every rule passes' : 'Some rules advise against it'}</p>
              <dl className="space-y-1.5">
                <dt className="font-semibold text-loam-soft">Emergence</dt>
                <dd className="tabular">
                  About {option.germination.daysToEmergence} days, near {formatLocalDate(option.germination.emergenceDate)}
                </dd>
                <dt className="font-semibold text-loam-soft">Seed-zone moisture</dt>
                <dd className="tabular">
                  {option.moisture
                    ? `${option.moisture.moistDays} of ${option.moisture.days} days moist${option.moisture.firstDryDate ? `; first dry ${formatLocalDate(option.moisture.firstDryDate)}` : ''}`
                    : 'Beyond the forecast'}
                </dd>
                <dt className="font-semibold text-loam-soft">Frost margin</dt>
                <dd className="tabular">
                  {option.frost.marginDays === null ? option.frost.note : `${option.frost.marginDays} days. ${option.frost.note}`}
                </dd>
              </dl>
              <ul className="space-y-1">
                {option.decisions.map((d, i) => (
                  <li key={i} className={d.ok ? 'text-loam' : 'font-medium text-ember'}>
                    {d.ok ? '✓' : '✗'} {d.reason}
                  </li>
                ))}
              </ul>
              <Button
                variant={picked === option.seedDate ? 'primary' : 'secondary'}
                size="sm"
                aria-pressed={picked === option.seedDate}
                onClick={() => {
                  setPicked(option.seedDate);
                  onPick(option.seedDate);
                }}
              >
                <CalendarCheck className="size-4" aria-hidden="true" />
                {picked === option.seedDate ? `Seeding set to ${formatLocalDate(option.seedDate)}` : 'Plan seeding on this day'}
              </Button>
            </article>
          ))}
        </div>
      ) : null}
    </section>
  );
}
