'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { Eye, Plus, Save, Trash2 } from 'lucide-react';
import { useState } from 'react';
import { useFieldArray, useForm, type FieldErrors, type Resolver } from 'react-hook-form';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Field, FieldError, Input, Select, controlAria } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { LEGUME_NITROGEN_SOURCE, legumeOnly } from '@/lib/agronomy/nitrogen';
import { SPECIES } from '@/lib/agronomy/species';
import { apiFetch } from '@/lib/client/api';
import { applyServerErrors } from '@/lib/client/forms';
import type { Plan } from '@/lib/schedule/types';
import { METHOD_LABELS, METHODS, plantingSchema, SEASONS, SOIL_TEXTURES } from '@/lib/validations/planting';
import { plannerKeys } from './keys';
import { PlanSteps } from './plan-steps';
import { SavedBlends } from './saved-blends';
import { FillFromSoilTest } from '@/components/plots/soil-tests';
import { HerbicideActives } from './herbicide-actives';
import { SeedingCompare } from './seeding-compare';

type Choice = 'usual' | 'yes' | 'no';

/** What the form holds. Sections switched off are left out of what is sent (see toPlantingBody). */
export interface PlantingFields {
  season: string;
  method: string;
  blend: { speciesId: string; share: number }[];
  targetSeedDate: string;
  readyBy: string;
  soilTexture: string;
  seedBagLb: number;
  seedBag: { lb: number; acres: number };
  killWaitDays: number;
  useHerbicide: boolean;
  herbicide: { productName: string; activeIngredients: string[] | false; activeIngredientPct: number; rateKind: string; rate: number; rainfastHours: number };
  sprayer: { tankGal: number; carrierGalPerAcre: number };
  useFertilizer: boolean;
  fertilizer: { grade: [number, number, number]; target: { n: number; p2o5: number; k2o: number }; bagLb: number };
  useLime: boolean;
  lime: { tonsPerAcre: number; bagLb: number };
  clearBrush: boolean;
  burnPlanned: boolean;
  burnPermitInHand: boolean;
  rakeOrTill: Choice;
  coverSeed: Choice;
  upkeep: boolean;
}

const blank = NaN;
const choice = (c: Choice) => (c === 'usual' ? undefined : c === 'yes');
// JSON has no NaN: a number input left empty goes out as undefined (dropped), which the schema reads as "not given".
const num = (v: number) => (Number.isFinite(v) ? v : undefined);
const text = (v: string) => (v.trim() === '' ? undefined : v);

/** The shared planting schema's shape, from what the form holds. */
export function toPlantingBody(v: PlantingFields): Record<string, unknown> {
  const sprays = v.method !== 'frost-seeding' && v.useHerbicide;
  return {
    season: v.season || undefined,
    method: v.method || undefined,
    blend: v.blend.map((part) => ({ speciesId: part.speciesId, share: num(part.share) })),
    targetSeedDate: v.targetSeedDate,
    readyBy: text(v.readyBy),
    soilTexture: text(v.soilTexture),
    seedBagLb: num(v.seedBagLb),
    // The label rate is a pair: sent when either half is filled in, so a half-filled pair gets its message.
    seedBag: Number.isFinite(v.seedBag.lb) || Number.isFinite(v.seedBag.acres) ? { lb: num(v.seedBag.lb), acres: num(v.seedBag.acres) } : null,
    killWaitDays: num(v.killWaitDays),
    herbicide: sprays
      ? {
          productName: v.herbicide.productName,
          activeIngredients: Array.isArray(v.herbicide.activeIngredients) && v.herbicide.activeIngredients.length ? v.herbicide.activeIngredients : undefined,
          activeIngredientPct: num(v.herbicide.activeIngredientPct),
          rateKind: v.herbicide.rateKind,
          rate: num(v.herbicide.rate),
          rainfastHours: num(v.herbicide.rainfastHours),
        }
      : null,
    sprayer: sprays ? { tankGal: num(v.sprayer.tankGal), carrierGalPerAcre: num(v.sprayer.carrierGalPerAcre) } : null,
    fertilizer: v.useFertilizer
      ? {
          grade: v.fertilizer.grade.map(num),
          target: { n: num(v.fertilizer.target.n), p2o5: num(v.fertilizer.target.p2o5), k2o: num(v.fertilizer.target.k2o) },
          bagLb: num(v.fertilizer.bagLb),
        }
      : null,
    lime: v.useLime ? { tonsPerAcre: num(v.lime.tonsPerAcre), bagLb: num(v.lime.bagLb) } : null,
    clearBrush: v.clearBrush,
    burn: v.burnPlanned ? { planned: true, permitInHand: v.burnPermitInHand } : null,
    rakeOrTill: choice(v.rakeOrTill),
    coverSeed: choice(v.coverSeed),
    upkeep: v.upkeep,
  };
}

