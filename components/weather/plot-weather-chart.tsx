'use client';

import { useQuery, type UseQueryResult } from '@tanstack/react-query';
import { CloudOff, CloudSun } from 'lucide-react';
import type { ReactNode } from 'react';
import {
  Bar,
  CartesianGrid,
  ComposedChart,
  Line,
  ReferenceArea,
  ReferenceLine,
  ResponsiveContainer,
  Tooltip,
  XAxis,
  YAxis,
  type BarShapeProps,
  type TooltipContentProps,
} from 'recharts';
import { Card, CardHeader } from '@/components/ui/card';
import { LoadError } from '@/components/ui/load-error';
import { Notice } from '@/components/ui/notice';
import { Skeleton } from '@/components/ui/skeleton';
import { apiFetch } from '@/lib/client/api';
import type { PlotWeather, PlotWeatherDay } from '@/lib/planning/plot-weather';
import { dayWithMonth } from '@/lib/schedule/local-dates';
import tailwindConfig from '@/tailwind.config';
import { ago, instantInZone, rainInches } from './format';

export interface PlotWeatherAnswer {
  timeZone: string;
  now: string;
  today: string;
  staleAfterHours: number;
  state: 'no-forecast' | 'ready' | 'no-days';
  planting: { id: string; season: 'spring' | 'fall'; year: number; method: string; targetSeedDate: string } | null;
  plantingNote: string | null;
  forecast: {
    provider: string;
    fetchedAt: string;
    failingSince: string | null;
    stale: boolean;
    staleReason: 'failing' | 'old' | null;
    staleSince: string | null;
  } | null;
  chart: PlotWeather | null;
}

// The palette is defined once, in tailwind.config.ts; SVG fills need the colour values themselves.
const colors = tailwindConfig.theme!.extend!.colors as Record<string, Record<string, string>>;
const C = {
  loam: colors.loam.DEFAULT,
  loamSoft: colors.loam.soft,
  loamFaint: colors.loam.faint,
  rain: colors.rain.DEFAULT,
  rainLight: colors.rain.light,
  frost: colors.frost.DEFAULT,
  frostLight: colors.frost.light,
  straw: colors.straw.DEFAULT,
  strawLight: colors.straw.light,
  clover: colors.clover.DEFAULT,
  cloverLight: colors.clover.light,
  ember: colors.ember.DEFAULT,
  line: colors.ground.line,
  raised: colors.ground.raised,
};

// The forecast is refreshed by the worker every few hours; looking again every five minutes is plenty.
const REFETCH_MS = 5 * 60_000;
// Axis gutters are the same in every panel, so the days line up from the rain bars down to the moisture strip.
const AXIS_WIDTH = 52;
const MARGIN = { top: 8, right: 4, bottom: 0, left: 4 };
// Below about 44 px a day's labels ("moist", "0.43") no longer fit; narrower screens scroll sideways.
const MIN_DAY_PX = 44;
const TICK = { fontSize: 12, fill: C.loamSoft };
// Below recharts' bar layer (DefaultZIndexes.bar = 300), above its grid.
const STRIP_MARKER_Z = 250;

/** Under the plantings key, so a planting saved, moved or completed on this page redraws the chart too. */
export const plotWeatherKey = (plotId: string) => ['plots', plotId, 'plantings', 'weather'] as const;

export function PlotWeatherChart({ plotId }: { plotId: string }) {
  const query = useQuery({
    queryKey: plotWeatherKey(plotId),
    queryFn: () => apiFetch<PlotWeatherAnswer>(`/api/plots/${plotId}/weather`),
    refetchInterval: REFETCH_MS,
  });
  const answer = query.data;
  const planting = answer?.planting;
  return (
    <Card aria-labelledby="plot-weather-heading" data-testid="plot-weather">
      <CardHeader
        id="plot-weather-heading"
        title="Weather at this plot"
        description={
          planting
            ? `The next days as the engine reads them for the ${planting.season} ${planting.year} planting: rain, soil temperature against the blend minimum, spray windows and the seed zone after seeding.`
            : 'The next days as the engine reads them: rain, soil temperature and spray windows. Plan a planting to see its blend minimum and seed-zone outlook.'
        }
        action={answer?.forecast ? <Fetched answer={answer} /> : null}
      />
      <Body query={query} />
    </Card>
  );
}

