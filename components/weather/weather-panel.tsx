'use client';

import { useQuery, type UseQueryResult } from '@tanstack/react-query';
import { CloudOff, CloudRain, CloudSun, Droplets, Snowflake, Sprout, Thermometer, Wind } from 'lucide-react';
import type { ReactNode } from 'react';
import { Card, CardHeader } from '@/components/ui/card';
import { cn } from '@/components/ui/cn';
import { LoadError } from '@/components/ui/load-error';
import { Notice } from '@/components/ui/notice';
import { LoadingBlock } from '@/components/ui/skeleton';
import { apiFetch, queryKeys } from '@/lib/client/api';
import { ago, celsius, dayLabel, fahrenheit, instantInZone, mph, rainInches, rainMillimetres } from './format';

export interface WeatherDay {
  date: string;
  hours: number;
  rainMm: number;
  soaking: boolean;
  rainProbabilityMaxPct: number | null;
  tMinC: number;
  tMaxC: number;
  windMaxKmh: number;
  soilTempC: number | null;
  soilSource: 'forecast' | 'estimated' | null;
}

export interface WeatherAnswer {
  timeZone: string;
  now: string;
  today: string;
  provider: string | null;
  fetchedAt: string | null;
  stale: boolean;
  staleSince: string | null;
  staleReason: 'failing' | 'old' | null;
  staleAfterHours: number;
  failingSince: string | null;
  lastError: string | null;
  days: WeatherDay[];
}

// The forecast is refreshed by the worker every few hours; looking again every five minutes is plenty.
const REFETCH_MS = 5 * 60_000;

export function WeatherPanel({ propertyId }: { propertyId: string }) {
  const query = useQuery({
    queryKey: queryKeys.weather(propertyId),
    queryFn: () => apiFetch<WeatherAnswer>(`/api/properties/${propertyId}/weather`),
    refetchInterval: REFETCH_MS,
  });

  return (
    <Card aria-labelledby="weather-heading">
      <CardHeader
        id="weather-heading"
        title="Forecast"
        description={
          query.data
            ? `The next days as Sowcast last fetched them, in local days (${query.data.timeZone}). Sowcast plans spraying and seeding from this forecast.`
            : 'The next days as Sowcast last fetched them. Sowcast plans spraying and seeding from this forecast.'
        }
        action={query.data?.fetchedAt && query.data.provider ? <Fetched answer={query.data} /> : null}
      />
      <PanelBody query={query} />
    </Card>
  );
}

function PanelBody({ query }: { query: UseQueryResult<WeatherAnswer> }) {
  if (query.isPending) return <LoadingBlock label="Loading the forecast" rows={4} />;
  if (query.isError) {
    return <LoadError title="The forecast did not load" error={query.error} onRetry={() => void query.refetch()} />;
  }
  const answer = query.data;
  if (!answer.fetchedAt) {
    return (
      <div className="space-y-4">
        {answer.failingSince ? <FailingWithoutForecast answer={answer} /> : null}
        <div className="rounded-card border border-dashed border-loam-faint bg-white px-6 py-8 text-center">
          <CloudSun className="mx-auto size-10 text-rain" aria-hidden="true" />
          <p className="mt-3 font-semibold">No forecast yet — Sowcast fetches one within a few minutes of start</p>
          <p className="mx-auto mt-1 max-w-md text-sm text-loam-soft">
            Until it arrives, plans keep their planned dates. This panel looks again by itself.
          </p>
        </div>
      </div>
    );
  }
  return (
    <div className="space-y-4">
      {answer.stale ? <StaleNotice answer={answer} /> : null}
      {answer.days.length === 0 ? (
        <p className="text-sm text-loam-soft">The last forecast covers no days from today on.</p>
      ) : (
        <>
          <DayTable answer={answer} />
          <DayCards answer={answer} />
          <p className="text-xs text-loam-soft">
            Rain is the day’s total; chance is the highest hourly chance of rain. Low/high is air temperature at 2 m,
            wind the strongest hourly mean at 10 m. Soil is near the surface
            {answer.days.some((d) => d.soilSource === 'estimated') ? '; “est.” marks a day the provider gave no soil temperature and Sowcast estimated it from the air' : ''}.
          </p>
        </>
      )}
    </div>
  );
}

function Fetched({ answer }: { answer: WeatherAnswer }) {
  return (
    <p className="text-right text-sm text-loam-soft">
      <span className="font-medium text-loam">{answer.provider}</span>
      <span aria-hidden="true"> · </span>
      <span className="sr-only">, </span>
      fetched{' '}
      <time dateTime={answer.fetchedAt!} title={instantInZone(answer.fetchedAt!, answer.timeZone)}>
        {ago(answer.fetchedAt!, answer.now)}
      </time>
    </p>
  );
}

