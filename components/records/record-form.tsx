'use client';

import { zodResolver } from '@hookform/resolvers/zod';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import { CloudSun, Save } from 'lucide-react';
import { useRouter } from 'next/navigation';
import { useEffect, useState } from 'react';
import { useForm, type FieldErrors, type Resolver } from 'react-hook-form';
import { CautionsBlock } from '@/components/planner/cautions-block';
import { Button } from '@/components/ui/button';
import { Card, CardHeader } from '@/components/ui/card';
import { Field, Input, Select, Textarea, controlAria } from '@/components/ui/field';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { apiFetch, errorMessage } from '@/lib/client/api';
import { applyServerErrors } from '@/lib/client/forms';
import type { ApplicationRecordDto } from '@/lib/data/application-records';
import { recordCautions } from '@/lib/records/cautions';
import type { DraftWeather, RecordDraft } from '@/lib/records/draft';
import { instantOf } from '@/lib/schedule/local-dates';
import type { Caution } from '@/lib/schedule/types';
import {
  AMOUNT_UNITS, APPLICATION_KIND_LABELS, APPLICATION_KINDS, RATE_UNITS, RECORD_FIELD_NAMES, WIND_DIRECTIONS,
  applicationCorrectionSchema, applicationRecordSchema, type ApplicationKind,
} from '@/lib/validations/application-record';

export interface RecordFields {
  kind: string;
  plotId: string;
  stepId: string;
  appliedOn: string;
  appliedTime: string;
  areaAcres: number;
  location: string;
  site: string;
  productName: string;
  epaRegNo: string;
  restrictedUse: boolean;
  activeIngredientPct: number;
  rateValue: number;
  rateUnit: string;
  totalProductValue: number;
  totalProductUnit: string;
  waterGal: number;
  sprayer: string;
  applicatorName: string;
  applicatorLicense: string;
  windMph: number;
  windDirection: string;
  airTempF: number;
  humidityPct: number;
  notes: string;
  correctionReason: string;
}

type Weather = Pick<RecordFields, 'windMph' | 'airTempF' | 'humidityPct' | 'windDirection'>;

const blank = NaN;
const num = (v: number | null | undefined) => (typeof v === 'number' && Number.isFinite(v) ? v : undefined);
const text = (v: string) => (v.trim() === '' ? undefined : v);
const sameNumber = (a: number, b: number) => (Number.isFinite(a) ? a : null) === (Number.isFinite(b) ? b : null);

/**
 * Where the weather numbers came from: still the forecast's (or the corrected record's own) when no reading
 * was changed, 'entered' as soon as one was. Nothing when no reading was given. The forecast gives no wind
 * direction, so a direction added to forecast readings does not make them "entered".
 */
function weatherSource(v: RecordFields, origin: { weather: Weather; source: string } | null): string | undefined {
  const given = Number.isFinite(v.windMph) || Number.isFinite(v.airTempF) || Number.isFinite(v.humidityPct) || v.windDirection !== '';
  if (!given) return undefined;
  if (
    origin &&
    sameNumber(v.windMph, origin.weather.windMph) &&
    sameNumber(v.airTempF, origin.weather.airTempF) &&
    sameNumber(v.humidityPct, origin.weather.humidityPct) &&
    (origin.source === 'forecast' || v.windDirection === origin.weather.windDirection)
  ) {
    return origin.source;
  }
  return 'entered';
}

function toBody(v: RecordFields, origin: { weather: Weather; source: string } | null, correcting: boolean): Record<string, unknown> {
  return {
    kind: v.kind || undefined,
    plotId: v.plotId || undefined,
    stepId: text(v.stepId),
    appliedOn: v.appliedOn,
    appliedTime: v.appliedTime,
    areaAcres: num(v.areaAcres),
    location: text(v.location),
    site: text(v.site),
    productName: v.productName,
    epaRegNo: v.kind === 'herbicide' ? text(v.epaRegNo) : undefined,
    restrictedUse: v.kind === 'herbicide' ? v.restrictedUse : false,
    activeIngredientPct: num(v.activeIngredientPct),
    rateValue: num(v.rateValue),
    rateUnit: v.rateUnit || undefined,
    totalProductValue: num(v.totalProductValue),
    totalProductUnit: v.totalProductUnit || undefined,
    waterGal: num(v.waterGal),
    sprayer: text(v.sprayer),
    applicatorName: v.applicatorName,
    applicatorLicense: text(v.applicatorLicense),
    windMph: num(v.windMph),
    windDirection: text(v.windDirection),
    airTempF: num(v.airTempF),
    humidityPct: num(v.humidityPct),
    weatherSource: weatherSource(v, origin),
    notes: text(v.notes),
    ...(correcting ? { correctionReason: v.correctionReason } : {}),
  };
}

