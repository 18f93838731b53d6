'use client';

import { Check, SkipForward, X } from 'lucide-react';
import { useId, useState, type FormEvent } from 'react';
import { Button } from '@/components/ui/button';
import { Field, Input, Textarea } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import type { MyStep } from '@/lib/planning/my-steps';
import { instantOf, localClock, localDateOf } from '@/lib/schedule/local-dates';
import { stepOutcomeSchema, type StepOutcomeInput } from '@/lib/validations/step';
import { fieldErrors } from '@/lib/validations/common';

const round1 = (n: number) => Math.round(n * 10) / 10;
const parseLb = (text: string) => (text.trim() === '' ? undefined : Number(text.replace(',', '.')));

/**
 * What was really done: when (the property's local date and time, default now), notes, and for a seeding the
 * pounds broadcast (per species when weighed apart). The person signed in is the one who did it.
 */
export function DoneForm({
  step,
  userName,
  serverErrors,
  pending,
  onSubmit,
  onCancel,
}: {
  step: MyStep;
  userName: string;
  serverErrors: Record<string, string> & { _?: string };
  pending: boolean;
  onSubmit: (body: StepOutcomeInput) => void;
  onCancel: () => void;
}) {
  const id = useId();
  const nowMs = Date.now();
  const today = localDateOf(nowMs, step.timeZone);
  const [date, setDate] = useState(today);
  const [time, setTime] = useState(localClock(nowMs, step.timeZone));
  const [notes, setNotes] = useState('');
  const [seedLb, setSeedLb] = useState(step.seed?.plannedLb != null ? String(round1(step.seed.plannedLb)) : '');
  const [parts, setParts] = useState<Record<string, string>>({});
  const [localErrors, setLocalErrors] = useState<Record<string, string>>({});
  const errors = { ...serverErrors, ...localErrors };
  const partsGiven = Object.values(parts).some((v) => v.trim() !== '');
  const partsSum = partsGiven ? round1(Object.values(parts).reduce((sum, v) => sum + (parseLb(v) ?? 0), 0)) : null;

  function build(status: 'done' | 'skipped'): StepOutcomeInput | null {
    const raw: Record<string, unknown> = { status, date, notes };
    if (status === 'done') {
      if (!time) {
        setLocalErrors({ doneAt: 'Give the time it was done' });
        return null;
      }
      raw.doneAt = instantOf(date, time, step.timeZone).toISOString();
      if (step.seed) {
        const species = step.seed.parts
          .filter((p) => (parts[p.speciesId] ?? '').trim() !== '')
          .map((p) => ({ speciesId: p.speciesId, lb: parseLb(parts[p.speciesId]) }));
        const total = species.length ? partsSum : parseLb(seedLb);
        if (total !== undefined && total !== null) raw.record = { seedLb: total, ...(species.length ? { species } : {}) };
      }
    }
    const parsed = stepOutcomeSchema.safeParse(raw);
    if (!parsed.success) {
      setLocalErrors(fieldErrors(parsed.error));
      return null;
    }
    if (parsed.data.date && parsed.data.date > today) {
      setLocalErrors({ date: `The date cannot be after today (${today} at ${step.propertyName})` });
      return null;
    }
    setLocalErrors({});
    return parsed.data;
  }

  function submit(event: FormEvent, status: 'done' | 'skipped') {
    event.preventDefault();
    const body = build(status);
    if (body) onSubmit(body);
  }

  const seedError = errors['record.seedLb'] ?? errors.record;
  const speciesError = errors['record.species'] ?? Object.entries(errors).find(([k]) => k.startsWith('record.species.'))?.[1];

  return (
    <form onSubmit={(e) => submit(e, 'done')} className="space-y-4 rounded-lg border border-ground-line bg-white p-4" aria-label={`Mark ${step.title} done`}>
      {errors._ ? <Notice tone="error">{errors._}</Notice> : null}
      <div className="grid gap-3 min-[420px]:grid-cols-2">
        <Field label="Date done" htmlFor={`${id}-date`} error={errors.date}>
          <Input id={`${id}-date`} type="date" value={date} max={today} required onChange={(e) => setDate(e.target.value)} className="min-h-12 text-lg" />
        </Field>
        <Field label="Time" htmlFor={`${id}-time`} error={errors.doneAt}>
          <Input id={`${id}-time`} type="time" value={time} required onChange={(e) => setTime(e.target.value)} className="min-h-12 text-lg" />
        </Field>
      </div>
      <p className="text-sm text-loam-soft">
        Times are {step.propertyName}&apos;s ({step.timeZone}). Done by <span className="font-semibold text-loam">{userName}</span>.
      </p>
      {step.seed ? (
        <div className="space-y-3">
          <Field
            label="Seed broadcast (lb)"
            htmlFor={`${id}-seed`}
            error={seedError}
            hint={step.seed.plannedLb != null ? `The plan called for ${round1(step.seed.plannedLb)} lb.` : undefined}
          >
            <Input
              id={`${id}-seed`}
              type="number"
              inputMode="decimal"
              step="0.1"
              min="0"
              value={partsSum !== null ? String(partsSum) : seedLb}
              readOnly={partsSum !== null}
              onChange={(e) => setSeedLb(e.target.value)}
              className="min-h-12 text-lg tabular-nums"
            />
          </Field>
          {step.seed.parts.length > 1 ? (
            <details className="rounded-lg border border-ground-line px-3 py-2">
              <summary className="flex min-h-11 cursor-pointer items-center font-semibold">Weighed per species (optional)</summary>
              <div className="mt-2 grid grid-cols-2 gap-3">
                {step.seed.parts.map((p) => (
                  <Field key={p.speciesId} label={`${p.name} (lb)`} htmlFor={`${id}-${p.speciesId}`} hint={p.plannedLb != null ? `Plan: ${round1(p.plannedLb)} lb` : undefined}>
                    <Input
                      id={`${id}-${p.speciesId}`}
                      type="number"
                      inputMode="decimal"
                      step="0.1"
                      min="0"
                      value={parts[p.speciesId] ?? ''}
                      onChange={(e) => setParts((old) => ({ ...old, [p.speciesId]: e.target.value }))}
                      className="min-h-12 tabular-nums"
                    />
                  </Field>
                ))}
              </div>
              {speciesError ? <p className="mt-2 text-sm font-medium text-ember">{speciesError}</p> : null}
              <p className="mt-2 text-xs text-loam-soft">When given, the species add up to the total above.</p>
            </details>
          ) : null}
        </div>
      ) : null}
      <Field label="Notes" htmlFor={`${id}-notes`} optional error={errors.notes}>
        <Textarea id={`${id}-notes`} value={notes} maxLength={2000} onChange={(e) => setNotes(e.target.value)} placeholder="Ground wet in the low end, wind light from the west…" />
      </Field>
      {/* One-handed: the main action sits at the bottom right, where a thumb reaches. */}
      <div className="flex flex-wrap items-center justify-end gap-2">
        <Button variant="quiet" onClick={onCancel} className="min-h-12">
          <X className="size-5" aria-hidden="true" />
          Cancel
        </Button>
        <Button variant="secondary" pending={pending} onClick={(e) => submit(e, 'skipped')} className="min-h-12">
          <SkipForward className="size-5" aria-hidden="true" />
          Skipped
        </Button>
        <Button type="submit" pending={pending} className="min-h-12 px-6 text-lg">
          <Check className="size-5" aria-hidden="true" />
          Save as done
        </Button>
      </div>
    </form>
  );
}