const validate = zodResolver(plantingSchema);
// The shared schema judges the body that will be sent; the form keeps its own values so nothing typed is lost.
const resolver: Resolver<PlantingFields> = async (values, context, options) => {
  const result = await validate(toPlantingBody(values) as never, context, options as never);
  if (Object.keys(result.errors).length) return { values: {}, errors: result.errors as FieldErrors<PlantingFields> };
  return { values, errors: {} };
};

const FIELD_NAMES = [
  'season', 'method', 'blend', 'targetSeedDate', 'readyBy', 'soilTexture', 'seedBagLb', 'seedBag.lb', 'seedBag.acres', 'killWaitDays',
  'herbicide.productName', 'herbicide.activeIngredients', 'herbicide.activeIngredients.0', 'herbicide.activeIngredientPct', 'herbicide.rateKind', 'herbicide.rate', 'herbicide.rainfastHours',
  'sprayer', 'sprayer.tankGal', 'sprayer.carrierGalPerAcre',
  'fertilizer.grade', 'fertilizer.grade.0', 'fertilizer.grade.1', 'fertilizer.grade.2', 'fertilizer.target',
  'fertilizer.target.n', 'fertilizer.target.p2o5', 'fertilizer.target.k2o', 'fertilizer.bagLb',
  'lime.tonsPerAcre', 'lime.bagLb',
  ...Array.from({ length: 8 }, (_, i) => [`blend.${i}.speciesId`, `blend.${i}.share`]).flat(),
];

/** The actives' error: on the list itself, or on one of its ids. */
function activesError(error: unknown): string | undefined {
  const e = error as ({ message?: string } & Record<number, { message?: string } | undefined>) | undefined;
  return e?.message ?? Object.values(e ?? {}).find((x): x is { message: string } => !!x && typeof x === 'object' && 'message' in x)?.message;
}

const SOIL_TEXTURE_LABELS: Record<(typeof SOIL_TEXTURES)[number], string> = {
  sand: 'Sand', 'loamy-sand': 'Loamy sand', 'sandy-loam': 'Sandy loam', loam: 'Loam', 'silt-loam': 'Silt loam',
  silt: 'Silt', 'silty-clay-loam': 'Silty clay loam', 'silty-clay': 'Silty clay', clay: 'Clay',
};

const CHOICE_LABELS: Record<Choice, string> = { usual: 'As the method usually does', yes: 'Yes', no: 'No' };

function numberProps(step = 'any') {
  return { type: 'number' as const, inputMode: 'decimal' as const, step };
}

function Checkbox({ id, label, hint, ...rest }: { id: string; label: string; hint?: string } & React.ComponentProps<'input'>) {
  return (
    <label htmlFor={id} className="flex min-h-11 cursor-pointer items-start gap-3 rounded-lg border border-ground-line bg-white px-3 py-2.5">
      <input id={id} type="checkbox" className="mt-1 size-5 accent-clover" {...rest} />
      <span>
        <span className="block text-sm font-semibold text-loam">{label}</span>
        {hint ? <span className="block text-xs text-loam-soft">{hint}</span> : null}
      </span>
    </label>
  );
}

