'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useQueryClient } from '@tanstack/react-query';
import { useRouter } from 'next/navigation';
import { useEffect, useMemo, useState } from 'react';
import { Controller, useForm, type Resolver } from 'react-hook-form';
import { z } from 'zod';
import { Button, ButtonLink } from '@/components/ui/button';
import { Card } from '@/components/ui/card';
import { Field, FieldError, Input, Select, controlAria } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { cn } from '@/components/ui/cn';
import { apiFetch, queryKeys } from '@/lib/client/api';
import { applyServerErrors, withoutNaN } from '@/lib/client/forms';
import type { PropertyDto } from '@/lib/data/properties';
import { propertySchema, TENURE_LABELS, TENURES } from '@/lib/validations/property';
import { MonthDaySelect } from './month-day-select';
import { useHydrated } from '@/lib/client/use-hydrated';

export type PropertyFields = {
  name: string;
  latitude: number;
  longitude: number;
  timeZone: string;
  elevationM: number;
  avgLastSpringFrost: string;
  avgFirstFallFrost: string;
  avgFirstHardFreeze: string;
  seasonOpensOn: string;
  tenure: (typeof TENURES)[number];
  landownerName: string;
  landownerContact: string;
  permissionGrantedOn: string;
};

const FIELD_NAMES = [
  'name', 'latitude', 'longitude', 'timeZone', 'elevationM', 'avgLastSpringFrost', 'avgFirstFallFrost',
  'avgFirstHardFreeze', 'seasonOpensOn', 'tenure', 'landownerName', 'landownerContact', 'permissionGrantedOn',
] as const satisfies readonly (keyof PropertyFields)[];

const FROST_DATE_FIELDS = [
  { name: 'avgLastSpringFrost', id: 'property-last-spring-frost', legend: 'Average last spring frost' },
  { name: 'avgFirstFallFrost', id: 'property-first-fall-frost', legend: 'Average first fall frost' },
  { name: 'avgFirstHardFreeze', id: 'property-first-hard-freeze', legend: 'Average first hard freeze (28 °F)' },
] as const satisfies readonly { name: keyof PropertyFields; id: string; legend: string }[];

const TENURE_HINTS: Record<PropertyFields['tenure'], string> = {
  owned: 'You or your club own the ground.',
  leased: 'You pay a landowner for the use of it.',
  permission: 'A landowner lets you plant and hunt it.',
};

// Empty number inputs start as '' (react-hook-form turns what is typed into numbers with valueAsNumber).
const blankNumber = '' as unknown as number;

function initialValues(property?: PropertyDto): PropertyFields {
  return {
    name: property?.name ?? '',
    latitude: property?.latitude ?? blankNumber,
    longitude: property?.longitude ?? blankNumber,
    timeZone: property?.timeZone ?? '',
    elevationM: property?.elevationM ?? blankNumber,
    avgLastSpringFrost: property?.avgLastSpringFrost ?? '',
    avgFirstFallFrost: property?.avgFirstFallFrost ?? '',
    avgFirstHardFreeze: property?.avgFirstHardFreeze ?? '',
    seasonOpensOn: property?.seasonOpensOn ?? '',
    tenure: property?.tenure ?? 'owned',
    landownerName: property?.landownerName ?? '',
    landownerContact: property?.landownerContact ?? '',
    permissionGrantedOn: property?.permissionGrantedOn ?? '',
  };
}

/** Zones grouped by their region ("America", "Europe" …) so the long list can be scanned. */
function groupZones(zones: string[]) {
  const groups = new Map<string, string[]>();
  for (const zone of zones) {
    const region = zone.includes('/') ? zone.slice(0, zone.indexOf('/')) : 'Other';
    groups.set(region, [...(groups.get(region) ?? []), zone]);
  }
  return [...groups.entries()];
}

