// A forecast read once into what the rules ask of it: local hours, local days with their rain and soil
// temperature, rain events, and running rain sums. Built once per plan/replan call so each rule's question
// ("rain in the 6 h after 10:00?", "soil on Tue 14?") is a lookup, not a pass over 384 hours.
import { dailySoilTemperatures } from '@/lib/agronomy/soil-temperature';
import { addDays, fromDayNumber, instantOf, offsetsForSortedInstants } from './local-dates';
import type { Forecast } from './types';

const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;

export interface IndexedHour {
  ms: number; // the stamp's instant
  date: string; // local date of the stamp
  /** Local date of the hour the rain total covers (the hour ending at the stamp). */
  rainDate: string;
  clock: string; // local 'HH:mm' of the stamp
  rainMm: number;
  rainProbabilityPct: number | null;
  airTempC: number;
  relativeHumidityPct: number;
  windKmh: number;
  windGustKmh: number | null;
  soilTempC: number | null;
}

export interface ForecastDay {
  date: string;
  firstHour: number; // index into hours
  lastHour: number;
  rainMm: number; // rain falling during the local day
  airMaxC: number;
  airMinC: number;
  soilTempC: number | null;
  soilSource: 'forecast' | 'estimated' | null;
}

export interface RainEvent {
  /** When the first measurable hour of rain begins (stamp − 1 h). */
  startMs: number;
  startDate: string;
  startClock: string;
  /** Rain from the start through the following `soakingWindowHours`. */
  totalMm: number;
  qualifies: boolean; // totalMm ≥ soaking threshold
  /** The event began in the forecast's first hour, so it may have started earlier. */
  openStart: boolean;
}

export interface ForecastIndexOptions {
  measurableRainMm: number;
  eventGapHours: number;
  soakingRainMm: number;
  soakingWindowHours: number;
}

export interface ForecastIndex {
  timeZone: string;
  fetchedAt: string;
  hours: IndexedHour[];
  days: ForecastDay[];
  byDate: Map<string, ForecastDay>;
  /** Rain per local day (by the hour the rain falls in), including partial days at the ends. */
  rainByDate: Map<string, number>;
  /** Horizon: the first local date with forecast hours, the last one covered to 23:00. null when empty. */
  firstDate: string | null;
  lastDate: string | null;
  rainPrefix: Float64Array; // rainPrefix[i] = Σ rainMm of hours[0..i-1]
  /** 'YYYY-MM-DDTHH:mm' local → instant, for the forecast's own hours. */
  instantByLocal: Map<string, number>;
  rainEvents: RainEvent[];
  options: ForecastIndexOptions;
}

export class ForecastError extends Error {}

function finite(value: unknown, what: string, time: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) {
    throw new ForecastError(`Forecast hour ${time}: ${what} must be a number (got ${JSON.stringify(value)}).`);
  }
  return value;
}

/** Local 'HH:mm' and day number from an instant and the zone's offset at it. */
function localParts(ms: number, offsetMs: number): { day: number; clock: string } {
  const local = ms + offsetMs;
  const day = Math.floor(local / DAY_MS);
  const minutes = Math.round((local - day * DAY_MS) / 60_000);
  const hh = String(Math.floor(minutes / 60)).padStart(2, '0');
  const mm = String(minutes % 60).padStart(2, '0');
  return { day, clock: `${hh}:${mm}` };
}

/**
 * The index of a forecast is a pure function of its hours, zone and options, and the worker replans every
 * planting of a property against one forecast; so the last index per forecast object is kept, checked by a
 * fingerprint of the hours so a forecast changed in place is never read stale.
 */
const memo = new WeakMap<Forecast, { fingerprint: number; timeZone: string; options: string; index: ForecastIndex }>();

function fingerprint(forecast: Forecast): number {
  let h = forecast.hours.length | 0;
  const mix = (x: number) => {
    h = Math.imul(h ^ (Number.isFinite(x) ? Math.round(x * 1000) : 0x5bd1e995), 0x01000193) | 0;
  };
  for (const hour of forecast.hours) {
    const time = typeof hour?.time === 'string' ? hour.time : '';
    for (let i = 0; i < time.length; i++) h = Math.imul(h ^ time.charCodeAt(i), 0x01000193) | 0;
    mix(hour?.rainMm);
    mix(hour?.airTempC);
    mix(hour?.relativeHumidityPct);
    mix(hour?.windKmh);
    mix(hour?.soilTempC ?? NaN);
    mix(hour?.rainProbabilityPct ?? NaN);
    mix(hour?.windGustKmh ?? NaN);
  }
  return h;
}

