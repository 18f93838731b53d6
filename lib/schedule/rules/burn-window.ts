// Burn window: a burn of the killed cover is placed only where the user has recorded a permit or approval
// in hand, and only on hours whose humidity and wind sit in the usual prescribed-fire band. Every decision
// ends with the same instruction: check local burn rules — bans and permit conditions override all of this.
import { kmhToMph } from '@/lib/agronomy/units';
import { sunTimes } from '../daylight';
import type { ForecastIndex } from '../forecast-days';
import { formatNumber, span } from '../format';
import { localClock, shortDay } from '../local-dates';
import type { PlantingInput, RuleDecision } from '../types';

const HOUR_MS = 3_600_000;

export interface BurnWindowParams {
  rhMinPct: number;
  rhMaxPct: number;
  windMinMph: number; // at 20 ft
  windMaxMph: number;
  /** 20-ft wind ÷ 10-m wind. */
  wind20ftPer10m: number;
  minWindowHours: number;
  measurableRainMm: number;
}

export const BURN_WINDOW_DEFAULTS: BurnWindowParams = {
  rhMinPct: 25,
  rhMaxPct: 55,
  windMinMph: 5,
  windMaxMph: 15,
  wind20ftPer10m: 1 / 1.15,
  minWindowHours: 3,
  measurableRainMm: 0.25,
};

export const BURN_WINDOW_SOURCES: Record<keyof BurnWindowParams, string> & { checkLocal: string } = {
  rhMinPct: 'common practice (prescribed-fire prescriptions in the US Southeast): below about 25 % RH fire spots and escapes',
  rhMaxPct: 'common practice (prescribed-fire prescriptions): above about 55 % RH fuels burn poorly and smoulder',
  windMinMph: 'common practice (prescribed-fire prescriptions): 20-ft wind of at least about 5 mph, steady in direction, carries smoke away',
  windMaxMph: 'common practice (prescribed-fire prescriptions): 20-ft wind above about 15 mph makes a fire hard to hold',
  wind20ftPer10m: 'from memory: US fire-weather practice takes 10-m wind as about 15 % stronger than the 20-ft wind',
  minWindowHours: 'common practice, no source: time to light, burn out and mop up a small plot in daylight',
  measurableRainMm: 'US National Weather Service: measurable precipitation is 0.01 in (0.254 mm) or more',
  checkLocal: 'burn bans, permit conditions and local codes override every number here',
};

const CHECK_LOCAL = 'check local burn rules and any ban on the day';

export interface BurnDay {
  date: string;
  ok: boolean;
  hours: { start: string; end: string } | null;
  decision: RuleDecision;
}

export function burnPermitDecision(burn: PlantingInput['burn']): RuleDecision {
  if (burn?.planned && burn.permitInHand) {
    return { rule: 'burn-window', ok: true, reason: `burn permit or approval recorded as in hand; ${CHECK_LOCAL}` };
  }
  return {
    rule: 'burn-window',
    ok: false,
    reason: `no burn permit or approval recorded, so Sowcast places no burn; ${CHECK_LOCAL}`,
  };
}

export function burnDay(
  fc: ForecastIndex,
  date: string,
  site: { latitudeDeg: number; longitudeDeg?: number | null },
  params: BurnWindowParams,
  notBeforeMs: number | null = null,
): BurnDay {
  const day = fc.byDate.get(date);
  if (!day) {
    return {
      date,
      ok: true,
      hours: null,
      decision: { rule: 'burn-window', ok: true, reason: `${shortDay(date)} is beyond the forecast; check humidity, wind and local burn rules on the day` },
    };
  }
  const sun = sunTimes(date, site.latitudeDeg, site.longitudeDeg, fc.timeZone);
  const good: number[] = [];
  const counts = { dark: 0, dry: 0, damp: 0, calm: 0, windy: 0, rain: 0 };
  let daylight = 0;
  for (let i = day.firstHour; i <= day.lastHour; i++) {
    const h = fc.hours[i];
    const dark = sun.sunriseMs === null ? sun.daylightHours === 0 : h.ms < sun.sunriseMs || h.ms + HOUR_MS > (sun.sunsetMs as number);
    if (dark || (notBeforeMs !== null && h.ms < notBeforeMs)) continue;
    daylight += 1;
    const wind = kmhToMph(h.windKmh) * params.wind20ftPer10m;
    const next = fc.hours[i + 1];
    const wet = h.rainMm >= params.measurableRainMm || (next && next.ms - h.ms === HOUR_MS && next.rainMm >= params.measurableRainMm);
    let ok = true;
    if (h.relativeHumidityPct < params.rhMinPct) (counts.dry += 1), (ok = false);
    if (h.relativeHumidityPct > params.rhMaxPct) (counts.damp += 1), (ok = false);
    if (wind < params.windMinMph) (counts.calm += 1), (ok = false);
    if (wind > params.windMaxMph) (counts.windy += 1), (ok = false);
    if (wet) (counts.rain += 1), (ok = false);
    if (ok) good.push(i);
  }
  let best: [number, number] | null = null;
  let start = 0;
  for (let k = 1; k <= good.length; k++) {
    if (k === good.length || good[k] !== good[k - 1] + 1) {
      if (good.length && (!best || k - 1 - start > best[1] - best[0])) best = [start, k - 1];
      start = k;
    }
  }
  const need = Math.max(1, Math.ceil(params.minWindowHours));
  if (best && best[1] - best[0] + 1 >= need) {
    const idx = good.slice(best[0], best[1] + 1);
    const hs = idx.map((i) => fc.hours[i]);
    const hours = { start: hs[0].clock, end: localClock(hs[hs.length - 1].ms + HOUR_MS, fc.timeZone) };
    const r = (xs: number[]) => span(formatNumber(Math.min(...xs), 0), formatNumber(Math.max(...xs), 0));
    return {
      date,
      ok: true,
      hours,
      decision: {
        rule: 'burn-window',
        ok: true,
        reason: `burn ${hours.start}–${hours.end}: humidity ${r(hs.map((h) => h.relativeHumidityPct))} %, 20-ft wind ${r(hs.map((h) => kmhToMph(h.windKmh) * params.wind20ftPer10m))} mph; ${CHECK_LOCAL}`,
      },
    };
  }
  const words: string[] = [];
  if (counts.dry) words.push(`humidity under ${params.rhMinPct} % in ${counts.dry} h`);
  if (counts.damp) words.push(`humidity over ${params.rhMaxPct} % in ${counts.damp} h`);
  if (counts.calm) words.push(`wind under ${params.windMinMph} mph in ${counts.calm} h`);
  if (counts.windy) words.push(`wind over ${params.windMaxMph} mph in ${counts.windy} h`);
  if (counts.rain) words.push(`rain in ${counts.rain} h`);
  return {
    date,
    ok: false,
    hours: null,
    decision: {
      rule: 'burn-window',
      ok: false,
      reason: `no ${need}-h burn window on ${shortDay(date)}${daylight ? ` (${words.join(', ')} of ${daylight} daylight hours)` : ''}; ${CHECK_LOCAL}`,
    },
  };
}
