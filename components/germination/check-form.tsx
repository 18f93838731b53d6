'use client';

import { CircleCheck, Minus, Plus, Sprout, X } from 'lucide-react';
import { useCallback, useMemo, useState } from 'react';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Field, FieldError, Input, Textarea } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { cn } from '@/components/ui/cn';
import { judgeStand, STAND_RATINGS } from '@/lib/agronomy/stand';
import { ApiError, apiFetch, errorMessage } from '@/lib/client/api';
import { formatLocalDate } from '@/lib/client/format';
import type { ObservationDto } from '@/lib/data/observations';
import type { ReseedProposal as Proposal, StandResult } from '@/lib/planning/stand-check';
import { WEED_PRESSURE_LABELS, WEED_PRESSURES } from '@/lib/validations/observation';
import { PhotoUploads } from './photo-uploads';
import { EarlierChecks } from './earlier-checks';
import { ReseedProposal } from './reseed-proposal';
import { VerdictBadge } from './verdict-badge';

type Expected = { lowPerSqFt: number; highPerSqFt: number; midPerSqFt: number; source: string };

const one = (x: number) => (x >= 10 ? x.toFixed(0) : x.toFixed(1));

type Saved = { observation: ObservationDto; stand: StandResult; reseed: Proposal | { error: string } | null; canAcceptReseed: boolean };

/** Big radio choices: a whole row is the target, easy with a thumb and readable in sunlight. */
function Choices<T extends string | number>({
  name,
  legend,
  options,
  value,
  onChange,
  error,
  disabled,
}: {
  name: string;
  legend: string;
  options: { value: T; label: string; hint?: string }[];
  value: T | null;
  onChange: (value: T) => void;
  error?: string;
  disabled?: boolean;
}) {
  return (
    <fieldset className="space-y-2" aria-describedby={error ? `${name}-error` : undefined}>
      <legend className="mb-1 text-base font-semibold text-loam">{legend}</legend>
      {options.map((o) => (
        <label
          key={String(o.value)}
          className={cn(
            'flex min-h-14 cursor-pointer items-center gap-3 rounded-lg border px-4 py-2 text-base',
            value === o.value ? 'border-clover bg-clover-light font-semibold' : 'border-ground-line bg-white',
          )}
        >
          <input type="radio" name={name} className="size-5 accent-clover" checked={value === o.value} onChange={() => onChange(o.value)} disabled={disabled} />
          <span>
            {o.label}
            {o.hint ? <span className="ml-1.5 font-normal text-loam-soft">— {o.hint}</span> : null}
          </span>
        </label>
      ))}
      <FieldError id={`${name}-error`} message={error} />
    </fieldset>
  );
}