const numberProps = { type: 'number' as const, inputMode: 'decimal' as const, step: 'any' };

function fieldsFromRecord(r: ApplicationRecordDto): RecordFields {
  return {
    kind: r.kind,
    plotId: r.plotId ?? '',
    stepId: r.stepId ?? '',
    appliedOn: r.appliedOn,
    appliedTime: r.appliedTime,
    areaAcres: r.areaAcres,
    location: r.location ?? '',
    site: r.site ?? '',
    productName: r.productName,
    epaRegNo: r.epaRegNo ?? '',
    restrictedUse: r.restrictedUse,
    activeIngredientPct: r.activeIngredientPct ?? blank,
    rateValue: r.rateValue,
    rateUnit: r.rateUnit,
    totalProductValue: r.totalProductValue,
    totalProductUnit: r.totalProductUnit,
    waterGal: r.waterGal ?? blank,
    sprayer: r.sprayer ?? '',
    applicatorName: r.applicatorName,
    applicatorLicense: r.applicatorLicense ?? '',
    windMph: r.windMph ?? blank,
    windDirection: r.windDirection ?? '',
    airTempF: r.airTempF ?? blank,
    humidityPct: r.humidityPct ?? blank,
    notes: r.notes ?? '',
    correctionReason: '',
  };
}

function fieldsFromDraft(d: RecordDraft, base: RecordFields): RecordFields {
  return {
    ...base,
    kind: d.kind,
    plotId: d.plotId,
    stepId: d.stepId,
    appliedOn: d.appliedOn,
    appliedTime: d.appliedTime,
    areaAcres: d.areaAcres,
    site: d.site,
    productName: d.productName ?? '',
    activeIngredientPct: d.activeIngredientPct ?? blank,
    rateValue: d.rateValue ?? blank,
    rateUnit: d.rateUnit ?? (d.kind === 'lime' ? 'tons/acre' : d.kind === 'fertilizer' ? 'lb/acre' : 'fl oz/acre'),
    totalProductValue: d.totalProductValue ?? blank,
    totalProductUnit: d.totalProductUnit ?? (d.kind === 'herbicide' ? 'fl oz' : 'lb'),
    waterGal: d.waterGal ?? blank,
    sprayer: d.sprayer ?? '',
    applicatorName: d.applicatorName,
    windMph: d.windMph ?? blank,
    airTempF: d.airTempF ?? blank,
    humidityPct: d.humidityPct ?? blank,
  };
}

interface DraftAnswer {
  draft: RecordDraft;
  weather: DraftWeather | null;
  step: { id: string; kind: string; title: string; status: string; doneOn: string | null };
  cautions: Caution[];
  timeZone: string;
}