function Body({ query }: { query: UseQueryResult<PlotWeatherAnswer> }) {
  if (query.isPending) {
    return (
      <div role="status" aria-live="polite" className="space-y-3">
        <span className="sr-only">Loading the weather chart</span>
        <Skeleton className="h-40 w-full" />
        <Skeleton className="h-44 w-full" />
        <Skeleton className="h-16 w-full" />
      </div>
    );
  }
  if (query.isError) return <LoadError title="The weather chart did not load" error={query.error} onRetry={() => void query.refetch()} />;
  const answer = query.data;
  if (answer.state === 'no-forecast' || !answer.chart) {
    return (
      <div className="rounded-card border border-dashed border-loam-faint bg-white px-6 py-8 text-center">
        <CloudSun className="mx-auto size-10 text-rain" aria-hidden="true" />
        <p className="mt-3 font-semibold">No forecast for this plot yet</p>
        <p className="mx-auto mt-1 max-w-md text-sm text-loam-soft">
          Sowcast fetches one within a few minutes of a property being added; the chart looks again by itself. Until then, plans keep their planned dates.
        </p>
      </div>
    );
  }
  const chart = answer.chart;
  return (
    <div className="space-y-4">
      {answer.forecast?.stale ? <StaleNotice answer={answer} /> : null}
      {answer.plantingNote ? <Notice tone="info">{answer.plantingNote}</Notice> : null}
      {chart.days.length === 0 ? <p className="text-sm text-loam-soft">{chart.summary[0]}</p> : <ChartFigure chart={chart} />}
    </div>
  );
}

function Fetched({ answer }: { answer: PlotWeatherAnswer }) {
  const f = answer.forecast!;
  return (
    <p className="text-right text-sm text-loam-soft">
      <span className="font-medium text-loam">{f.provider}</span>
      <span aria-hidden="true"> · </span>
      <span className="sr-only">, </span>
      fetched{' '}
      <time dateTime={f.fetchedAt} title={instantInZone(f.fetchedAt, answer.timeZone)}>
        {ago(f.fetchedAt, answer.now)}
      </time>
    </p>
  );
}

function StaleNotice({ answer }: { answer: PlotWeatherAnswer }) {
  const f = answer.forecast!;
  return (
    <div role="status" className="flex gap-3 rounded-lg border border-frost/60 border-l-4 border-l-ember bg-frost-light px-4 py-3 text-sm">
      <CloudOff className="mt-0.5 size-5 shrink-0 text-ember" aria-hidden="true" />
      <p>
        <span className="font-semibold">Forecast is stale since {instantInZone(f.staleSince!, answer.timeZone)}.</span>{' '}
        {f.staleReason === 'failing'
          ? 'Refreshing it has failed since then; the chart shows the last good forecast and Sowcast keeps trying.'
          : `It is more than ${answer.staleAfterHours} hours old; the chart shows it until a new one arrives.`}
      </p>
    </div>
  );
}

interface Row extends PlotWeatherDay {
  /** Every strip cell has the same height; what it says is in its text and fill. */
  strip: 1;
}