export function CheckForm({
  plotId,
  plantingId,
  step,
  expected,
  today,
  canWork,
  canManage,
}: {
  plotId: string;
  plantingId: string;
  step: { id: string; date: string; status: string } | null;
  expected: Expected;
  today: string;
  canWork: boolean;
  canManage: boolean;
}) {
  const [rating, setRating] = useState<number | null>(null);
  const [frame, setFrame] = useState('1');
  const [counts, setCounts] = useState<string[]>(['', '', '']);
  const [weeds, setWeeds] = useState<(typeof WEED_PRESSURES)[number] | null>(null);
  const [notes, setNotes] = useState('');
  const [photoIds, setPhotoIds] = useState<string[]>([]);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const [saved, setSaved] = useState<Saved | null>(null);
  const [fairProposal, setFairProposal] = useState<{ proposal?: Proposal; error?: string; pending?: boolean }>({});
  const onPhotos = useCallback((ids: string[]) => setPhotoIds(ids), []);

  const frameSqFt = Number(frame);
  const numbers = counts.map((c) => (c.trim() === '' ? null : Number(c)));
  const filled = numbers.filter((n): n is number => n !== null && Number.isInteger(n) && n >= 0);
  const live = useMemo(() => {
    if (!filled.length || !(frameSqFt > 0)) return null;
    const perSqFt = filled.reduce((a, b) => a + b, 0) / filled.length / frameSqFt;
    return { perSqFt, ...judgeStand(perSqFt, expected) };
  }, [filled, frameSqFt, expected]);

  const setCount = (i: number, value: string) => setCounts((list) => list.map((c, j) => (j === i ? value : c)));
  const bump = (i: number, by: number) => setCounts((list) => list.map((c, j) => (j === i ? String(Math.max(0, (Number(c) || 0) + by)) : c)));

  async function save() {
    const problems: Record<string, string> = {};
    if (rating === null) problems.standRating = 'Pick how the stand looks, 1 to 5';
    if (!weeds) problems.weedPressure = 'Pick the weed pressure';
    if (numbers.some((n) => n !== null && (!Number.isInteger(n) || n < 0))) problems.frameCounts = 'Each count is a whole number of plants, 0 or more';
    else if (!filled.length) problems.frameCounts = 'Count the plants in the frame at one spot at least';
    if (!(frameSqFt > 0)) problems.frameSqFt = 'The frame size must be more than 0 sq ft';
    setErrors(problems);
    if (Object.keys(problems).length) {
      setMessage('Nothing was saved yet. Check the fields marked below.');
      return;
    }
    setPending(true);
    setMessage(null);
    try {
      const answer = await apiFetch<Saved>(`/api/plantings/${plantingId}/observations`, {
        method: 'POST',
        body: {
          ...(step && step.status === 'planned' ? { stepId: step.id } : {}),
          standRating: rating,
          frameCounts: filled,
          frameSqFt,
          weedPressure: weeds,
          notes,
          photoIds,
        },
      });
      setSaved(answer);
    } catch (error) {
      if (error instanceof ApiError) setErrors(error.fields);
      setMessage(errorMessage(error));
    } finally {
      setPending(false);
    }
  }

  async function proposeForFair(observationId: string) {
    setFairProposal({ pending: true });
    try {
      const answer = await apiFetch<{ reseed: Proposal }>(`/api/plantings/${plantingId}/reseed/preview`, { method: 'POST', body: { observationId } });
      setFairProposal({ proposal: answer.reseed });
    } catch (error) {
      setFairProposal({ error: errorMessage(error) });
    }
  }

  if (saved) {
    const { stand, observation, reseed } = saved;
    const proposal = reseed && !('error' in reseed) ? reseed : (fairProposal.proposal ?? null);
    return (
      <div className="space-y-4">
        <Card aria-labelledby="result-heading">
          <CardHeader id="result-heading" title="Check saved" description={`${formatLocalDate(observation.observedOn)}${step && step.status === 'planned' ? ' · the germination check step is marked done' : ''}`} />
          <div className="space-y-3">
            <VerdictBadge verdict={stand.verdict} />
            <p className="tabular text-2xl font-bold">
              {one(stand.plantsPerSqFt)} <span className="text-base font-semibold text-loam-soft">plants per sq ft</span>
            </p>
            <p className="text-sm">
              {stand.reason.charAt(0).toUpperCase() + stand.reason.slice(1)}.
            </p>
            <p className="text-sm text-loam-soft">
              Mean of {observation.frameCounts.length} spot{observation.frameCounts.length === 1 ? '' : 's'} ({observation.frameCounts.join(', ')}) ÷ {observation.frameSqFt} sq ft frame.
              {observation.photos.length ? ` ${observation.photos.length} photo${observation.photos.length === 1 ? '' : 's'} kept with the check.` : ''}
            </p>
            <details className="text-xs text-loam-soft">
              <summary className="cursor-pointer font-medium">Where the expected stand and the verdict come from</summary>
              <p className="mt-1">{stand.expected.source}</p>
              <p className="mt-1">{stand.thresholds.source}</p>
            </details>
          </div>
        </Card>
        {reseed && 'error' in reseed ? <Notice tone="error" title="No reseeding could be planned">{reseed.error}</Notice> : null}
        {!proposal && stand.verdict === 'fair' ? (
          <Card aria-labelledby="fair-heading">
            <CardHeader id="fair-heading" title="Reseed a fair stand?" description="A fair stand often fills in. A manager may still choose to reseed the missing share." />
            <Button variant="secondary" className="min-h-14 w-full" pending={fairProposal.pending} onClick={() => proposeForFair(observation.id)}>
              <Sprout className="size-5" aria-hidden="true" />
              Show the reseeding Sowcast would plan
            </Button>
            {fairProposal.error ? <Notice tone="error" className="mt-3">{fairProposal.error}</Notice> : null}
          </Card>
        ) : null}
        {proposal ? (
          <ReseedProposal plotId={plotId} plantingId={plantingId} observationId={observation.id} proposal={proposal} canManage={saved.canAcceptReseed && canManage} today={today} />
        ) : null}
      </div>
    );
  }

  const earlier = <EarlierChecks plotId={plotId} plantingId={plantingId} canManage={canManage} today={today} />;
  if (!canWork) {
    return (
      <div className="space-y-4">
        <Notice tone="info" title="Viewers can look but not record a check">Members, managers and owners of the property record germination checks.</Notice>
        {earlier}
      </div>
    );
  }

  return (
    <div className="space-y-5">
    <form
      className="space-y-5"
      noValidate
      onSubmit={(event) => {
        event.preventDefault();
        void save();
      }}
    >
      {step ? (
        step.status === 'planned' ? (
          <p className="text-sm text-loam-soft">The check is planned for {formatLocalDate(step.date)}; saving it marks the step done today.</p>
        ) : (
          <Notice tone="info">The check step was already recorded; this saves another check of the stand.</Notice>
        )
      ) : null}

      <Card aria-labelledby="count-heading">
        <CardHeader
          id="count-heading"
          title="Count plants in the frame"
          description="Drop the frame at a few spots across the plot and count the seedlings inside it."
        />
        <div className="space-y-4">
          <Field label="Frame size (sq ft)" htmlFor="frame-size" error={errors.frameSqFt} hint="A one-square-foot frame is 12 × 12 in.">
            <Input id="frame-size" inputMode="decimal" value={frame} onChange={(e) => setFrame(e.target.value)} className="max-w-32 text-lg" />
          </Field>
          <ol className="space-y-3" aria-label="Spots">
            {counts.map((c, i) => (
              <li key={i} className="flex items-center gap-2">
                <span className="w-16 shrink-0 text-sm font-semibold">Spot {i + 1}</span>
                <Button variant="secondary" className="size-14 shrink-0 p-0" aria-label={`One fewer at spot ${i + 1}`} onClick={() => bump(i, -1)}>
                  <Minus className="size-5" aria-hidden="true" />
                </Button>
                <Input
                  aria-label={`Plants at spot ${i + 1}`}
                  inputMode="numeric"
                  value={c}
                  onChange={(e) => setCount(i, e.target.value)}
                  className="tabular min-h-14 w-full min-w-0 text-center text-xl"
                  placeholder="0"
                />
                <Button variant="secondary" className="size-14 shrink-0 p-0" aria-label={`One more at spot ${i + 1}`} onClick={() => bump(i, 1)}>
                  <Plus className="size-5" aria-hidden="true" />
                </Button>
                <Button
                  variant="quiet"
                  className="size-11 shrink-0 p-0"
                  aria-label={`Remove spot ${i + 1}`}
                  disabled={counts.length === 1}
                  onClick={() => setCounts((list) => list.filter((_, j) => j !== i))}
                >
                  <X className="size-5" aria-hidden="true" />
                </Button>
              </li>
            ))}
          </ol>
          <FieldError id="frameCounts-error" message={errors.frameCounts} />
          <Button variant="secondary" className="min-h-12 w-full" disabled={counts.length >= 30} onClick={() => setCounts((list) => [...list, ''])}>
            <Plus className="size-5" aria-hidden="true" /> Add a spot
          </Button>
          <div className="rounded-lg border border-ground-line bg-white/70 p-3 text-sm" aria-live="polite">
            {live ? (
              <div className="space-y-1">
                <p className="tabular text-lg font-bold">
                  {one(live.perSqFt)} plants per sq ft <VerdictBadge verdict={live.verdict} />
                </p>
                <p className="text-loam-soft">
                  The blend&apos;s seeding rate should give {one(expected.lowPerSqFt)}–{one(expected.highPerSqFt)} per sq ft.
                </p>
              </div>
            ) : (
              <p className="text-loam-soft">
                The blend&apos;s seeding rate should give {one(expected.lowPerSqFt)}–{one(expected.highPerSqFt)} plants per sq ft. Enter counts to compare.
              </p>
            )}
          </div>
        </div>
      </Card>

      <Card aria-labelledby="stand-heading">
        <CardHeader id="stand-heading" title="How the stand looks" />
        <Choices
          name="standRating"
          legend="Stand rating"
          value={rating}
          onChange={setRating}
          error={errors.standRating}
          options={([5, 4, 3, 2, 1] as const).map((n) => ({ value: n, label: `${n} · ${STAND_RATINGS[n].label}`, hint: STAND_RATINGS[n].hint }))}
        />
        <div className="mt-5">
          <Choices
            name="weedPressure"
            legend="Weed pressure"
            value={weeds}
            onChange={setWeeds}
            error={errors.weedPressure}
            options={WEED_PRESSURES.map((w) => ({ value: w, label: WEED_PRESSURE_LABELS[w] }))}
          />
        </div>
      </Card>

      <Card aria-labelledby="photos-heading">
        <CardHeader id="photos-heading" title="Photos" description="Optional: the frame at a spot, bare patches, weeds coming through." />
        <PhotoUploads plotId={plotId} disabled={pending} onChange={onPhotos} />
        <FieldError message={errors.photoIds} />
      </Card>

      <Card aria-labelledby="notes-heading">
        <Field label="Notes" htmlFor="check-notes" optional error={errors.notes}>
          <Textarea id="check-notes" value={notes} onChange={(e) => setNotes(e.target.value)} placeholder="Dry spots, deer browsing, washouts…" />
        </Field>
      </Card>

      {message ? <Notice tone="error">{message}</Notice> : null}
      <Button type="submit" className="min-h-14 w-full text-lg" pending={pending}>
        <CircleCheck className="size-5" aria-hidden="true" />
        Save the check
      </Button>
    </form>
    {earlier}
    </div>
  );
}
