// Spray window: the hours of a day when a burndown can go on — in daylight, with no measurable rain inside
// the product's rainfast period, wind inside the label's limit (or the stewardship band), air temperature in
// the product's range, and Delta T in the band where droplets neither drift on still humid air nor
// evaporate before they land; not in the hour after sunrise or the two before sunset, when inversions form;
// not in gusts or when rain is likely. The label always governs; these are the defaults for what it leaves unsaid.
import { windSpeedAt2m } from '@/lib/agronomy/et0';
import { mixRainfastHours } from '@/lib/agronomy/herbicides';
import { deltaTC } from '@/lib/agronomy/psychrometrics';
import { cToF, kmhToMph, kmhToMs, msToKmh } from '@/lib/agronomy/units';
import { sunTimes, type SunTimes } from '../daylight';
import { coversUntil, hourIndexAfter, type ForecastIndex } from '../forecast-days';
import { formatNumber, span } from '../format';
import { dayNumber, localClock, shortDay } from '../local-dates';
import type { HerbicidePlan, RuleDecision } from '../types';

const HOUR_MS = 3_600_000;

export interface SprayWindowParams {
  /** Rain-free hours needed after application when the label gives none. */
  rainfastHours: number;
  /** Rain in an hour that counts as rain. */
  measurableRainMm: number;
  windMinMph: number;
  /** Upper wind limit when the label gives none. */
  windMaxMph: number;
  /** Height of the forecast wind; it is brought to 2 m (about spray and eye height) before the band is applied. */
  forecastWindHeightM: number;
  tempMinF: number;
  tempMaxF: number;
  deltaTLowC: number;
  deltaTGoodMaxC: number;
  deltaTMarginalMaxC: number;
  /** Shortest run of hours worth calling a window (mixing, spraying and rinsing a small plot's fills). */
  minWindowHours: number;
  /** Hours after sunrise before spraying starts, and before sunset when it stops (inversions). */
  afterSunriseHours: number;
  beforeSunsetHours: number;
  /** Gusts at spray height above this stop spraying. */
  gustMaxMph: number;
  /** Chance of rain in the rainfast period: from the first, spray with care; from the second, not at all. */
  rainChanceCarePct: number;
  rainChanceAvoidPct: number;
}

export const SPRAY_WINDOW_DEFAULTS: SprayWindowParams = {
  rainfastHours: 6,
  measurableRainMm: 0.25,
  windMinMph: 3,
  windMaxMph: 8,
  forecastWindHeightM: 10,
  tempMinF: 50,
  tempMaxF: 85,
  deltaTLowC: 2,
  deltaTGoodMaxC: 8,
  deltaTMarginalMaxC: 10,
  minWindowHours: 2,
  afterSunriseHours: 1,
  beforeSunsetHours: 2,
  gustMaxMph: 15,
  rainChanceCarePct: 30,
  rainChanceAvoidPct: 60,
};

export const SPRAY_WINDOW_SOURCES: Record<keyof SprayWindowParams, string> = {
  rainfastHours:
    'labels state rainfast periods from about 30 min to 6 h and the label governs; 6 h is the long end, used when the label is silent. ' +
    'Gannon & Yelverton (2008), Weed Technology 22:553 — glyphosate control ≥ 90 % with 60 rain-free minutes, ≥ 80 % with 30.',
  measurableRainMm:
    'US National Weather Service: measurable precipitation is 0.01 in (0.254 mm) or more; less is a "trace" that does not wash a leaf',
  windMinMph:
    'Pesticide Environmental Stewardship (pesticidestewardship.org, "Evaluate the weather"): without label directions spray in at least 3 mph; calmer air may mean a temperature inversion',
  windMaxMph:
    'Pesticide Environmental Stewardship: without label directions spray in no more than 8 mph; more wind carries drift',
  forecastWindHeightM:
    'forecast wind is given at the standard 10 m; FAO-56 eq. 47 (log profile over short grass) brings it to 2 m',
  tempMinF: 'common practice, no source: many burndown labels work best on actively growing weeds, roughly above 50 °F; the label governs',
  tempMaxF: 'common practice, no source: above about 85 °F volatile products move and weeds stress-shut; the label governs',
  deltaTLowC:
    'Australian Bureau of Meteorology / GRDC Spray Application Manual (secondary): below 2 °C, humid still air favours inversions and long drift',
  deltaTGoodMaxC: 'Australian Bureau of Meteorology / GRDC Spray Application Manual (secondary): 2–8 °C preferred',
  deltaTMarginalMaxC:
    'Australian Bureau of Meteorology / GRDC Spray Application Manual (secondary): 8–10 °C marginal (use coarser droplets), above 10 °C avoid',
  minWindowHours: 'common practice, no source: time to mix, spray and rinse the fills of a small food plot',
  afterSunriseHours:
    'NDSU Extension AE1876, Understanding Air Temperature Inversions Relating to Pesticide Drift: inversions build overnight and ' +
    'last into the morning; auxin labels allow spraying only from one hour after sunrise',
  beforeSunsetHours:
    'NDSU Extension AE1876: inversions begin to form toward the end of the day; auxin labels stop spraying two hours before sunset',
  gustMaxMph:
    'dicamba (Clarity) label: do not apply during periods of gusty wind or when wind is in excess of 15 mph; used here for gusts at ' +
    'spray height (forecast gusts at 10 m brought down by the same FAO-56 profile — an approximation)',
  rainChanceCarePct: 'common practice, no source: a 30 % chance of rain in the rainfast period is worth watching the radar for',
  rainChanceAvoidPct: 'common practice, no source: at a 60 % chance of rain in the rainfast period, wait for a drier day',
};