export function PropertyForm({ timeZones, property }: { timeZones: string[]; property?: PropertyDto }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [formMessage, setFormMessage] = useState<string | null>(null);

  // The zone list comes from the server, so the browser checks against the same names the server accepts.
  const schema = useMemo(() => {
    const known = new Set(timeZones);
    return propertySchema.extend({
      timeZone: z
        .string({ error: 'Time zone is required' })
        .trim()
        .min(1, 'Time zone is required')
        .refine((zone) => known.has(zone), 'Time zone must be one of the listed IANA names'),
    });
  }, [timeZones]);

  // Until hydration a click would submit the form natively; the button waits for React.
  const hydrated = useHydrated();
  const {
    register,
    control,
    handleSubmit,
    setError,
    setValue,
    getValues,
    watch,
    formState: { errors, isSubmitting },
  } = useForm<PropertyFields>({
    // raw: the form sends what was typed, blanks included, so an edit can clear an optional field.
    resolver: zodResolver(schema, undefined, { raw: true }) as unknown as Resolver<PropertyFields>,
    defaultValues: initialValues(property),
  });

  useEffect(() => {
    if (property || getValues('timeZone')) return;
    const browserZone = Intl.DateTimeFormat().resolvedOptions().timeZone;
    if (timeZones.includes(browserZone)) setValue('timeZone', browserZone);
  }, [property, timeZones, getValues, setValue]);

  const tenure = watch('tenure');
  const groupedZones = useMemo(() => groupZones(timeZones), [timeZones]);

  const onSubmit = handleSubmit(async (values) => {
    setFormMessage(null);
    const body = withoutNaN(
      values.tenure === 'owned'
        ? { ...values, landownerName: '', landownerContact: '', permissionGrantedOn: '' }
        : values,
    );
    try {
      const saved = property
        ? await apiFetch<{ property: PropertyDto }>(`/api/properties/${property.id}`, { method: 'PATCH', body })
        : await apiFetch<{ property: PropertyDto }>('/api/properties', { method: 'POST', body });
      await queryClient.invalidateQueries({ queryKey: queryKeys.properties });
      router.push(`/properties/${saved.property.id}`);
      router.refresh();
    } catch (error) {
      setFormMessage(applyServerErrors(error, FIELD_NAMES, setError));
    }
  });

  const e = (name: keyof PropertyFields) => errors[name]?.message;
  const hasErrors = Object.keys(errors).length > 0;

  return (
    <form method="post" onSubmit={onSubmit} noValidate className="space-y-6">
      {formMessage ? <Notice tone="error">{formMessage}</Notice> : null}
      {!formMessage && hasErrors ? <Notice tone="error">Nothing was saved yet. Check the fields marked below.</Notice> : null}

      <Card>
        <h2 className="mb-4 text-lg font-semibold">The property</h2>
        <Field label="Name" htmlFor="property-name" error={e('name')} hint="What your club calls it, e.g. “North lease”.">
          <Input {...controlAria('property-name', e('name'), true)} autoComplete="off" {...register('name')} />
        </Field>
      </Card>

      <Card>
        <h2 className="text-lg font-semibold">Where it is</h2>
        <p className="mb-4 mt-0.5 text-sm text-loam-soft">
          The forecast is read for this point, and every step is dated in the property’s own time zone.
        </p>
        <div className="grid gap-5 sm:grid-cols-2">
          <Field label="Latitude" htmlFor="property-latitude" error={e('latitude')} hint="Decimal degrees; south is negative, e.g. 36.412">
            <Input
              {...controlAria('property-latitude', e('latitude'), true)}
              className="tabular"
              type="number"
              step="any"
              inputMode="decimal"
              {...register('latitude', { valueAsNumber: true })}
            />
          </Field>
          <Field label="Longitude" htmlFor="property-longitude" error={e('longitude')} hint="Decimal degrees; west is negative, e.g. -90.118">
            <Input
              {...controlAria('property-longitude', e('longitude'), true)}
              className="tabular"
              type="number"
              step="any"
              {...register('longitude', { valueAsNumber: true })}
            />
          </Field>
          <Field label="Time zone" htmlFor="property-time-zone" error={e('timeZone')} hint="Reminders arrive by this zone’s clock.">
            <Select {...controlAria('property-time-zone', e('timeZone'), true)} {...register('timeZone')}>
              <option value="">Choose a time zone</option>
              {groupedZones.map(([region, zones]) => (
                <optgroup key={region} label={region}>
                  {zones.map((zone) => (
                    <option key={zone} value={zone}>
                      {zone.replaceAll('_', ' ')}
                    </option>
                  ))}
                </optgroup>
              ))}
            </Select>
          </Field>
          <Field label="Elevation (metres)" htmlFor="property-elevation" error={e('elevationM')} hint="Height above sea level in metres; a topographic map shows it.">
            <Input
              {...controlAria('property-elevation', e('elevationM'), true)}
              className="tabular"
              type="number"
              step="any"
              inputMode="numeric"
              {...register('elevationM', { valueAsNumber: true })}
            />
          </Field>
        </div>
      </Card>

      <Card>
        <h2 className="text-lg font-semibold">The season</h2>
        <p className="mb-4 mt-0.5 text-sm text-loam-soft">
          Average frost dates for the area help place cool-season and warm-season plantings. Hardy species survive a light
          frost, so the first hard freeze (28 °F) sets their fall deadline; left empty, Sowcast takes two weeks after the first frost.
        </p>
        <div className="grid gap-5 sm:grid-cols-2">
          {FROST_DATE_FIELDS.map(({ name, id, legend }) => (
            <Controller
              key={name}
              control={control}
              name={name}
              render={({ field }) => (
                <MonthDaySelect id={id} legend={legend} value={field.value} onChange={field.onChange} onBlur={field.onBlur} error={e(name)} />
              )}
            />
          ))}
          <Field label="Season opens on" htmlFor="property-season-opens" error={e('seasonOpensOn')} optional hint="The day plots should be ready, e.g. the opening of the season you hunt.">
            <Input {...controlAria('property-season-opens', e('seasonOpensOn'), true)} className="tabular" type="date" {...register('seasonOpensOn')} />
          </Field>
        </div>
      </Card>

      <Card>
        <fieldset>
          <legend className="text-lg font-semibold">Who holds the land</legend>
          <div className="mt-4 grid gap-3 sm:grid-cols-3">
            {TENURES.map((value) => (
              <label
                key={value}
                htmlFor={`property-tenure-${value}`}
                className={cn(
                  'flex min-h-16 cursor-pointer gap-3 rounded-lg border bg-white px-4 py-3',
                  tenure === value ? 'border-clover ring-2 ring-clover/25' : 'border-ground-line hover:border-loam-faint',
                )}
              >
                <input
                  id={`property-tenure-${value}`}
                  type="radio"
                  value={value}
                  className="mt-1 size-5 accent-[#3d7a3a]"
                  {...register('tenure')}
                />
                <span>
                  <span className="block font-semibold">{TENURE_LABELS[value]}</span>
                  <span className="block text-xs text-loam-soft">{TENURE_HINTS[value]}</span>
                </span>
              </label>
            ))}
          </div>
          <FieldError id="property-tenure-error" message={e('tenure')} />
        </fieldset>

        {tenure !== 'owned' ? (
          <div className="mt-5 grid gap-5 border-t border-ground-line pt-5 sm:grid-cols-2">
            <Field label="Landowner name" htmlFor="property-landowner-name" error={e('landownerName')} optional>
              <Input {...controlAria('property-landowner-name', e('landownerName'))} autoComplete="off" {...register('landownerName')} />
            </Field>
            <Field label="Landowner contact" htmlFor="property-landowner-contact" error={e('landownerContact')} optional hint="Phone or e-mail, for the people who plant here.">
              <Input {...controlAria('property-landowner-contact', e('landownerContact'), true)} autoComplete="off" {...register('landownerContact')} />
            </Field>
            <Field
              label={tenure === 'leased' ? 'Lease or permission granted on' : 'Permission granted on'}
              htmlFor="property-permission-date"
              error={e('permissionGrantedOn')}
              optional
              hint="Keep it with the written permission in case anyone asks."
            >
              <Input {...controlAria('property-permission-date', e('permissionGrantedOn'), true)} className="tabular" type="date" {...register('permissionGrantedOn')} />
            </Field>
          </div>
        ) : null}
      </Card>

      <div className="flex flex-col-reverse gap-3 sm:flex-row sm:justify-end">
        <ButtonLink href={property ? `/properties/${property.id}` : '/properties'} variant="secondary">
          Cancel
        </ButtonLink>
        <Button type="submit" pending={isSubmitting} disabled={!hydrated}>
          {property ? 'Save property' : 'Create property'}
        </Button>
      </div>
    </form>
  );
}