/** Stale is a cold fact, not an emergency: a frost-blue block with an ember edge, never a pop-up. */
function StaleNotice({ answer }: { answer: WeatherAnswer }) {
  const since = instantInZone(answer.staleSince!, answer.timeZone);
  return (
    <div role="status" className="flex gap-3 rounded-lg border border-frost/60 border-l-4 border-l-ember bg-frost-light px-4 py-3 text-sm">
      <CloudOff className="mt-0.5 size-5 shrink-0 text-ember" aria-hidden="true" />
      <div className="min-w-0 space-y-1">
        <p className="font-semibold">Forecast is stale since {since}</p>
        {answer.staleReason === 'failing' ? (
          <p>
            Refreshing has failed since then{answer.lastError ? <>: <span className="break-words">{answer.lastError}</span></> : '.'} Sowcast keeps
            showing and planning with the last good forecast, fetched {ago(answer.fetchedAt!, answer.now)}, and keeps trying.
          </p>
        ) : (
          <p>
            It is more than {answer.staleAfterHours} hours old and has not been refreshed. Sowcast plans with it until a new one
            arrives.
          </p>
        )}
      </div>
    </div>
  );
}

function FailingWithoutForecast({ answer }: { answer: WeatherAnswer }) {
  return (
    <Notice tone="caution" title={`Fetching a forecast has failed since ${instantInZone(answer.failingSince!, answer.timeZone)}`}>
      {answer.lastError ?? 'The forecast provider did not answer.'} Sowcast keeps trying.
    </Notice>
  );
}

function DayName({ day, today }: { day: WeatherDay; today: string }) {
  const { weekday, day: monthDay } = dayLabel(day.date);
  const name = day.date === today ? 'Today' : weekday;
  return (
    <span className="flex flex-col leading-tight">
      <span className="font-semibold">{name}</span>
      <span className="text-xs text-loam-soft tabular">{monthDay}</span>
    </span>
  );
}

/** Marks that say what a day is in words and an icon, never by colour alone. */
function DayMarks({ day }: { day: WeatherDay }) {
  // Freezing as the row shows it (32 °F or below), so the mark and the number never disagree.
  const frost = fahrenheit(day.tMinC) <= 32;
  if (!day.soaking && !frost) return null;
  return (
    <span className="flex flex-wrap gap-1">
      {day.soaking ? (
        <Mark className="bg-rain-light text-rain" icon={<CloudRain className="size-3.5" aria-hidden="true" />}>
          Soaking rain
        </Mark>
      ) : null}
      {frost ? (
        <Mark className="bg-frost-light text-loam" icon={<Snowflake className="size-3.5 text-frost" aria-hidden="true" />}>
          Frost
        </Mark>
      ) : null}
    </span>
  );
}

function Mark({ icon, className, children }: { icon: ReactNode; className: string; children: ReactNode }) {
  return (
    <span className={cn('inline-flex items-center gap-1 rounded-full px-2 py-0.5 text-xs font-semibold', className)}>
      {icon}
      {children}
    </span>
  );
}

const rain = (day: WeatherDay) => (
  <span className="flex flex-col leading-tight tabular">
    <span className={cn('font-semibold', day.soaking && 'text-rain')}>{rainInches(day.rainMm)}</span>
    <span className="text-xs text-loam-soft">{rainMillimetres(day.rainMm)}</span>
  </span>
);
const chance = (day: WeatherDay) => (day.rainProbabilityMaxPct === null ? '—' : `${Math.round(day.rainProbabilityMaxPct)}%`);
const temps = (day: WeatherDay) => (
  <span className="flex flex-col leading-tight tabular">
    <span className="font-semibold">
      {fahrenheit(day.tMinC)}° / {fahrenheit(day.tMaxC)} °F
    </span>
    <span className="text-xs text-loam-soft">
      {celsius(day.tMinC)}° / {celsius(day.tMaxC)} °C
    </span>
  </span>
);
const soil = (day: WeatherDay) =>
  day.soilTempC === null ? (
    '—'
  ) : (
    <span className="tabular">
      {fahrenheit(day.soilTempC)} °F{day.soilSource === 'estimated' ? <span className="text-xs text-loam-soft"> est.</span> : null}
    </span>
  );
const partial = (day: WeatherDay) => (day.hours < 23 ? <span className="block text-xs text-loam-soft">{day.hours} h of forecast</span> : null);