export type SprayHourLevel = 'good' | 'marginal' | 'bad';
type Blocker =
  | 'past'
  | 'dark'
  | 'inversion-hours'
  | 'rain'
  | 'rain-likely'
  | 'wind-high'
  | 'gusts'
  | 'wind-low'
  | 'cold'
  | 'hot'
  | 'delta-t-high'
  | 'forecast-ends';
type Care = 'delta-t-marginal' | 'delta-t-low' | 'rain-chance';

export interface SprayHour {
  index: number;
  level: SprayHourLevel;
  blockers: Blocker[];
  care: Care[];
  windMph: number; // at 2 m
  tempF: number;
  deltaTC: number;
}

export interface SprayDay {
  date: string;
  level: 'good' | 'marginal' | 'none';
  hours: { start: string; end: string } | null;
  /** Hour indices of the window, inclusive. */
  fromIndex: number | null;
  toIndex: number | null;
  decision: RuleDecision;
}

export interface SprayContext {
  fc: ForecastIndex;
  latitudeDeg: number;
  longitudeDeg: number | null | undefined;
  product: HerbicidePlan | null | undefined;
  params: SprayWindowParams;
  /** Hours before this instant have gone by. */
  notBeforeMs?: number | null;
  cache?: Map<string, SprayDay>;
}

/** The limits in force: the label's, where it gives them, else the actives' typical values, else the defaults. */
export function sprayLimits(product: HerbicidePlan | null | undefined, params: SprayWindowParams) {
  const fromActives = product?.rainfastHours == null && product?.activeIngredients?.length ? mixRainfastHours(product.activeIngredients) : null;
  return {
    rainfastHours: product?.rainfastHours ?? fromActives?.hours ?? params.rainfastHours,
    rainfastFrom: product?.rainfastHours != null ? 'the label' : fromActives ? `typical for ${fromActives.active.name}` : null,
    windMaxMph: product?.maxWindMph ?? params.windMaxMph,
    windMinMph: params.windMinMph,
    tempMinF: product?.minTempF ?? params.tempMinF,
    tempMaxF: product?.maxTempF ?? params.tempMaxF,
    labelWind: product?.maxWindMph != null,
  };
}

export function windAtSprayHeightMph(windKmh10m: number, params: SprayWindowParams): number {
  return kmhToMph(msToKmh(windSpeedAt2m(kmhToMs(windKmh10m), params.forecastWindHeightM)));
}