export function RecordForm({
  propertyId,
  plots,
  timeZone,
  applicatorName,
  today,
  nowTime,
  stepId,
  correcting,
}: {
  propertyId: string;
  plots: { id: string; name: string; acres: number }[];
  timeZone: string;
  applicatorName: string;
  today: string;
  nowTime: string;
  stepId?: string;
  correcting?: ApplicationRecordDto;
}) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [formMessage, setFormMessage] = useState<string | null>(null);
  const [origin, setOrigin] = useState<{ weather: Weather; source: string } | null>(
    correcting && correcting.weatherSource
      ? {
          weather: { windMph: correcting.windMph ?? blank, airTempF: correcting.airTempF ?? blank, humidityPct: correcting.humidityPct ?? blank, windDirection: correcting.windDirection ?? '' },
          source: correcting.weatherSource,
        }
      : null,
  );
  const [weatherNote, setWeatherNote] = useState<string | null>(null);
  const initial: RecordFields = correcting
    ? fieldsFromRecord(correcting)
    : {
        kind: 'herbicide', plotId: plots[0]?.id ?? '', stepId: '', appliedOn: today, appliedTime: nowTime, areaAcres: plots[0]?.acres ?? blank,
        location: '', site: 'Wildlife food plot', productName: '', epaRegNo: '', restrictedUse: false, activeIngredientPct: blank,
        rateValue: blank, rateUnit: 'fl oz/acre', totalProductValue: blank, totalProductUnit: 'fl oz', waterGal: blank, sprayer: '',
        applicatorName, applicatorLicense: '', windMph: blank, windDirection: '', airTempF: blank, humidityPct: blank, notes: '',
        correctionReason: '',
      };

  const schema = correcting ? applicationCorrectionSchema : applicationRecordSchema;
  const validate = zodResolver(schema);
  const resolver: Resolver<RecordFields> = async (values, context, options) => {
    const result = await validate(toBody(values, origin, !!correcting) as never, context, options as never);
    if (Object.keys(result.errors).length) return { values: {}, errors: result.errors as FieldErrors<RecordFields> };
    return { values, errors: {} };
  };
  const { register, handleSubmit, setError, watch, reset, getValues, setValue, formState: { errors, isSubmitting } } = useForm<RecordFields>({
    resolver,
    defaultValues: initial,
  });

  const draft = useQuery({
    queryKey: ['steps', stepId, 'record-draft'],
    queryFn: () => apiFetch<DraftAnswer>(`/api/steps/${stepId}/record-draft`),
    enabled: !!stepId && !correcting,
    staleTime: Infinity,
  });
  useEffect(() => {
    if (!draft.data) return;
    reset(fieldsFromDraft(draft.data.draft, getValues()));
    const w = draft.data.weather;
    setOrigin(w ? { weather: { windMph: w.windMph, airTempF: w.airTempF, humidityPct: w.humidityPct, windDirection: '' }, source: 'forecast' } : null);
    setWeatherNote(w ? forecastNote(w, timeZone) : 'The stored forecast does not cover that hour: enter the weather you measured.');
    // Only a newly loaded draft fills the form; later edits are the person's.
  }, [draft.data]);

  const kind = watch('kind') as ApplicationKind;
  const restrictedUse = watch('restrictedUse');
  const herbicide = kind === 'herbicide';

  async function weatherForTime() {
    if (!stepId) return;
    const v = getValues();
    try {
      const at = instantOf(v.appliedOn, v.appliedTime, timeZone).toISOString();
      const answer = await apiFetch<DraftAnswer>(`/api/steps/${stepId}/record-draft?at=${encodeURIComponent(at)}`);
      const w = answer.weather;
      if (!w) {
        setWeatherNote('The stored forecast does not cover that hour: enter the weather you measured.');
        return;
      }
      setValue('windMph', w.windMph);
      setValue('airTempF', w.airTempF);
      setValue('humidityPct', w.humidityPct);
      setOrigin({ weather: { windMph: w.windMph, airTempF: w.airTempF, humidityPct: w.humidityPct, windDirection: getValues('windDirection') }, source: 'forecast' });
      setWeatherNote(forecastNote(w, timeZone));
    } catch (error) {
      setWeatherNote(errorMessage(error));
    }
  }

  const submit = handleSubmit(async (values) => {
    setFormMessage(null);
    const body = toBody(values, origin, !!correcting);
    try {
      const url = correcting ? `/api/records/${correcting.id}/corrections` : `/api/properties/${propertyId}/records`;
      const { record } = await apiFetch<{ record: ApplicationRecordDto }>(url, { method: 'POST', body });
      await queryClient.invalidateQueries({ queryKey: ['properties', propertyId, 'records'] });
      router.push(`/properties/${propertyId}/records?saved=${record.id}#record-${record.id}`);
    } catch (error) {
      setFormMessage(applyServerErrors(error, RECORD_FIELD_NAMES, setError));
    }
  });

  if (stepId && !correcting && draft.isPending) return <LoadingBlock label="Filling the record from the plan and the forecast" rows={6} />;

  const e = errors;
  const cautions = draft.data?.cautions ?? recordCautions(herbicide ? 'herbicide' : kind === 'lime' ? 'lime' : 'fertilizer');

  return (
    <form noValidate onSubmit={submit} className="space-y-6">
      {formMessage ? <Notice tone="error">{formMessage}</Notice> : null}
      {draft.isError ? <Notice tone="error" title="The plan could not fill this record">{errorMessage(draft.error)} Fill it in by hand.</Notice> : null}
      {draft.data ? (
        <Notice tone="info" title={`From the plan: ${draft.data.step.title}`}>
          Product, rate, totals and area come from the planting; check them against what you really used.
        </Notice>
      ) : null}
      {correcting ? (
        <Notice tone="caution" title="A correction keeps the original">
          The record of {correcting.appliedOn} stays as it was and is shown as corrected by this one. Say what was wrong.
        </Notice>
      ) : null}

      <CautionsBlock cautions={cautions} />

      <Card aria-labelledby="what-heading">
        <CardHeader id="what-heading" title="What and where" />
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Kind" htmlFor="kind" error={e.kind?.message}>
            <Select {...controlAria('kind', e.kind?.message)} {...register('kind')}>
              {APPLICATION_KINDS.map((k) => (
                <option key={k} value={k}>
                  {APPLICATION_KIND_LABELS[k]}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Plot" htmlFor="plotId" error={e.plotId?.message}>
            <Select
              {...controlAria('plotId', e.plotId?.message)}
              {...register('plotId', {
                onChange: (event) => {
                  const plot = plots.find((p) => p.id === event.target.value);
                  if (plot) setValue('areaAcres', plot.acres);
                },
              })}
            >
              {plots.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Date applied" htmlFor="appliedOn" error={e.appliedOn?.message}>
            <Input type="date" {...controlAria('appliedOn', e.appliedOn?.message)} {...register('appliedOn')} />
          </Field>
          <Field label="Time applied" htmlFor="appliedTime" error={e.appliedTime?.message} hint={`Local time, ${timeZone}.`}>
            <Input type="time" {...controlAria('appliedTime', e.appliedTime?.message, 'hint')} {...register('appliedTime')} />
          </Field>
          <Field label="Area treated (acres)" htmlFor="areaAcres" error={e.areaAcres?.message}>
            <Input {...numberProps} {...controlAria('areaAcres', e.areaAcres?.message)} {...register('areaAcres', { valueAsNumber: true })} />
          </Field>
          <Field label="Location in the plot" htmlFor="location" optional error={e.location?.message} hint="For example “north half” or “field edges only”.">
            <Input {...controlAria('location', e.location?.message, 'hint')} {...register('location')} />
          </Field>
          <Field label="Crop or site" htmlFor="site" optional={!restrictedUse} error={e.site?.message}>
            <Input {...controlAria('site', e.site?.message)} {...register('site')} />
          </Field>
        </div>
      </Card>

      <Card aria-labelledby="product-heading">
        <CardHeader id="product-heading" title="Product and amounts" />
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Product name" htmlFor="productName" error={e.productName?.message} hint="The brand or product name on the label.">
            <Input {...controlAria('productName', e.productName?.message, 'hint')} {...register('productName')} />
          </Field>
          {herbicide ? (
            <Field label="EPA registration number" htmlFor="epaRegNo" optional={!restrictedUse} error={e.epaRegNo?.message} hint="On the label, e.g. EPA Reg. No. 524-445.">
              <Input {...controlAria('epaRegNo', e.epaRegNo?.message, 'hint')} {...register('epaRegNo')} />
            </Field>
          ) : null}
          {herbicide ? (
            <label htmlFor="restrictedUse" className="flex min-h-11 cursor-pointer items-start gap-3 rounded-lg border border-ground-line bg-white px-3 py-2.5 sm:col-span-2">
              <input id="restrictedUse" type="checkbox" className="mt-1 size-5 accent-clover" {...register('restrictedUse')} />
              <span>
                <span className="block text-sm font-semibold text-loam">Restricted-use pesticide</span>
                <span className="block text-xs text-loam-soft">The label says “Restricted Use Pesticide”: a certified applicator and their number are required.</span>
              </span>
            </label>
          ) : null}
          <Field label="Active ingredient (%)" htmlFor="activeIngredientPct" optional error={e.activeIngredientPct?.message}>
            <Input {...numberProps} {...controlAria('activeIngredientPct', e.activeIngredientPct?.message)} {...register('activeIngredientPct', { valueAsNumber: true })} />
          </Field>
          <div className="grid grid-cols-2 gap-2">
            <Field label="Rate" htmlFor="rateValue" error={e.rateValue?.message}>
              <Input {...numberProps} {...controlAria('rateValue', e.rateValue?.message)} {...register('rateValue', { valueAsNumber: true })} />
            </Field>
            <Field label="Rate unit" htmlFor="rateUnit" error={e.rateUnit?.message}>
              <Select {...controlAria('rateUnit', e.rateUnit?.message)} {...register('rateUnit')}>
                {RATE_UNITS.map((u) => (
                  <option key={u} value={u}>
                    {u}
                  </option>
                ))}
              </Select>
            </Field>
          </div>
          <div className="grid grid-cols-2 gap-2">
            <Field label="Total product used" htmlFor="totalProductValue" error={e.totalProductValue?.message}>
              <Input {...numberProps} {...controlAria('totalProductValue', e.totalProductValue?.message)} {...register('totalProductValue', { valueAsNumber: true })} />
            </Field>
            <Field label="Unit" htmlFor="totalProductUnit" error={e.totalProductUnit?.message}>
              <Select {...controlAria('totalProductUnit', e.totalProductUnit?.message)} {...register('totalProductUnit')}>
                {AMOUNT_UNITS.map((u) => (
                  <option key={u} value={u}>
                    {u}
                  </option>
                ))}
              </Select>
            </Field>
          </div>
          {herbicide ? (
            <Field label="Water used (gal)" htmlFor="waterGal" optional error={e.waterGal?.message}>
              <Input {...numberProps} {...controlAria('waterGal', e.waterGal?.message)} {...register('waterGal', { valueAsNumber: true })} />
            </Field>
          ) : null}
          <Field label={herbicide ? 'Sprayer' : 'Spreader'} htmlFor="sprayer" optional error={e.sprayer?.message}>
            <Input {...controlAria('sprayer', e.sprayer?.message)} {...register('sprayer')} />
          </Field>
        </div>
      </Card>

      <Card aria-labelledby="who-heading">
        <CardHeader id="who-heading" title="Applicator and weather" />
        <div className="grid gap-4 sm:grid-cols-2">
          <Field label="Applicator" htmlFor="applicatorName" error={e.applicatorName?.message}>
            <Input {...controlAria('applicatorName', e.applicatorName?.message)} {...register('applicatorName')} />
          </Field>
          <Field label="Applicator certification number" htmlFor="applicatorLicense" optional={!restrictedUse} error={e.applicatorLicense?.message}>
            <Input {...controlAria('applicatorLicense', e.applicatorLicense?.message)} {...register('applicatorLicense')} />
          </Field>
          {weatherNote ? (
            <p className="text-sm text-loam-soft sm:col-span-2" data-testid="weather-note">
              {weatherNote}
            </p>
          ) : null}
          <Field label="Wind speed (mph)" htmlFor="windMph" optional error={e.windMph?.message}>
            <Input {...numberProps} {...controlAria('windMph', e.windMph?.message)} {...register('windMph', { valueAsNumber: true })} />
          </Field>
          <Field label="Wind from" htmlFor="windDirection" optional error={e.windDirection?.message}>
            <Select {...controlAria('windDirection', e.windDirection?.message)} {...register('windDirection')}>
              <option value="">Not recorded</option>
              {WIND_DIRECTIONS.map((d) => (
                <option key={d} value={d}>
                  {d === 'calm' ? 'Calm' : d === 'variable' ? 'Variable' : d}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Air temperature (°F)" htmlFor="airTempF" optional error={e.airTempF?.message}>
            <Input {...numberProps} {...controlAria('airTempF', e.airTempF?.message)} {...register('airTempF', { valueAsNumber: true })} />
          </Field>
          <Field label="Relative humidity (%)" htmlFor="humidityPct" optional error={e.humidityPct?.message}>
            <Input {...numberProps} {...controlAria('humidityPct', e.humidityPct?.message)} {...register('humidityPct', { valueAsNumber: true })} />
          </Field>
          {stepId && !correcting ? (
            <div className="sm:col-span-2">
              <Button variant="secondary" size="sm" onClick={weatherForTime}>
                <CloudSun className="size-4" aria-hidden="true" />
                Forecast weather for this date and time
              </Button>
            </div>
          ) : null}
          <Field label="Notes" htmlFor="notes" optional error={e.notes?.message} className="sm:col-span-2">
            <Textarea {...controlAria('notes', e.notes?.message)} {...register('notes')} />
          </Field>
          {correcting ? (
            <Field label="Reason for the correction" htmlFor="correctionReason" error={e.correctionReason?.message} className="sm:col-span-2">
              <Textarea {...controlAria('correctionReason', e.correctionReason?.message)} {...register('correctionReason')} />
            </Field>
          ) : null}
        </div>
      </Card>

      <div className="flex flex-wrap gap-3">
        <Button type="submit" pending={isSubmitting}>
          <Save className="size-4" aria-hidden="true" />
          {correcting ? 'Save the correction' : 'Save the record'}
        </Button>
      </div>
    </form>
  );
}

function forecastNote(w: DraftWeather, timeZone: string): string {
  const hour = new Date(w.hour).toLocaleTimeString('en-US', { timeZone, hour: 'numeric', minute: '2-digit' });
  const fetched = new Date(w.forecastFetchedAt).toLocaleString('en-US', { timeZone, month: 'short', day: 'numeric', hour: 'numeric', minute: '2-digit' });
  return `Weather filled from the stored forecast for ${hour} (fetched ${fetched}). The forecast gives no wind direction: add the one you saw. Change any reading you measured yourself; the record then says “entered”.`;
}