function ChartFigure({ chart }: { chart: PlotWeather }) {
  const rows: Row[] = chart.days.map((d) => ({ ...d, strip: 1 }));
  const dates = new Set(rows.map((r) => r.date));
  const seedDate = chart.seeding && dates.has(chart.seeding.date) ? chart.seeding.date : null;
  const todayDate = dates.has(chart.today) ? chart.today : null;
  const minF = chart.blend?.minSoilTempF ?? null;
  const soils = rows.flatMap((r) => (r.soilTempF === null ? [] : [r.soilTempF]));
  const span = [...soils, ...(minF === null ? [] : [minF])];
  const tempDomain: [number, number] = span.length ? [Math.floor((Math.min(...span) - 4) / 5) * 5, Math.ceil((Math.max(...span) + 4) / 5) * 5] : [30, 80];
  // Headroom over the wettest day for the amount written above its bar.
  const rainTop = Math.max(0.5, Math.ceil(Math.max(...rows.map((r) => r.rainIn)) * 1.2 * 4) / 4);
  const minWidth = rows.length * MIN_DAY_PX + 2 * AXIS_WIDTH + MARGIN.left + MARGIN.right;
  const dayName = (date: string) => rows.find((r) => r.date === date)?.label ?? date;

  const bothToday = todayDate !== null && todayDate === seedDate;
  const seedWord = chart.seeding?.status === 'done' ? 'Seeded' : 'Seeding';
  const markerLabel = (value: string, fill: string) => ({ value, position: 'top' as const, fill, fontSize: 12, fontWeight: 600, halo: { stroke: C.raised, strokeWidth: 4 } });
  // In the strips the day lines run behind the cells, so the cells' words stay readable.
  const markers = (withLabels: boolean, zIndex?: number) => [
    todayDate && !bothToday ? (
      <ReferenceLine key="today" x={todayDate} yAxisId="left" stroke={C.loam} strokeDasharray="2 3" zIndex={zIndex} label={withLabels ? markerLabel('Today', C.loam) : undefined} />
    ) : null,
    seedDate ? (
      <ReferenceLine
        key="seed"
        x={seedDate}
        yAxisId="left"
        stroke={C.clover}
        strokeWidth={2}
        zIndex={zIndex}
        label={withLabels ? markerLabel(bothToday ? `${seedWord} today` : seedWord, C.clover) : undefined}
      />
    ) : null,
  ];

  const xAxis = (visible: boolean) => (
    <XAxis dataKey="date" scale="band" tickFormatter={dayName} tick={visible ? TICK : false} tickLine={false} axisLine={visible ? { stroke: C.line } : false} height={visible ? 24 : 1} interval={0} />
  );

  const describedBy = 'plot-weather-summary';
  return (
    <figure className="space-y-3" aria-labelledby="plot-weather-heading" aria-describedby={describedBy}>
      <Legend chart={chart} />
      {/* One picture for assistive technology, named by the summary; the table below has every number. */}
      <div className="-mx-1 overflow-x-auto px-1 pb-1" tabIndex={0} role="img" aria-label={`Weather chart. ${chart.summary.join(' ')}`}>
        <div className="tabular" style={{ minWidth }}>
          <PanelTitle>Rain (in) and chance of rain (%)</PanelTitle>
          <ResponsiveContainer width="100%" height={164}>
            <ComposedChart data={rows} margin={{ ...MARGIN, top: 22 }} accessibilityLayer={false}>
              <CartesianGrid stroke={C.line} vertical={false} yAxisId="left" />
              {xAxis(false)}
              <YAxis yAxisId="left" width={AXIS_WIDTH} domain={[0, rainTop]} tick={TICK} tickLine={false} axisLine={false} tickFormatter={(v: number) => `${v} in`} />
              <YAxis yAxisId="right" orientation="right" width={AXIS_WIDTH} domain={[0, 100]} ticks={[0, 50, 100]} tick={TICK} tickLine={false} axisLine={false} tickFormatter={(v: number) => `${v} %`} />
              <Tooltip content={RainTip} cursor={{ fill: C.rainLight, opacity: 0.5 }} />
              <Bar yAxisId="left" dataKey="rainIn" name="Rain" fill={C.rain} maxBarSize={28} isAnimationActive={false} label={RainLabel} />
              <Line yAxisId="right" dataKey="rainProbabilityMaxPct" name="Chance of rain" stroke={C.rain} strokeDasharray="5 3" strokeWidth={1.5} dot={{ r: 2, fill: C.rain }} isAnimationActive={false} connectNulls />
              {markers(true)}
            </ComposedChart>
          </ResponsiveContainer>

          <PanelTitle>Soil temperature, °F{minF !== null ? ` — blend minimum ${minF} °F` : ''}</PanelTitle>
          <ResponsiveContainer width="100%" height={170}>
            <ComposedChart data={rows} margin={MARGIN} accessibilityLayer={false}>
              <CartesianGrid stroke={C.line} vertical={false} yAxisId="left" />
              {xAxis(true)}
              <YAxis yAxisId="left" width={AXIS_WIDTH} domain={tempDomain} tick={TICK} tickLine={false} axisLine={false} tickFormatter={(v: number) => `${v} °F`} allowDecimals={false} />
              <YAxis yAxisId="right" orientation="right" width={AXIS_WIDTH} tick={false} axisLine={false} />
              {minF !== null ? (
                <ReferenceArea
                  yAxisId="left"
                  y1={tempDomain[0]}
                  y2={minF}
                  fill={C.frost}
                  fillOpacity={0.22}
                  stroke="none"
                  ifOverflow="hidden"
                  label={{ value: `Too cold for the blend: below ${minF} °F`, position: 'insideBottomRight', fill: C.loam, fontSize: 12, halo: { stroke: C.raised, strokeWidth: 4 } }}
                />
              ) : null}
              {minF !== null ? <ReferenceLine yAxisId="left" y={minF} stroke={C.frost} strokeWidth={1.5} strokeDasharray="6 3" /> : null}
              <Tooltip content={SoilTip} cursor={{ stroke: C.loamFaint }} />
              <Line yAxisId="left" dataKey="soilTempF" name="Soil" stroke={C.loam} strokeWidth={2} dot={SoilDot} isAnimationActive={false} connectNulls />
              {markers(false)}
            </ComposedChart>
          </ResponsiveContainer>

          <Strip title="Spray window, hours" rows={rows} shape={SprayCell} markers={markers(false, STRIP_MARKER_Z)} />
          {chart.seeding ? <Strip title="Seed zone after seeding" rows={rows} shape={MoistureCell} markers={markers(false, STRIP_MARKER_Z)} /> : null}
        </div>
      </div>
      <figcaption id={describedBy} className="space-y-2 text-sm">
        <ul className="list-disc space-y-1 pl-5">
          {chart.summary.map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
        {chart.seeding ? (
          <p className="text-loam-soft">
            <span className="font-semibold text-loam">Why seeding sits on {dayWithMonth(chart.seeding.date)}:</span> {chart.seeding.reason}
          </p>
        ) : null}
        <Footnote chart={chart} />
      </figcaption>
      <DayTable chart={chart} />
    </figure>
  );
}

/** Sticks to the left edge while a phone scrolls the chart sideways, so each panel stays named. */
function PanelTitle({ children }: { children: ReactNode }) {
  return <p className="sticky left-0 mt-2 w-fit max-w-[85vw] text-xs font-semibold text-loam-soft sm:pl-14">{children}</p>;
}

function Strip({ title, rows, shape, markers }: { title: string; rows: Row[]; shape: (props: BarShapeProps) => React.JSX.Element; markers: ReactNode[] }) {
  return (
    <>
      <PanelTitle>{title}</PanelTitle>
      <ResponsiveContainer width="100%" height={32}>
        <ComposedChart data={rows} margin={{ ...MARGIN, top: 2 }} barCategoryGap={2} accessibilityLayer={false}>
          <XAxis dataKey="date" scale="band" hide />
          <YAxis yAxisId="left" width={AXIS_WIDTH} domain={[0, 1]} tick={false} axisLine={false} />
          <YAxis yAxisId="right" orientation="right" width={AXIS_WIDTH} tick={false} axisLine={false} />
          <Bar yAxisId="left" dataKey="strip" shape={shape} isAnimationActive={false} />
          {markers}
        </ComposedChart>
      </ResponsiveContainer>
    </>
  );
}

function Cell({ props, fill, text, textColor }: { props: BarShapeProps; fill: string; text: string; textColor: string }) {
  const { x = 0, y = 0, width = 0, height = 0 } = props;
  return (
    <g>
      <rect x={x} y={y} width={width} height={height} rx={4} fill={fill} />
      <text x={x + width / 2} y={y + height / 2} dy="0.35em" textAnchor="middle" fontSize={12} fill={textColor}>
        {text}
      </text>
    </g>
  );
}

function SprayCell(props: BarShapeProps) {
  const day = props.payload as Row;
  const s = day.spray;
  if (!s.window) return <Cell props={props} fill={C.raised} text="none" textColor={C.loamSoft} />;
  return <Cell props={props} fill={s.level === 'good' ? C.cloverLight : C.strawLight} text={`${s.suitableHours} h`} textColor={C.loam} />;
}

function MoistureCell(props: BarShapeProps) {
  const day = props.payload as Row;
  if (!day.moisture) return <g />;
  return day.moisture.state === 'moist' ? (
    <Cell props={props} fill={C.rainLight} text="moist" textColor={C.rain} />
  ) : (
    <Cell props={props} fill={C.strawLight} text="dry" textColor={C.loam} />
  );
}

/** Rain amounts written over the bars, so no one has to read the bar height. */
function RainLabel(props: { x?: number | string; y?: number | string; width?: number | string; value?: unknown }) {
  const value = typeof props.value === 'number' ? props.value : 0;
  if (value < 0.005) return <g />;
  const x = Number(props.x ?? 0) + Number(props.width ?? 0) / 2;
  return (
    <text x={x} y={Number(props.y ?? 0) - 4} textAnchor="middle" fontSize={11} fill={C.rain} stroke={C.raised} strokeWidth={3} paintOrder="stroke">
      {value.toFixed(2)}
    </text>
  );
}

function SoilDot(props: { cx?: number; cy?: number; payload?: Row; index?: number }) {
  const { cx, cy, payload } = props;
  if (cx === undefined || cy === undefined || !payload || payload.soilTempF === null) return <g key={props.index} />;
  const cold = payload.soilLevel === 'cold';
  // A cold day is an open frost-blue ring, a warm one a filled dot: the shape says it, not only the colour.
  return cold ? (
    <circle key={props.index} cx={cx} cy={cy} r={4} fill={C.raised} stroke={C.frost} strokeWidth={2} />
  ) : (
    <circle key={props.index} cx={cx} cy={cy} r={3.5} fill={C.loam} />
  );
}

function TipBox({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="tabular rounded-lg border border-ground-line bg-ground-raised px-3 py-2 text-xs shadow-sm">
      <p className="font-semibold text-loam">{title}</p>
      <div className="mt-1 space-y-0.5 text-loam-soft">{children}</div>
    </div>
  );
}

function RainTip({ active, payload }: TooltipContentProps) {
  const day = payload?.[0]?.payload as Row | undefined;
  if (!active || !day) return null;
  return (
    <TipBox title={dayWithMonth(day.date)}>
      <p>Rain {rainInches(day.rainMm)}</p>
      <p>Chance of rain {day.rainProbabilityMaxPct === null ? 'not given' : `${day.rainProbabilityMaxPct} %`}</p>
    </TipBox>
  );
}

function SoilTip({ active, payload }: TooltipContentProps) {
  const day = payload?.[0]?.payload as Row | undefined;
  if (!active || !day) return null;
  return (
    <TipBox title={dayWithMonth(day.date)}>
      <p>
        Soil {day.soilTempF === null ? 'not known' : `${Math.round(day.soilTempF)} °F`}
        {day.soilSource === 'estimated' ? ' (estimated from air)' : ''}
        {day.soilLevel === 'cold' ? ', below the blend minimum' : ''}
      </p>
      <p>
        Air {Math.round(day.airMinF)}–{Math.round(day.airMaxF)} °F
      </p>
      <p>{day.spray.window ? `Spray ${day.spray.window.start}–${day.spray.window.end}` : 'No spray window'}</p>
    </TipBox>
  );
}

function Legend({ chart }: { chart: PlotWeather }) {
  const items: { key: string; swatch: ReactNode; label: string }[] = [
    { key: 'rain', swatch: <span className="inline-block size-3 rounded-sm bg-rain" />, label: 'Rain, inches (bars, amount written above)' },
    { key: 'chance', swatch: <DashSwatch color={C.rain} />, label: 'Chance of rain, % (dashed)' },
    { key: 'soil', swatch: <span className="inline-block size-3 rounded-full bg-loam" />, label: 'Soil temperature, °F (line)' },
  ];
  if (chart.blend) {
    items.push(
      { key: 'cold', swatch: <span className="inline-block size-3 rounded-full border-2 border-frost bg-ground-raised" />, label: 'Soil below the blend minimum (open ring)' },
      { key: 'band', swatch: <span className="inline-block h-3 w-5 rounded-sm bg-frost/40" />, label: `Band: below ${chart.blend.minSoilTempF} °F, too cold for ${chart.blend.limitingSpecies.toLowerCase()}` },
    );
  }
  items.push(
    { key: 'spray-good', swatch: <span className="inline-block h-3 w-5 rounded-sm bg-clover-light ring-1 ring-clover/40" />, label: 'Spray window: hours that pass the spray rules' },
    { key: 'spray-marginal', swatch: <span className="inline-block h-3 w-5 rounded-sm bg-straw-light ring-1 ring-straw/60" />, label: 'Spray window with care (marginal Delta T)' },
  );
  if (chart.seeding) {
    items.push(
      { key: 'moist', swatch: <span className="inline-block h-3 w-5 rounded-sm bg-rain-light ring-1 ring-rain/40" />, label: 'Seed zone “moist”' },
      { key: 'dry', swatch: <span className="inline-block h-3 w-5 rounded-sm bg-straw-light ring-1 ring-straw/60" />, label: 'Seed zone “dry”' },
      { key: 'seed', swatch: <span className="inline-block h-3 w-0.5 bg-clover" />, label: 'Seeding day (solid line)' },
    );
  }
  items.push({ key: 'today', swatch: <DashSwatch color={C.loam} vertical />, label: 'Today (dotted line)' });
  return (
    <ul aria-label="Chart legend" className="flex flex-wrap gap-x-4 gap-y-1.5 text-xs text-loam-soft">
      {items.map((item) => (
        <li key={item.key} className="inline-flex items-center gap-1.5">
          <span aria-hidden="true" className="inline-flex items-center">
            {item.swatch}
          </span>
          {item.label}
        </li>
      ))}
    </ul>
  );
}

function DashSwatch({ color, vertical = false }: { color: string; vertical?: boolean }) {
  return vertical ? (
    <svg width="6" height="12" aria-hidden="true">
      <line x1="3" y1="0" x2="3" y2="12" stroke={color} strokeWidth="1.5" strokeDasharray="2 2" />
    </svg>
  ) : (
    <svg width="20" height="6" aria-hidden="true">
      <line x1="0" y1="3" x2="20" y2="3" stroke={color} strokeWidth="1.5" strokeDasharray="5 3" />
    </svg>
  );
}

function Footnote({ chart }: { chart: PlotWeather }) {
  const s = chart.spray;
  return (
    <p className="text-xs text-loam-soft">
      Rain is the local day’s total; chance is its highest hourly chance. Soil is near the surface
      {chart.days.some((d) => d.soilSource === 'estimated') ? ', estimated from air temperatures on days the provider gives none' : ''}. Spray
      hours are daylight hours with wind {s.windMinMph}–{s.windMaxMph} mph, {s.tempMinF}–{s.tempMaxF} °F and no rain for {s.rainfastHours} h after
      {s.fromLabel && s.productName ? `, from the ${s.productName} label where it says` : ', the defaults when no label says otherwise'}; the label
      is the law. {chart.moisture ? `The seed zone is the top 10 cm of ${chart.moisture.texture.replace('-', ' ')}, taken as dry at the forecast start; it counts as moist from a soaking rain (a quarter inch or more) until it holds less than that much water again, drying at the FAO-56 two-stage rate.` : ''}
    </p>
  );
}

function DayTable({ chart }: { chart: PlotWeather }) {
  return (
    <details className="rounded-lg border border-ground-line bg-white">
      <summary className="min-h-11 cursor-pointer px-4 py-2.5 text-sm font-semibold text-loam">The numbers, day by day</summary>
      <div className="overflow-x-auto">
        <table className="tabular w-full min-w-[40rem] text-left text-sm">
          <caption className="sr-only">Weather at this plot, by local day</caption>
          <thead className="border-b border-ground-line text-xs text-loam-soft">
            <tr>
              <th scope="col" className="px-3 py-2 font-semibold">Day</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Rain</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Chance</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Air low–high</th>
              <th scope="col" className="px-3 py-2 text-right font-semibold">Soil</th>
              <th scope="col" className="px-3 py-2 font-semibold">Spray window</th>
              {chart.seeding ? <th scope="col" className="px-3 py-2 font-semibold">Seed zone</th> : null}
            </tr>
          </thead>
          <tbody>
            {chart.days.map((d) => (
              <tr key={d.date} className="border-b border-ground-line/60 last:border-0">
                <th scope="row" className="whitespace-nowrap px-3 py-1.5 font-medium text-loam">
                  {dayWithMonth(d.date)}
                  {d.isToday ? ' (today)' : ''}
                  {chart.seeding?.date === d.date ? ` (${chart.seeding.status === 'done' ? 'seeded' : 'seeding'})` : ''}
                </th>
                <td className="px-3 py-1.5 text-right">{rainInches(d.rainMm)}</td>
                <td className="px-3 py-1.5 text-right">{d.rainProbabilityMaxPct === null ? '–' : `${d.rainProbabilityMaxPct} %`}</td>
                <td className="whitespace-nowrap px-3 py-1.5 text-right">
                  {Math.round(d.airMinF)}–{Math.round(d.airMaxF)} °F
                </td>
                <td className="whitespace-nowrap px-3 py-1.5 text-right">
                  {d.soilTempF === null ? '–' : `${Math.round(d.soilTempF)} °F`}
                  {d.soilSource === 'estimated' ? ' est.' : ''}
                  {d.soilLevel === 'cold' ? ', too cold' : ''}
                </td>
                <td className="whitespace-nowrap px-3 py-1.5">
                  {d.spray.window ? `${d.spray.window.start}–${d.spray.window.end} (${d.spray.suitableHours} h${d.spray.level === 'marginal' ? ', with care' : ''})` : 'none'}
                </td>
                {chart.seeding ? <td className="px-3 py-1.5">{d.moisture ? d.moisture.state : '–'}</td> : null}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </details>
  );
}