export function evaluateSprayHour(ctx: SprayContext, index: number, sun: SunTimes): SprayHour {
  const { fc, params } = ctx;
  const limits = sprayLimits(ctx.product, params);
  const h = fc.hours[index];
  const blockers: Blocker[] = [];
  const care: Care[] = [];
  const slotEnd = h.ms + HOUR_MS;
  if (ctx.notBeforeMs != null && h.ms < ctx.notBeforeMs) blockers.push('past');
  if (sun.sunriseMs === null ? sun.daylightHours === 0 : h.ms < sun.sunriseMs || slotEnd > (sun.sunsetMs as number)) {
    blockers.push('dark');
  } else if (
    sun.sunriseMs !== null &&
    (h.ms < sun.sunriseMs + params.afterSunriseHours * HOUR_MS || slotEnd > (sun.sunsetMs as number) - params.beforeSunsetHours * HOUR_MS)
  ) {
    blockers.push('inversion-hours');
  }
  const windMph = windAtSprayHeightMph(h.windKmh, params);
  if (windMph > limits.windMaxMph) blockers.push('wind-high');
  const gustMph = h.windGustKmh != null ? windAtSprayHeightMph(h.windGustKmh, params) : null;
  if (gustMph !== null && gustMph > params.gustMaxMph) blockers.push('gusts');
  if (windMph < limits.windMinMph) blockers.push('wind-low');
  const tempF = cToF(h.airTempC);
  if (tempF < limits.tempMinF) blockers.push('cold');
  if (tempF > limits.tempMaxF) blockers.push('hot');
  const dt = deltaTC(h.airTempC, h.relativeHumidityPct);
  if (dt > params.deltaTMarginalMaxC) blockers.push('delta-t-high');
  else if (dt > params.deltaTGoodMaxC) care.push('delta-t-marginal');
  else if (dt < params.deltaTLowC) care.push('delta-t-low');
  // Spray goes on during [t, t+1 h]; the last of it must then stay dry for the rainfast period.
  const dryUntilMs = slotEnd + Math.ceil(limits.rainfastHours) * HOUR_MS;
  if (!coversUntil(fc, dryUntilMs)) blockers.push('forecast-ends');
  else {
    const last = hourIndexAfter(fc.hours, dryUntilMs);
    let chancePct = 0;
    for (let j = index + 1; j < last; j++) {
      if (fc.hours[j].rainMm >= params.measurableRainMm) {
        blockers.push('rain');
        break;
      }
      chancePct = Math.max(chancePct, fc.hours[j].rainProbabilityPct ?? 0);
    }
    if (!blockers.includes('rain')) {
      if (chancePct >= params.rainChanceAvoidPct) blockers.push('rain-likely');
      else if (chancePct >= params.rainChanceCarePct) care.push('rain-chance');
    }
  }
  const level: SprayHourLevel = blockers.length ? 'bad' : care.length ? 'marginal' : 'good';
  return { index, level, blockers, care, windMph, tempF, deltaTC: dt };
}

function longestRun(hours: SprayHour[], accept: (h: SprayHour) => boolean, fc: ForecastIndex): [number, number] | null {
  let best: [number, number] | null = null;
  let start = -1;
  const close = (end: number) => {
    // Strictly longer only, so of two equal runs the earlier one wins.
    if (start >= 0 && (!best || end - start > best[1] - best[0])) best = [start, end];
    start = -1;
  };
  for (let k = 0; k < hours.length; k++) {
    if (!accept(hours[k])) {
      close(k - 1);
      continue;
    }
    if (start >= 0 && fc.hours[hours[k].index].ms - fc.hours[hours[k - 1].index].ms !== HOUR_MS) close(k - 1);
    if (start < 0) start = k;
  }
  close(hours.length - 1);
  return best;
}

const BLOCKER_WORDS = (limits: ReturnType<typeof sprayLimits>, params: SprayWindowParams): Record<Blocker, string> => ({
  past: 'already gone by',
  dark: 'outside daylight',
  'inversion-hours': `within ${formatNumber(params.afterSunriseHours)} h after sunrise or ${formatNumber(params.beforeSunsetHours)} h before sunset (inversion hours)`,
  rain: `rain within ${formatNumber(limits.rainfastHours)} h after spraying`,
  'rain-likely': `a ${params.rainChanceAvoidPct} % or higher chance of rain within ${formatNumber(limits.rainfastHours)} h after spraying`,
  'wind-high': `wind above ${limits.windMaxMph} mph${limits.labelWind ? ' (the label limit)' : ''}`,
  gusts: `gusts above ${params.gustMaxMph} mph`,
  'wind-low': `wind below ${limits.windMinMph} mph (inversion risk)`,
  cold: `below ${limits.tempMinF} °F`,
  hot: `above ${limits.tempMaxF} °F`,
  'delta-t-high': `Delta T above ${params.deltaTMarginalMaxC} °C (droplets evaporate)`,
  'forecast-ends': 'the forecast ends before the rainfast period does',
});

function describeWindow(hours: SprayHour[], window: { start: string; end: string }, limits: ReturnType<typeof sprayLimits>, params: SprayWindowParams): string {
  const r = (xs: number[], digits = 0) => span(formatNumber(Math.min(...xs), digits), formatNumber(Math.max(...xs), digits));
  const parts = [
    `${window.start}–${window.end}`,
    `wind ${r(hours.map((h) => h.windMph))} mph`,
    `Delta T ${r(hours.map((h) => h.deltaTC), 1)} °C`,
    `${r(hours.map((h) => h.tempF))} °F`,
    `no rain for ${formatNumber(limits.rainfastHours)} h after${limits.rainfastFrom ? ` (${limits.rainfastFrom})` : ''}`,
  ];
  const care = new Set(hours.flatMap((h) => h.care));
  if (care.has('rain-chance')) parts.push(`a ${params.rainChanceCarePct}–${params.rainChanceAvoidPct} % chance of rain in the rainfast period: watch the radar`);
  if (care.has('delta-t-marginal')) parts.push(`Delta T ${params.deltaTGoodMaxC}–${params.deltaTMarginalMaxC} °C is marginal: use coarse droplets`);
  if (care.has('delta-t-low')) parts.push(`Delta T under ${params.deltaTLowC} °C: humid still air, watch for an inversion`);
  return parts.join(', ');
}