export function indexForecast(forecast: Forecast, timeZone: string, options: ForecastIndexOptions): ForecastIndex {
  if (!forecast || !Array.isArray(forecast.hours)) throw new ForecastError('A forecast needs a list of hours.');
  const print = fingerprint(forecast);
  const optionsKey = JSON.stringify(options);
  const hit = memo.get(forecast);
  if (hit && hit.fingerprint === print && hit.timeZone === timeZone && hit.options === optionsKey && hit.index.fetchedAt === forecast.fetchedAt) {
    return hit.index;
  }
  const index = buildIndex(forecast, timeZone, options);
  memo.set(forecast, { fingerprint: print, timeZone, options: optionsKey, index });
  return index;
}

function buildIndex(forecast: Forecast, timeZone: string, options: ForecastIndexOptions): ForecastIndex {
  if (!forecast || !Array.isArray(forecast.hours)) throw new ForecastError('A forecast needs a list of hours.');
  const parsed = forecast.hours.map((h) => {
    const ms = Date.parse(h?.time);
    if (typeof h?.time !== 'string' || Number.isNaN(ms)) {
      throw new ForecastError(`Forecast hour time ${JSON.stringify(h?.time)} is not an ISO instant.`);
    }
    const rainMm = finite(h.rainMm, 'rain (mm)', h.time);
    if (rainMm < 0) throw new ForecastError(`Forecast hour ${h.time}: rain cannot be negative (${rainMm} mm).`);
    const rh = finite(h.relativeHumidityPct, 'relative humidity (%)', h.time);
    if (rh < 0 || rh > 100) throw new ForecastError(`Forecast hour ${h.time}: relative humidity ${rh} % is not 0–100.`);
    const windKmh = finite(h.windKmh, 'wind (km/h)', h.time);
    if (windKmh < 0) throw new ForecastError(`Forecast hour ${h.time}: wind cannot be negative.`);
    return {
      ms,
      source: h,
      rainMm,
      airTempC: finite(h.airTempC, 'air temperature (°C)', h.time),
      rh,
      windKmh,
      soil: typeof h.soilTempC === 'number' && Number.isFinite(h.soilTempC) ? h.soilTempC : null,
    };
  });
  parsed.sort((a, b) => a.ms - b.ms);
  const unique = parsed.filter((h, i) => i === 0 || h.ms !== parsed[i - 1].ms);

  const stampOffsets = offsetsForSortedInstants(timeZone, unique.map((h) => h.ms));
  const rainStartOffsets = offsetsForSortedInstants(timeZone, unique.map((h) => h.ms - HOUR_MS));
  const hours: IndexedHour[] = unique.map((h, i) => {
    const stamp = localParts(h.ms, stampOffsets[i]);
    const rainStart = localParts(h.ms - HOUR_MS, rainStartOffsets[i]);
    return {
      ms: h.ms,
      date: fromDayNumber(stamp.day),
      rainDate: fromDayNumber(rainStart.day),
      clock: stamp.clock,
      rainMm: h.rainMm,
      rainProbabilityPct: h.source.rainProbabilityPct ?? null,
      airTempC: h.airTempC,
      relativeHumidityPct: h.rh,
      windKmh: h.windKmh,
      windGustKmh: typeof h.source.windGustKmh === 'number' ? h.source.windGustKmh : null,
      soilTempC: h.soil,
    };
  });

  const rainPrefix = new Float64Array(hours.length + 1);
  const rainByDate = new Map<string, number>();
  for (let i = 0; i < hours.length; i++) {
    rainPrefix[i + 1] = rainPrefix[i] + hours[i].rainMm;
    rainByDate.set(hours[i].rainDate, (rainByDate.get(hours[i].rainDate) ?? 0) + hours[i].rainMm);
  }

  const soil = hours.length
    ? dailySoilTemperatures(
        unique.map((h) => ({ time: h.source.time, airTempC: h.airTempC, soilTempC: h.soil })),
        timeZone,
      )
    : [];
  const soilByDate = new Map(soil.map((d) => [d.date, d]));

  const days: ForecastDay[] = [];
  for (let i = 0; i < hours.length; i++) {
    const h = hours[i];
    const last = days[days.length - 1];
    if (last && last.date === h.date) {
      last.lastHour = i;
      last.airMaxC = Math.max(last.airMaxC, h.airTempC);
      last.airMinC = Math.min(last.airMinC, h.airTempC);
    } else {
      const s = soilByDate.get(h.date);
      days.push({
        date: h.date,
        firstHour: i,
        lastHour: i,
        rainMm: 0,
        airMaxC: h.airTempC,
        airMinC: h.airTempC,
        soilTempC: s ? s.soilTempC : null,
        soilSource: s ? s.source : null,
      });
    }
  }
  for (const d of days) d.rainMm = rainByDate.get(d.date) ?? 0;
  const byDate = new Map(days.map((d) => [d.date, d]));

  let firstDate: string | null = null;
  let lastDate: string | null = null;
  if (hours.length) {
    const lastHour = hours[hours.length - 1];
    firstDate = hours[0].date;
    // A day counts as forecast when its hours run to 23:00; a later partial day does not.
    lastDate = lastHour.clock >= '23:00' ? lastHour.date : addDays(lastHour.date, -1);
    if (lastDate < firstDate) {
      firstDate = null;
      lastDate = null;
    }
  }

  const rainEvents: RainEvent[] = [];
  const windowMs = options.soakingWindowHours * HOUR_MS;
  let lastWetMs = -Infinity;
  for (let i = 0; i < hours.length; i++) {
    const h = hours[i];
    if (h.rainMm < options.measurableRainMm) continue;
    const startMs = h.ms - HOUR_MS;
    if (startMs - lastWetMs >= options.eventGapHours * HOUR_MS) {
      const totalMm = rainInInterval({ hours, rainPrefix }, startMs, startMs + windowMs);
      rainEvents.push({
        startMs,
        startDate: h.rainDate,
        startClock: localParts(startMs, rainStartOffsets[i]).clock,
        totalMm,
        qualifies: totalMm >= options.soakingRainMm,
        openStart: i === 0,
      });
    }
    lastWetMs = h.ms;
  }

  const instantByLocal = new Map<string, number>();
  for (const h of hours) {
    const key = `${h.date}T${h.clock}`;
    // In the repeated hour of a DST fall-back the earlier instant is the one a wall-clock time means first.
    if (!instantByLocal.has(key)) instantByLocal.set(key, h.ms);
  }

  return {
    timeZone,
    fetchedAt: forecast.fetchedAt,
    instantByLocal,
    hours,
    days,
    byDate,
    rainByDate,
    firstDate,
    lastDate,
    rainPrefix,
    rainEvents,
    options,
  };
}