function DayTable({ answer }: { answer: WeatherAnswer }) {
  const head = 'px-3 py-2 text-left text-xs font-semibold uppercase tracking-wide text-loam-soft';
  return (
    <div className="hidden overflow-x-auto rounded-lg border border-ground-line bg-white sm:block">
      <table className="w-full text-sm">
        <caption className="sr-only">Daily forecast, {answer.days.length} days</caption>
        <thead className="border-b border-ground-line bg-ground">
          <tr>
            <th scope="col" className={head}>Day</th>
            <th scope="col" className={head}>
              <span className="inline-flex items-center gap-1"><Droplets className="size-4 text-rain" aria-hidden="true" />Rain</span>
            </th>
            <th scope="col" className={head}>Chance</th>
            <th scope="col" className={head}>
              <span className="inline-flex items-center gap-1"><Thermometer className="size-4" aria-hidden="true" />Low / high</span>
            </th>
            <th scope="col" className={head}>
              <span className="inline-flex items-center gap-1"><Wind className="size-4" aria-hidden="true" />Wind</span>
            </th>
            <th scope="col" className={head}>
              <span className="inline-flex items-center gap-1"><Sprout className="size-4 text-clover" aria-hidden="true" />Soil</span>
            </th>
          </tr>
        </thead>
        <tbody className="divide-y divide-ground-line">
          {answer.days.map((day) => (
            <tr key={day.date} className={cn(day.soaking && 'bg-rain-light/40')}>
              <th scope="row" className="px-3 py-2 text-left font-normal">
                <span className="flex items-center gap-3">
                  <DayName day={day} today={answer.today} />
                  <DayMarks day={day} />
                </span>
                {partial(day)}
              </th>
              <td className="px-3 py-2">{rain(day)}</td>
              <td className="px-3 py-2 tabular">{chance(day)}</td>
              <td className="px-3 py-2">{temps(day)}</td>
              <td className="px-3 py-2 tabular">{mph(day.windMaxKmh)} mph</td>
              <td className="px-3 py-2">{soil(day)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

/** Phones: one compact card per day; each value has its icon, named in the legend and for screen readers. */
function DayCards({ answer }: { answer: WeatherAnswer }) {
  const icon = 'size-4 shrink-0';
  return (
    <div className="space-y-2 sm:hidden">
      <p className="flex flex-wrap gap-x-3 gap-y-1 text-xs text-loam-soft" aria-hidden="true">
        <span className="inline-flex items-center gap-1"><Droplets className={`${icon} text-rain`} />rain, chance</span>
        <span className="inline-flex items-center gap-1"><Thermometer className={icon} />low / high</span>
        <span className="inline-flex items-center gap-1"><Wind className={icon} />wind</span>
        <span className="inline-flex items-center gap-1"><Sprout className={`${icon} text-clover`} />soil</span>
      </p>
      <ol className="space-y-2" aria-label={`Daily forecast, ${answer.days.length} days`}>
        {answer.days.map((day) => {
          const { weekday, day: monthDay } = dayLabel(day.date);
          return (
            <li key={day.date} className={cn('rounded-lg border border-ground-line bg-white px-3 py-2', day.soaking && 'border-rain/40 bg-rain-light/40')}>
              <div className="flex items-center justify-between gap-2">
                <p className="text-sm">
                  <span className="font-semibold">{day.date === answer.today ? 'Today' : weekday}</span>{' '}
                  <span className="text-loam-soft tabular">{monthDay}</span>
                  {day.hours < 23 ? <span className="text-xs text-loam-soft"> · {day.hours} h of forecast</span> : null}
                </p>
                <DayMarks day={day} />
              </div>
              <dl className="mt-1 grid grid-cols-2 gap-x-3 gap-y-1 whitespace-nowrap text-sm tabular">
                <div>
                  <dt className="sr-only">Rain</dt>
                  <dd className="flex flex-col leading-tight">
                    <span className={cn('inline-flex items-center gap-1 font-semibold', day.soaking && 'text-rain')}>
                      <Droplets className={`${icon} text-rain`} aria-hidden="true" />
                      {rainInches(day.rainMm)}
                    </span>
                    <span className="text-xs text-loam-soft">
                      {rainMillimetres(day.rainMm)} · {chance(day)}
                    </span>
                  </dd>
                </div>
                <div>
                  <dt className="sr-only">Low / high</dt>
                  <dd className="flex flex-col leading-tight">
                    <span className="inline-flex items-center gap-1 font-semibold">
                      <Thermometer className={icon} aria-hidden="true" />
                      {fahrenheit(day.tMinC)}°/{fahrenheit(day.tMaxC)}°F
                    </span>
                    <span className="text-xs text-loam-soft">
                      {celsius(day.tMinC)}°/{celsius(day.tMaxC)}°C
                    </span>
                  </dd>
                </div>
                <div>
                  <dt className="sr-only">Wind</dt>
                  <dd className="inline-flex items-center gap-1">
                    <Wind className={icon} aria-hidden="true" />
                    {mph(day.windMaxKmh)} mph
                  </dd>
                </div>
                <div>
                  <dt className="sr-only">Soil</dt>
                  <dd className="inline-flex items-center gap-1">
                    <Sprout className={`${icon} text-clover`} aria-hidden="true" />
                    {soil(day)}
                  </dd>
                </div>
              </dl>
            </li>
          );
        })}
      </ol>
    </div>
  );
}