/** The best hours of one local day, and the decision for the day. */
export function sprayDay(ctx: SprayContext, date: string): SprayDay {
  const cached = ctx.cache?.get(date);
  if (cached) return cached;
  const { fc, params } = ctx;
  const limits = sprayLimits(ctx.product, params);
  const day = fc.byDate.get(date);
  let result: SprayDay;
  if (!day) {
    result = {
      date,
      level: 'none',
      hours: null,
      fromIndex: null,
      toIndex: null,
      decision: {
        rule: 'spray-window',
        ok: true,
        reason: `${shortDay(date)} is beyond the forecast; check the label's wind, rain-free period and temperature on the day`,
      },
    };
  } else {
    const sun = sunTimes(date, ctx.latitudeDeg, ctx.longitudeDeg, fc.timeZone);
    const hours: SprayHour[] = [];
    for (let i = day.firstHour; i <= day.lastHour; i++) hours.push(evaluateSprayHour(ctx, i, sun));
    const need = Math.max(1, Math.ceil(params.minWindowHours));
    const good = longestRun(hours, (h) => h.level === 'good', fc);
    const fair = longestRun(hours, (h) => h.level !== 'bad', fc);
    const pick = good && good[1] - good[0] + 1 >= need ? { run: good, level: 'good' as const } : fair && fair[1] - fair[0] + 1 >= need ? { run: fair, level: 'marginal' as const } : null;
    if (pick) {
      const run = hours.slice(pick.run[0], pick.run[1] + 1);
      const first = fc.hours[run[0].index];
      const last = fc.hours[run[run.length - 1].index];
      const after = fc.hours[run[run.length - 1].index + 1];
      const window = { start: first.clock, end: after && after.ms === last.ms + HOUR_MS ? after.clock : localClock(last.ms + HOUR_MS, fc.timeZone) };
      result = {
        date,
        level: pick.level,
        hours: window,
        fromIndex: run[0].index,
        toIndex: run[run.length - 1].index,
        decision: {
          rule: 'spray-window',
          ok: true,
          marginal: pick.level === 'marginal',
          reason: `spray ${describeWindow(run, window, limits, params)}`,
        },
      };
    } else {
      const daylight = hours.filter((h) => !h.blockers.includes('dark') && !h.blockers.includes('past'));
      const words = BLOCKER_WORDS(limits, params);
      let reason: string;
      if (daylight.length === 0) reason = `no daylight hours of ${shortDay(date)} are left in the forecast`;
      else {
        const counts = new Map<Blocker, number>();
        for (const h of daylight) for (const b of h.blockers) counts.set(b, (counts.get(b) ?? 0) + 1);
        const listed = [...counts.entries()].sort((a, b) => b[1] - a[1]).map(([b, n]) => `${words[b]} in ${n} of ${daylight.length} daylight hours`);
        reason = `no spray window of ${need} h on ${shortDay(date)}: ${listed.join('; ') || 'conditions marginal all day'}`;
      }
      result = { date, level: 'none', hours: null, fromIndex: null, toIndex: null, decision: { rule: 'spray-window', ok: false, reason } };
    }
  }
  ctx.cache?.set(date, result);
  return result;
}

/**
 * The best spray day of a range inside the forecast: a good window beats a marginal one, then the day nearest
 * `preferDate`, then the earlier day. null when no day of the range has a window.
 */
export function bestSprayDay(ctx: SprayContext, from: string, to: string, preferDate: string): SprayDay | null {
  let best: SprayDay | null = null;
  const rank = (d: SprayDay) => (d.level === 'good' ? 0 : 1);
  const distance = (d: SprayDay) => Math.abs(dayNumber(d.date) - dayNumber(preferDate));
  for (const day of ctx.fc.days) {
    if (day.date < from || day.date > to || (ctx.fc.lastDate !== null && day.date > ctx.fc.lastDate)) continue;
    const candidate = sprayDay(ctx, day.date);
    if (candidate.level === 'none') continue;
    if (!best || rank(candidate) < rank(best) || (rank(candidate) === rank(best) && distance(candidate) < distance(best))) best = candidate;
  }
  return best;
}