export function PlantingForm({
  plotId,
  propertyId,
  plotCover,
  defaultSeedDate,
  defaultReadyBy,
  today,
}: {
  plotId: string;
  propertyId: string;
  plotCover: string;
  defaultSeedDate: string;
  defaultReadyBy: string | null;
  today: string;
}) {
  const queryClient = useQueryClient();
  const [formMessage, setFormMessage] = useState<string | null>(null);
  const [saved, setSaved] = useState<string | null>(null);
  const [preview, setPreview] = useState<Plan | null>(null);
  const [busy, setBusy] = useState<'preview' | 'save' | null>(null);
  const {
    register,
    control,
    handleSubmit,
    setError,
    watch,
    getValues,
    setValue,
    formState: { errors },
  } = useForm<PlantingFields>({
    resolver,
    defaultValues: {
      season: Number(defaultSeedDate.slice(5, 7)) <= 6 ? 'spring' : 'fall',
      method: 'spray-and-seed',
      blend: [{ speciesId: '', share: 1 }],
      targetSeedDate: defaultSeedDate,
      readyBy: defaultReadyBy ?? '',
      soilTexture: '',
      seedBagLb: blank,
      seedBag: { lb: blank, acres: blank },
      killWaitDays: blank,
      useHerbicide: true,
      herbicide: { productName: '', activeIngredients: [], activeIngredientPct: blank, rateKind: 'percent-solution', rate: blank, rainfastHours: blank },
      sprayer: { tankGal: blank, carrierGalPerAcre: blank },
      useFertilizer: false,
      fertilizer: { grade: [blank, blank, blank], target: { n: blank, p2o5: blank, k2o: blank }, bagLb: blank },
      useLime: false,
      lime: { tonsPerAcre: blank, bagLb: blank },
      clearBrush: plotCover === 'brush',
      burnPlanned: false,
      burnPermitInHand: false,
      rakeOrTill: 'usual',
      coverSeed: 'usual',
      upkeep: false,
    },
  });
  const blend = useFieldArray({ control, name: 'blend' });
  const method = watch('method');
  const useHerbicide = watch('useHerbicide');
  const useFertilizer = watch('useFertilizer');
  const useLime = watch('useLime');
  const burnPlanned = watch('burnPlanned');
  const rateKind = watch('herbicide.rateKind');
  const activeIds = watch('herbicide.activeIngredients');
  const blendRows = watch('blend');
  const sprays = method !== 'frost-seeding' && useHerbicide;
  const blendNow = watch('blend');
  // No N is offered for a blend of legumes alone; a value already typed stays visible so it can be cleared.
  const legumesOnly = legumeOnly(blendNow);
  const nTyped = watch('fertilizer.target.n');
  const showN = !legumesOnly || (Number.isFinite(nTyped) && nTyped > 0);

  const send = (kind: 'preview' | 'save') =>
    handleSubmit(async (values) => {
      setFormMessage(null);
      setSaved(null);
      setBusy(kind);
      const body = toPlantingBody(values);
      try {
        if (kind === 'preview') {
          const result = await apiFetch<{ plan: Plan }>(`/api/plots/${plotId}/plan/preview`, { method: 'POST', body });
          setPreview(result.plan);
        } else {
          const result = await apiFetch<{ steps: unknown[] }>(`/api/plots/${plotId}/plantings`, { method: 'POST', body });
          setPreview(null);
          setSaved(`Saved: a planting of ${result.steps.length} steps. It is listed with the plot's plantings.`);
          await queryClient.invalidateQueries({ queryKey: plannerKeys.plantings(plotId) });
        }
      } catch (error) {
        setFormMessage(applyServerErrors(error, FIELD_NAMES, setError));
      } finally {
        setBusy(null);
      }
    });

  const e = errors;
  const blendRootError = (e.blend as { message?: string; root?: { message?: string } } | undefined)?.root?.message ?? e.blend?.message;

  return (
    <Card aria-labelledby="plan-heading" id="plan-a-planting" className="scroll-mt-4">
      <CardHeader
        id="plan-heading"
        title="Plan a planting"
        description="Choose the blend, the method and what you will spray and spread. Preview the engine's plan, then save it."
      />
      <form noValidate onSubmit={send('save')} className="space-y-6">
        {formMessage ? <Notice tone="error">{formMessage}</Notice> : null}

        <fieldset className="grid gap-4 sm:grid-cols-2">
          <legend className="mb-2 text-base font-semibold">Season and method</legend>
          <Field label="Season" htmlFor="season" error={e.season?.message}>
            <Select {...controlAria('season', e.season?.message)} {...register('season')}>
              {SEASONS.map((s) => (
                <option key={s} value={s}>
                  {s === 'spring' ? 'Spring' : 'Fall'}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Method" htmlFor="method" error={e.method?.message}>
            <Select {...controlAria('method', e.method?.message)} {...register('method')}>
              {METHODS.map((m) => (
                <option key={m} value={m}>
                  {METHOD_LABELS[m]}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Planned seeding date" htmlFor="targetSeedDate" error={e.targetSeedDate?.message} hint="The engine moves it ahead of a soaking rain when the forecast allows.">
            <Input type="date" {...controlAria('targetSeedDate', e.targetSeedDate?.message, 'hint')} {...register('targetSeedDate')} />
          </Field>
          <Field label="Ready by" htmlFor="readyBy" optional error={e.readyBy?.message} hint="For example the season opening.">
            <Input type="date" {...controlAria('readyBy', e.readyBy?.message, 'hint')} {...register('readyBy')} />
          </Field>
        </fieldset>

        <fieldset className="space-y-3">
          <legend className="mb-2 text-base font-semibold">Blend</legend>
          <SavedBlends propertyId={propertyId} currentParts={() => getValues('blend')} onApply={(parts) => blend.replace(parts)} />
          <p className="text-sm text-loam-soft">
            A share of 1 sows the species at its full pure-stand rate; in a mix, give each a part (for example 0.5 and 0.5).
          </p>
          {blend.fields.map((row, i) => {
            const speciesError = e.blend?.[i]?.speciesId?.message;
            const shareError = e.blend?.[i]?.share?.message;
            return (
              <div key={row.id} className="grid grid-cols-[1fr_7rem_auto] items-start gap-2">
                <Field label={`Species ${i + 1}`} htmlFor={`blend-${i}-species`} error={speciesError}>
                  <Select {...controlAria(`blend-${i}-species`, speciesError)} {...register(`blend.${i}.speciesId`)}>
                    <option value="">Pick a species</option>
                    {SPECIES.map((s) => (
                      <option key={s.id} value={s.id}>
                        {s.name}
                      </option>
                    ))}
                  </Select>
                </Field>
                <Field label="Share" htmlFor={`blend-${i}-share`} error={shareError}>
                  <Input {...numberProps('0.05')} {...controlAria(`blend-${i}-share`, shareError)} {...register(`blend.${i}.share`, { valueAsNumber: true })} />
                </Field>
                <Button
                  variant="danger-quiet"
                  className="mt-7"
                  disabled={blend.fields.length === 1}
                  onClick={() => blend.remove(i)}
                  aria-label={`Remove species ${i + 1}`}
                >
                  <Trash2 className="size-4" aria-hidden="true" />
                </Button>
              </div>
            );
          })}
          <FieldError message={blendRootError} />
          <div className="flex flex-wrap items-end gap-4">
            <Button variant="secondary" size="sm" disabled={blend.fields.length >= 8} onClick={() => blend.append({ speciesId: '', share: 0.5 })}>
              <Plus className="size-4" aria-hidden="true" />
              Add a species
            </Button>
            <Field label="Seed bag size (lb)" htmlFor="seedBagLb" optional error={e.seedBagLb?.message} className="w-52">
              <Input {...numberProps()} {...controlAria('seedBagLb', e.seedBagLb?.message)} {...register('seedBagLb', { valueAsNumber: true })} />
            </Field>
            <Field label="Soil texture" htmlFor="soilTexture" optional error={e.soilTexture?.message} className="w-52">
              <Select {...controlAria('soilTexture', e.soilTexture?.message)} {...register('soilTexture')}>
                <option value="">Loam (the usual guess)</option>
                {SOIL_TEXTURES.map((t) => (
                  <option key={t} value={t}>
                    {SOIL_TEXTURE_LABELS[t]}
                  </option>
                ))}
              </Select>
            </Field>
          </div>
          <div className="grid gap-4 sm:grid-cols-2">
            <Field label="Bag label: seed (lb)" htmlFor="seedBag-lb" optional error={e.seedBag?.lb?.message} hint="What the bag's label says plants the acres beside it.">
              <Input {...numberProps()} {...controlAria('seedBag-lb', e.seedBag?.lb?.message, 'hint')} {...register('seedBag.lb', { valueAsNumber: true })} />
            </Field>
            <Field
              label="Bag label: covers (acres)"
              htmlFor="seedBag-acres"
              optional
              error={e.seedBag?.acres?.message}
              hint="Into standing cover Sowcast sows twice the label rate; left empty, it keeps to the published broadcast range."
            >
              <Input {...numberProps()} {...controlAria('seedBag-acres', e.seedBag?.acres?.message, 'hint')} {...register('seedBag.acres', { valueAsNumber: true })} />
            </Field>
          </div>
        </fieldset>

        {method !== 'frost-seeding' ? (
          <fieldset className="space-y-3">
            <legend className="mb-2 text-base font-semibold">Burndown herbicide and sprayer</legend>
            <Checkbox id="useHerbicide" label="Spray a burndown before seeding" {...register('useHerbicide')} />
            {sprays ? (
              <div className="grid gap-4 sm:grid-cols-2">
                <Field label="Product name" htmlFor="herbicide-productName" error={e.herbicide?.productName?.message} hint="As printed on the label.">
                  <Input {...controlAria('herbicide-productName', e.herbicide?.productName?.message, 'hint')} {...register('herbicide.productName')} />
                </Field>
                <HerbicideActives
                  registration={register('herbicide.activeIngredients')}
                  selected={Array.isArray(activeIds) ? activeIds : []}
                  blendSpeciesIds={blendRows.map((row) => row.speciesId)}
                  error={activesError(e.herbicide?.activeIngredients)}
                />
                <Field label="Active ingredient (%)" htmlFor="herbicide-ai" optional error={e.herbicide?.activeIngredientPct?.message}>
                  <Input {...numberProps()} {...controlAria('herbicide-ai', e.herbicide?.activeIngredientPct?.message)} {...register('herbicide.activeIngredientPct', { valueAsNumber: true })} />
                </Field>
                <Field label="Rate given as" htmlFor="herbicide-rateKind" error={e.herbicide?.rateKind?.message}>
                  <Select {...controlAria('herbicide-rateKind', e.herbicide?.rateKind?.message)} {...register('herbicide.rateKind')}>
                    <option value="percent-solution">Percent solution (% of the spray mix)</option>
                    <option value="fl-oz-per-acre">Fluid ounces per acre</option>
                  </Select>
                </Field>
                <Field label={rateKind === 'fl-oz-per-acre' ? 'Rate (fl oz per acre)' : 'Rate (% solution)'} htmlFor="herbicide-rate" error={e.herbicide?.rate?.message} hint="The label's rate for this use.">
                  <Input {...numberProps()} {...controlAria('herbicide-rate', e.herbicide?.rate?.message, 'hint')} {...register('herbicide.rate', { valueAsNumber: true })} />
                </Field>
                <Field label="Rainfast period (hours)" htmlFor="herbicide-rainfast" optional error={e.herbicide?.rainfastHours?.message} hint="From the label: how long the spray must stay dry. Empty: the actives' typical period.">
                  <Input {...numberProps()} {...controlAria('herbicide-rainfast', e.herbicide?.rainfastHours?.message, 'hint')} {...register('herbicide.rainfastHours', { valueAsNumber: true })} />
                </Field>
                <Field label="Kill wait (days)" htmlFor="killWaitDays" optional error={e.killWaitDays?.message} hint="Days after spraying before the ground is worked. Empty: the actives' typical wait, else 14.">
                  <Input {...numberProps('1')} {...controlAria('killWaitDays', e.killWaitDays?.message, 'hint')} {...register('killWaitDays', { valueAsNumber: true })} />
                </Field>
                <Field label="Sprayer tank (gal)" htmlFor="sprayer-tank" error={e.sprayer?.tankGal?.message ?? e.sprayer?.message}>
                  <Input {...numberProps()} {...controlAria('sprayer-tank', e.sprayer?.tankGal?.message ?? e.sprayer?.message)} {...register('sprayer.tankGal', { valueAsNumber: true })} />
                </Field>
                <Field label="Spray volume (gal per acre)" htmlFor="sprayer-carrier" error={e.sprayer?.carrierGalPerAcre?.message} hint="What your sprayer lays down, from calibrating it.">
                  <Input {...numberProps()} {...controlAria('sprayer-carrier', e.sprayer?.carrierGalPerAcre?.message, 'hint')} {...register('sprayer.carrierGalPerAcre', { valueAsNumber: true })} />
                </Field>
              </div>
            ) : null}
          </fieldset>
        ) : null}

        <fieldset className="space-y-3">
          <legend className="mb-2 text-base font-semibold">Fertilizer and lime</legend>
          <FillFromSoilTest
            plotId={plotId}
            blend={() => getValues('blend')}
            noTill={method !== 'prepared-seedbed'}
            onFill={({ limeTonsPerAcre, target }) => {
              const set = { shouldDirty: true, shouldValidate: true };
              const n = legumeOnly(getValues('blend')) ? null : target.n;
              if (n !== null || target.p2o5 !== null || target.k2o !== null) {
                setValue('useFertilizer', true, set);
                setValue('fertilizer.target', { n: n ?? blank, p2o5: target.p2o5 ?? blank, k2o: target.k2o ?? blank }, set);
              }
              if (limeTonsPerAcre !== null && limeTonsPerAcre > 0) {
                setValue('useLime', true, set);
                setValue('lime.tonsPerAcre', limeTonsPerAcre, set);
              }
            }}
          />
          <Checkbox id="useFertilizer" label="Spread fertilizer" hint="From the soil test: the bag's grade and the pounds per acre of each nutrient it calls for." {...register('useFertilizer')} />
          {useFertilizer ? (
            <div className="space-y-3">
              <div className="grid grid-cols-3 gap-3">
                {(['N', 'P₂O₅', 'K₂O'] as const).map((label, i) => {
                  const err = e.fertilizer?.grade?.[i]?.message;
                  return (
                    <Field key={label} label={`Grade ${label} (%)`} htmlFor={`fertilizer-grade-${i}`} error={err}>
                      <Input {...numberProps()} {...controlAria(`fertilizer-grade-${i}`, err)} {...register(`fertilizer.grade.${i as 0 | 1 | 2}`, { valueAsNumber: true })} />
                    </Field>
                  );
                })}
              </div>
              <FieldError message={(e.fertilizer?.grade as { message?: string } | undefined)?.message} />
              <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
                {(
                  [
                    ['n', 'N target'],
                    ['p2o5', 'P₂O₅ target'],
                    ['k2o', 'K₂O target'],
                  ] as const
                )
                  .filter(([key]) => key !== 'n' || showN)
                  .map(([key, label]) => {
                    const err = e.fertilizer?.target?.[key]?.message;
                    return (
                      <Field key={key} label={`${label} (lb/acre)`} htmlFor={`fertilizer-target-${key}`} optional error={err}>
                        <Input {...numberProps()} {...controlAria(`fertilizer-target-${key}`, err)} {...register(`fertilizer.target.${key}`, { valueAsNumber: true })} />
                      </Field>
                    );
                  })}
                <Field label="Bag size (lb)" htmlFor="fertilizer-bag" optional error={e.fertilizer?.bagLb?.message}>
                  <Input {...numberProps()} {...controlAria('fertilizer-bag', e.fertilizer?.bagLb?.message)} {...register('fertilizer.bagLb', { valueAsNumber: true })} />
                </Field>
              </div>
              <FieldError message={e.fertilizer?.target?.message} />
              {legumesOnly ? (
                <Notice tone={showN ? 'caution' : 'info'} title={showN ? 'No nitrogen for legumes alone' : undefined}>
                  {showN
                    ? 'This blend is all legumes: inoculated legumes fix their own nitrogen, and N fertilizer feeds the grass and weeds that crowd them. Clear the N target unless your soil test says otherwise.'
                    : 'No N target for an all-legume blend: inoculated legumes fix their own nitrogen.'}{' '}
                  <span className="text-xs text-loam-soft">({LEGUME_NITROGEN_SOURCE.split(' — ')[0]})</span>
                </Notice>
              ) : null}
            </div>
          ) : null}
          <Checkbox
            id="useLime"
            label="Spread lime"
            hint="Tons per acre from the soil test (the fill button works it out for the blend's target pH). Lime goes on months before seeding; above 2 t/acre in two halves."
            {...register('useLime')}
          />
          {useLime ? (
            <div className="grid grid-cols-2 gap-3">
              <Field label="Lime (tons per acre)" htmlFor="lime-tons" error={e.lime?.tonsPerAcre?.message}>
                <Input {...numberProps()} {...controlAria('lime-tons', e.lime?.tonsPerAcre?.message)} {...register('lime.tonsPerAcre', { valueAsNumber: true })} />
              </Field>
              <Field label="Lime bag size (lb)" htmlFor="lime-bag" optional error={e.lime?.bagLb?.message}>
                <Input {...numberProps()} {...controlAria('lime-bag', e.lime?.bagLb?.message)} {...register('lime.bagLb', { valueAsNumber: true })} />
              </Field>
            </div>
          ) : null}
        </fieldset>

        <fieldset className="space-y-3">
          <legend className="mb-2 text-base font-semibold">Options</legend>
          <div className="grid gap-3 sm:grid-cols-2">
            <Checkbox id="clearBrush" label="Clear brush first" hint="Cut brush and saplings before spraying." {...register('clearBrush')} />
            <Checkbox id="upkeep" label="Plan the upkeep" hint="Mowing and grass control through the season." {...register('upkeep')} />
            <Checkbox id="burnPlanned" label="Burn off the dead cover" hint="Only with a permit and a fire break." {...register('burnPlanned')} />
            {burnPlanned ? <Checkbox id="burnPermitInHand" label="The burn permit is in hand" {...register('burnPermitInHand')} /> : null}
            <Field label="Rake or till" htmlFor="rakeOrTill">
              <Select id="rakeOrTill" {...register('rakeOrTill')}>
                {(Object.keys(CHOICE_LABELS) as Choice[]).map((c) => (
                  <option key={c} value={c}>
                    {CHOICE_LABELS[c]}
                  </option>
                ))}
              </Select>
            </Field>
            <Field label="Cover the seed (drag or cultipack)" htmlFor="coverSeed">
              <Select id="coverSeed" {...register('coverSeed')}>
                {(Object.keys(CHOICE_LABELS) as Choice[]).map((c) => (
                  <option key={c} value={c}>
                    {CHOICE_LABELS[c]}
                  </option>
                ))}
              </Select>
            </Field>
          </div>
        </fieldset>

        <div className="flex flex-wrap gap-3 border-t border-ground-line pt-4">
          <Button variant="secondary" pending={busy === 'preview'} disabled={busy !== null} onClick={() => void send('preview')()}>
            <Eye className="size-4" aria-hidden="true" />
            Preview
          </Button>
          <Button type="submit" pending={busy === 'save'} disabled={busy !== null}>
            <Save className="size-4" aria-hidden="true" />
            Save planting
          </Button>
        </div>
        {saved ? <Notice tone="success">{saved}</Notice> : null}
      </form>

      {preview ? (
        <section aria-labelledby="preview-heading" className="mt-6 border-t border-ground-line pt-6">
          <h3 id="preview-heading" className="mb-3 text-lg font-semibold">
            Preview — nothing is saved yet
          </h3>
          <PlanSteps steps={preview.steps} warnings={preview.warnings} plotId={plotId} today={today} />
        </section>
      ) : null}

      <SeedingCompare
        plotId={plotId}
        planting={() => toPlantingBody(getValues())}
        defaultDate={defaultSeedDate}
        onPick={(date) => {
          setValue('targetSeedDate', date, { shouldDirty: true, shouldValidate: true });
          setPreview(null);
          document.getElementById('targetSeedDate')?.focus();
        }}
      />
    </Card>
  );
}

