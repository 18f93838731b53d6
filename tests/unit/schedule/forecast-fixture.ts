// Synthetic hourly forecasts for the schedule tests: an invented, steady season with rain, wind, cold or heat
// put exactly where a test needs it. Hours are real UTC instants stepped hour by hour, and local dates and
// hours come from the IANA zone through Intl (date-fns-tz), so DST days have 23 or 25 hours as they should.
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';
import type { Forecast, ForecastHour } from '@/lib/schedule/types';

const HOUR_MS = 3_600_000;

export interface LocalHour {
  date: string; // local YYYY-MM-DD
  hour: number; // local 0–23
  ms: number;
}

type Field<T> = T | ((h: LocalHour) => T);

export interface RainSpell {
  date: string; // local date the rain starts
  fromHour: number; // local hour it starts
  hours: number;
  totalMm: number;
}

export interface FixtureOptions {
  timeZone?: string;
  startDate: string; // first local day, from 00:00
  days?: number;
  airTempC?: Field<number>;
  relativeHumidityPct?: Field<number>;
  windKmh?: Field<number>;
  windGustKmh?: Field<number | null>;
  /** Default: 80 % in an hour with rain, 5 % otherwise. */
  rainProbabilityPct?: Field<number | null>;
  soilTempC?: Field<number | null>;
  rain?: RainSpell[];
  fetchedAt?: string;
}

/** A mild day: 12 °C at dawn to 24 °C mid-afternoon (invented). */
export function diurnal(minC: number, maxC: number): (h: LocalHour) => number {
  return ({ hour }) => minC + ((maxC - minC) * (1 - Math.cos((2 * Math.PI * ((hour - 5 + 24) % 24)) / 24))) / 2;
}

function value<T>(field: Field<T> | undefined, h: LocalHour, fallback: T): T {
  if (field === undefined) return fallback;
  return typeof field === 'function' ? (field as (h: LocalHour) => T)(h) : field;
}

export function localHours(timeZone: string, startDate: string, days: number): LocalHour[] {
  const start = fromZonedTime(`${startDate}T00:00:00`, timeZone).getTime();
  const endDate = new Date(Date.parse(`${startDate}T00:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);
  const end = fromZonedTime(`${endDate}T00:00:00`, timeZone).getTime();
  const out: LocalHour[] = [];
  for (let ms = start; ms < end; ms += HOUR_MS) {
    out.push({
      ms,
      date: formatInTimeZone(ms, timeZone, 'yyyy-MM-dd'),
      hour: Number(formatInTimeZone(ms, timeZone, 'H')),
    });
  }
  return out;
}

export function makeForecast(o: FixtureOptions): Forecast {
  const timeZone = o.timeZone ?? 'America/Chicago';
  const hours = localHours(timeZone, o.startDate, o.days ?? 16);
  const spells = (o.rain ?? []).map((r) => {
    const startMs = fromZonedTime(`${r.date}T${String(r.fromHour).padStart(2, '0')}:00:00`, timeZone).getTime();
    return { startMs, endMs: startMs + r.hours * HOUR_MS, perHourMm: r.totalMm / r.hours };
  });
  const out: ForecastHour[] = hours.map((h) => {
    // The stamp carries the rain of the hour that ends at it.
    let rainMm = 0;
    for (const s of spells) if (h.ms > s.startMs && h.ms <= s.endMs) rainMm += s.perHourMm;
    return {
      time: new Date(h.ms).toISOString(),
      rainMm,
      rainProbabilityPct: value(o.rainProbabilityPct, h, rainMm > 0 ? 80 : 5),
      airTempC: value(o.airTempC, h, diurnal(12, 24)(h)),
      relativeHumidityPct: value(o.relativeHumidityPct, h, 55),
      windKmh: value(o.windKmh, h, 12),
      ...(o.windGustKmh !== undefined ? { windGustKmh: value(o.windGustKmh, h, null) } : {}),
      soilTempC: value(o.soilTempC, h, 18),
    };
  });
  return { timeZone, fetchedAt: o.fetchedAt ?? new Date(hours[0].ms).toISOString(), hours: out };
}

/** Noon on a local date in a zone, as `now`. */
export function localNoon(date: string, timeZone = 'America/Chicago'): Date {
  return fromZonedTime(`${date}T12:00:00`, timeZone);
}
