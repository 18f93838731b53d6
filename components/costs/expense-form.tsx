'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { Plus } from 'lucide-react';
import { useState } from 'react';
import { useForm, type Resolver } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { Field, Input, Select, controlAria } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { apiFetch } from '@/lib/client/api';
import { applyServerErrors, withoutNaN } from '@/lib/client/forms';
import type { CostPerson, CostPlot } from '@/lib/planning/costs';
import { EXPENSE_CATEGORIES, EXPENSE_CATEGORY_LABELS, expenseSchema } from '@/lib/validations/expense';

type ExpenseFields = {
  spentOn: string;
  season: string;
  year: number;
  plotId: string;
  category: string;
  description: string;
  amount: string;
  labourHours: number;
  paidBy: string;
  splitAmong: string[];
};

const FIELD_NAMES = ['spentOn', 'season', 'year', 'plotId', 'category', 'description', 'amount', 'labourHours', 'paidBy', 'splitAmong'] as const;
const blankNumber = '' as unknown as number;

/** January–June books to the spring season, July–December to the fall (Sowcast's default; change it per expense). */
const seasonOf = (date: string) => (Number(date.slice(5, 7)) <= 6 ? 'spring' : 'fall');

function todayLocal(): string {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}

export function ExpenseForm({
  propertyId,
  plots,
  sharers,
  currentUserId,
  onSaved,
}: {
  propertyId: string;
  plots: CostPlot[];
  sharers: CostPerson[];
  currentUserId: string;
  onSaved: () => Promise<unknown>;
}) {
  const [formMessage, setFormMessage] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const today = todayLocal();
  const defaults: ExpenseFields = {
    spentOn: today,
    season: seasonOf(today),
    year: Number(today.slice(0, 4)),
    plotId: '',
    category: '',
    description: '',
    amount: '',
    labourHours: blankNumber,
    paidBy: sharers.some((s) => s.id === currentUserId) ? currentUserId : '',
    splitAmong: [],
  };
  const {
    register,
    handleSubmit,
    setError,
    setValue,
    watch,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<ExpenseFields>({
    resolver: zodResolver(expenseSchema, undefined, { raw: true }) as unknown as Resolver<ExpenseFields>,
    defaultValues: defaults,
  });

  const split = watch('splitAmong');
  const category = watch('category');
  const e = (name: keyof ExpenseFields) => errors[name]?.message as string | undefined;

  const onSubmit = handleSubmit(async (values) => {
    setFormMessage(null);
    setSaved(null);
    try {
      await apiFetch(`/api/properties/${propertyId}/expenses`, { method: 'POST', body: withoutNaN(values) });
      setSaved(`Saved “${values.description}”.`);
      reset({ ...defaults, spentOn: values.spentOn, season: values.season, year: values.year, paidBy: values.paidBy });
      await onSaved();
    } catch (error) {
      setFormMessage(applyServerErrors(error, FIELD_NAMES, setError));
    }
  });

  const toggle = (id: string, on: boolean) =>
    setValue('splitAmong', on ? [...split, id] : split.filter((x) => x !== id), { shouldDirty: true, shouldValidate: false });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-5" aria-label="Add an expense">
      {formMessage ? <Notice tone="error">{formMessage}</Notice> : null}
      {saved ? <Notice tone="success">{saved}</Notice> : null}
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
        <Field label="Date" htmlFor="expense-date" error={e('spentOn')}>
          <Input
            {...controlAria('expense-date', e('spentOn'))}
            type="date"
            {...register('spentOn', {
              onChange: (event) => {
                const value = String(event.target.value);
                if (/^\d{4}-\d{2}-\d{2}$/.test(value)) {
                  setValue('season', seasonOf(value));
                  setValue('year', Number(value.slice(0, 4)));
                }
              },
            })}
          />
        </Field>
        <Field label="Season" htmlFor="expense-season" error={e('season')}>
          <Select {...controlAria('expense-season', e('season'))} {...register('season')}>
            <option value="spring">Spring</option>
            <option value="fall">Fall</option>
          </Select>
        </Field>
        <Field label="Year" htmlFor="expense-year" error={e('year')}>
          <Input {...controlAria('expense-year', e('year'))} className="tabular" type="number" inputMode="numeric" {...register('year', { valueAsNumber: true })} />
        </Field>
        <Field label="Plot" htmlFor="expense-plot" error={e('plotId')} hint="Whole property: spread over the plots by acres.">
          <Select {...controlAria('expense-plot', e('plotId'), true)} {...register('plotId')}>
            <option value="">Whole property</option>
            {plots.map((p) => (
              <option key={p.id} value={p.id}>
                {p.name}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Category" htmlFor="expense-category" error={e('category')}>
          <Select {...controlAria('expense-category', e('category'))} {...register('category')}>
            <option value="">Choose a category</option>
            {EXPENSE_CATEGORIES.map((c) => (
              <option key={c} value={c}>
                {EXPENSE_CATEGORY_LABELS[c]}
              </option>
            ))}
          </Select>
        </Field>
        <Field label="Amount (USD)" htmlFor="expense-amount" error={e('amount')} hint="Dollars and cents, e.g. 89.99. Unpaid labour: 0.">
          <Input {...controlAria('expense-amount', e('amount'), true)} className="tabular" inputMode="decimal" autoComplete="off" placeholder="0.00" {...register('amount')} />
        </Field>
        <Field label="What it was" htmlFor="expense-description" error={e('description')} className="sm:col-span-2">
          <Input {...controlAria('expense-description', e('description'))} autoComplete="off" maxLength={200} {...register('description')} />
        </Field>
        <Field label="Labour hours" htmlFor="expense-hours" error={e('labourHours')} optional={category !== 'labour'}>
          <Input
            {...controlAria('expense-hours', e('labourHours'))}
            className="tabular"
            type="number"
            step="0.25"
            min="0"
            inputMode="decimal"
            {...register('labourHours', { valueAsNumber: true })}
          />
        </Field>
        <Field label="Paid by" htmlFor="expense-paid-by" error={e('paidBy')}>
          <Select {...controlAria('expense-paid-by', e('paidBy'))} {...register('paidBy')}>
            <option value="">Choose who paid</option>
            {sharers.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </Select>
        </Field>
        <fieldset className="sm:col-span-2" aria-describedby="expense-split-hint">
          <legend className="text-sm font-semibold text-loam">Split among</legend>
          <div className="mt-1.5 flex flex-wrap gap-2">
            {sharers.map((s) => (
              <label key={s.id} className="inline-flex min-h-11 items-center gap-2 rounded-lg border border-ground-line bg-white px-3 text-sm">
                <input type="checkbox" className="size-5 accent-clover" checked={split.includes(s.id)} onChange={(ev) => toggle(s.id, ev.target.checked)} />
                {s.name}
              </label>
            ))}
          </div>
          <p id="expense-split-hint" className="mt-1.5 text-xs text-loam-soft">
            Tick nobody to split it among everyone who shares the club’s costs — the owners, managers and members on the property at the
            time the split is read, so someone who joins later shares it too.
          </p>
          {e('splitAmong') ? <p className="text-sm font-medium text-ember">{e('splitAmong')}</p> : null}
        </fieldset>
      </div>
      <div className="flex justify-end">
        <Button type="submit" pending={isSubmitting}>
          <Plus className="size-4" aria-hidden="true" />
          Add expense
        </Button>
      </div>
    </form>
  );
}
