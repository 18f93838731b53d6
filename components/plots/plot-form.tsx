'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useState } from 'react';
import { useForm, type Resolver } from 'react-hook-form';
import { Button, ButtonLink } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Field, Input, Select, Textarea, controlAria } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { apiFetch, queryKeys } from '@/lib/client/api';
import { applyServerErrors, withoutNaN } from '@/lib/client/forms';
import type { PlotDto } from '@/lib/data/plots';
import { PLOT_COVER_LABELS, PLOT_COVERS, PLOT_SUN_LABELS, PLOT_SUNS, plotSchema } from '@/lib/validations/plot';
import { useHydrated } from '@/lib/client/use-hydrated';

type PlotFields = {
  name: string;
  acres: number;
  cover: string;
  sun: string;
  soilPh: number;
  notes: string;
};

const FIELD_NAMES = ['name', 'acres', 'cover', 'sun', 'soilPh', 'notes'] as const;
const blankNumber = '' as unknown as number;

export function PlotForm({ propertyId, plot }: { propertyId: string; plot?: PlotDto }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [formMessage, setFormMessage] = useState<string | null>(null);
  // Until hydration a click would submit the form natively; the button waits for React.
  const hydrated = useHydrated();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<PlotFields>({
    // raw: what was typed is sent, blanks included, so an edit can clear the pH or the notes.
    resolver: zodResolver(plotSchema, undefined, { raw: true }) as unknown as Resolver<PlotFields>,
    defaultValues: {
      name: plot?.name ?? '',
      acres: plot?.acres ?? blankNumber,
      cover: plot?.cover ?? '',
      sun: plot?.sun ?? '',
      soilPh: plot?.soilPh ?? blankNumber,
      notes: plot?.notes ?? '',
    },
  });

  const back = `/properties/${propertyId}`;
  const onSubmit = handleSubmit(async (values) => {
    setFormMessage(null);
    const body = withoutNaN(values);
    try {
      if (plot) await apiFetch(`/api/plots/${plot.id}`, { method: 'PATCH', body });
      else await apiFetch(`/api/properties/${propertyId}/plots`, { method: 'POST', body });
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: queryKeys.plots(propertyId) }),
        queryClient.invalidateQueries({ queryKey: queryKeys.properties, exact: true }),
      ]);
      router.push(back);
      router.refresh();
    } catch (error) {
      setFormMessage(applyServerErrors(error, FIELD_NAMES, setError));
    }
  });

  const e = (name: keyof PlotFields) => errors[name]?.message;
  const hasErrors = Object.keys(errors).length > 0;

  return (
    <form method="post" onSubmit={onSubmit} noValidate className="space-y-6">
      {formMessage ? <Notice tone="error">{formMessage}</Notice> : null}
      {!formMessage && hasErrors ? <Notice tone="error">Nothing was saved yet. Check the fields marked below.</Notice> : null}
      <Card>
        <div className="grid gap-5 sm:grid-cols-2">
          <Field label="Name" htmlFor="plot-name" error={e('name')} hint="Unique on this property, e.g. “Creek bottom”." className="sm:col-span-2">
            <Input {...controlAria('plot-name', e('name'), true)} autoComplete="off" {...register('name')} />
          </Field>
          <Field label="Acres" htmlFor="plot-acres" error={e('acres')} hint="The plantable area; seed and fertilizer amounts are worked out from it.">
            <Input
              {...controlAria('plot-acres', e('acres'), true)}
              className="tabular"
              type="number"
              step="any"
              min="0"
              inputMode="decimal"
              {...register('acres', { valueAsNumber: true })}
            />
          </Field>
          <Field label="Soil pH" htmlFor="plot-soil-ph" error={e('soilPh')} optional hint="From your latest soil test; leave empty if untested.">
            <Input
              {...controlAria('plot-soil-ph', e('soilPh'), true)}
              className="tabular"
              type="number"
              step="0.1"
              inputMode="decimal"
              {...register('soilPh', { valueAsNumber: true })}
            />
          </Field>
          <Field label="What covers it now" htmlFor="plot-cover" error={e('cover')} hint="Decides whether the plan starts with brush clearing or a burndown spray.">
            <Select {...controlAria('plot-cover', e('cover'), true)} {...register('cover')}>
              <option value="">Choose the cover</option>
              {PLOT_COVERS.map((cover) => (
                <option key={cover} value={cover}>
                  {PLOT_COVER_LABELS[cover]}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Sun" htmlFor="plot-sun" error={e('sun')}>
            <Select {...controlAria('plot-sun', e('sun'))} {...register('sun')}>
              <option value="">Choose the sun</option>
              {PLOT_SUNS.map((sun) => (
                <option key={sun} value={sun}>
                  {PLOT_SUN_LABELS[sun]}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Notes" htmlFor="plot-notes" error={e('notes')} optional className="sm:col-span-2">
            <Textarea {...controlAria('plot-notes', e('notes'))} rows={4} {...register('notes')} />
          </Field>
        </div>
      </Card>
      <div className="flex flex-col-reverse gap-3 sm:flex-row sm:justify-end">
        <ButtonLink href={back} variant="secondary">
          Cancel
        </ButtonLink>
        <Button type="submit" pending={isSubmitting} disabled={!hydrated}>
          Save plot
        </Button>
      </div>
    </form>
  );
}