/** The instant of a local wall-clock time, from the forecast's own hours when it has that hour. */
export function localInstantMs(fc: ForecastIndex, date: string, clock: string): number {
  return fc.instantByLocal.get(`${date}T${clock}`) ?? instantOf(date, clock, fc.timeZone).getTime();
}

/** First hour index whose stamp is > ms. */
export function hourIndexAfter(hours: readonly IndexedHour[], ms: number): number {
  let lo = 0;
  let hi = hours.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (hours[mid].ms > ms) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}

/** Rain falling in (fromMs, toMs], counting each stamp's hour by its end. */
export function rainInInterval(fc: Pick<ForecastIndex, 'hours' | 'rainPrefix'>, fromMs: number, toMs: number): number {
  const a = hourIndexAfter(fc.hours, fromMs);
  const b = hourIndexAfter(fc.hours, toMs);
  return fc.rainPrefix[b] - fc.rainPrefix[a];
}

/** True when the forecast reaches `toMs` (its last stamp is at or after it). */
export function coversUntil(fc: Pick<ForecastIndex, 'hours'>, toMs: number): boolean {
  return fc.hours.length > 0 && fc.hours[fc.hours.length - 1].ms >= toMs;
}

export function inHorizon(fc: ForecastIndex | null, date: string): boolean {
  return !!fc && fc.firstDate !== null && fc.lastDate !== null && date >= fc.firstDate && date <= fc.lastDate;
}

export function daysOfHorizon(fc: ForecastIndex | null, from: string, to: string): string[] {
  if (!fc || fc.firstDate === null || fc.lastDate === null) return [];
  const out: string[] = [];
  let d = from < fc.firstDate ? fc.firstDate : from;
  const end = to > fc.lastDate ? fc.lastDate : to;
  while (d <= end) {
    out.push(d);
    d = addDays(d, 1);
  }
  return out;
}
