// Weather put in by hand through POST /_control/events, for tests and the demo: a rain event, a cold snap or
// a dry spell at a place and on local dates. An event holds for its whole 0.1° cell, like the invented season.
// Dates are local dates in the event's `timeZone` (an IANA name, default UTC), read through Intl.
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';
import { z } from 'zod';
import { cellOf, spreadTenths } from './season';

const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;

function isTimeZone(timeZone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone });
    return true;
  } catch {
    return false;
  }
}

function isDate(value: string): boolean {
  const ms = /^\d{4}-\d{2}-\d{2}$/.test(value) ? Date.parse(`${value}T00:00:00Z`) : NaN;
  return !Number.isNaN(ms) && new Date(ms).toISOString().slice(0, 10) === value;
}

export function addDays(date: string, days: number): string {
  return new Date(Date.parse(`${date}T00:00:00Z`) + days * DAY_MS).toISOString().slice(0, 10);
}

const place = {
  latitude: z.number().min(-90).max(90),
  longitude: z.number().min(-180).max(180),
  date: z.string().refine(isDate, 'must be a date (YYYY-MM-DD)'),
  timeZone: z.string().refine(isTimeZone, 'must be an IANA time zone such as America/Chicago').default('UTC'),
};

export const controlEventSchema = z.discriminatedUnion('kind', [
  z.object({
    kind: z.literal('rain'),
    ...place,
    totalMm: z.number().min(0).max(500),
    startHour: z.number().int().min(0).max(23).default(14),
    hours: z.number().int().min(1).max(24).default(4),
  }),
  z.object({ kind: z.literal('cold'), ...place, days: z.number().int().min(1).max(16).default(1), minC: z.number().min(-60).max(40) }),
  z.object({ kind: z.literal('dry'), ...place, days: z.number().int().min(1).max(16) }),
]);
export type ControlEventInput = z.input<typeof controlEventSchema>;
type ParsedEvent = z.output<typeof controlEventSchema>;

export type ControlEvent = ParsedEvent & {
  id: number;
  cell: string;
  /** The local dates it holds for. */
  dates: string[];
  /** Rain events: the first hour's start instant and tenths of a mm per hour. */
  rain?: { startMs: number; tenthsPerHour: number[] };
};

export class EventRejected extends Error {}

let nextId = 1;

export function makeEvent(input: unknown): ControlEvent {
  const parsed = controlEventSchema.safeParse(input);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new EventRejected(`${issue.path.join('.') || 'event'}: ${issue.message}`);
  }
  const e = parsed.data;
  const cell = cellOf(e.latitude, e.longitude).key;
  const days = e.kind === 'rain' ? 1 : e.days;
  const dates = Array.from({ length: days }, (_, i) => addDays(e.date, i));
  const event: ControlEvent = { ...e, id: nextId++, cell, dates };
  if (e.kind === 'rain') {
    // The rain starts at the local wall-clock hour (date-fns-tz resolves it; on a spring-forward day a missing
    // hour moves to the next one) and falls for `hours` real hours, all of them on the event's local date.
    const hh = String(e.startHour).padStart(2, '0');
    const startMs = fromZonedTime(`${e.date}T${hh}:00:00`, e.timeZone).getTime();
    const lastHourStart = startMs + (e.hours - 1) * HOUR_MS;
    if (formatInTimeZone(startMs, e.timeZone, 'yyyy-MM-dd') !== e.date || formatInTimeZone(lastHourStart, e.timeZone, 'yyyy-MM-dd') !== e.date) {
      throw new EventRejected(`hours: rain from ${hh}:00 for ${e.hours} h runs past midnight of ${e.date} in ${e.timeZone}; put the rest on the next date as another event.`);
    }
    event.rain = { startMs, tenthsPerHour: spreadTenths(Math.round(e.totalMm * 10), e.hours) };
  }
  return event;
}

/** Local dates of instants in a zone, cached per zone and hour (the answer asks for 384 + warm-up hours). */
export class LocalDates {
  private readonly cache = new Map<string, Map<number, string>>();

  of(ms: number, timeZone: string): string {
    let zone = this.cache.get(timeZone);
    if (!zone) {
      zone = new Map();
      this.cache.set(timeZone, zone);
    }
    let date = zone.get(ms);
    if (date === undefined) {
      date = formatInTimeZone(ms, timeZone, 'yyyy-MM-dd');
      zone.set(ms, date);
    }
    return date;
  }
}

export interface HourValues {
  stampMs: number;
  airTempC: number;
  dewPointC: number;
  rainTenths: number;
  rainProbabilityPct: number;
  /** Multiplies the relative humidity afterwards: below 1 for a dry spell, null for "as it comes". */
  humidityFloorPct: number | null;
  humidityFactor: number;
}

const COLD_RAMP_HOURS = 6;

/**
 * Puts the events of one cell onto a run of hours (sorted, hourly). Rain and dry spells decide the rain of
 * their local dates — for each date the most recently put event wins, and it replaces the invented rain of
 * that whole date. A cold snap shifts each of its dates down so that date's lowest temperature is `minC`,
 * easing in and out over 6 hours either side; it never warms a date already colder.
 */
export function applyEvents(hours: HourValues[], events: readonly ControlEvent[], dates: LocalDates): void {
  if (!events.length) return;
  const precipitation = events.filter((e) => e.kind === 'rain' || e.kind === 'dry');
  const cold = events.filter((e) => e.kind === 'cold');

  if (precipitation.length) {
    for (const h of hours) {
      // Rain is a sum over the hour ENDING at the stamp, so the hour belongs to the date it started on.
      const startOfHour = h.stampMs - HOUR_MS;
      let winner: ControlEvent | null = null;
      for (const e of precipitation) {
        if (e.dates.includes(dates.of(startOfHour, e.timeZone)) && (!winner || e.id > winner.id)) winner = e;
      }
      if (!winner) continue;
      if (winner.kind === 'dry') {
        h.rainTenths = 0;
        h.rainProbabilityPct = Math.min(h.rainProbabilityPct, 5);
        h.humidityFactor = 0.85;
        continue;
      }
      const rain = winner.rain!;
      const k = Math.round((startOfHour - rain.startMs) / HOUR_MS);
      if (k >= 0 && k < rain.tenthsPerHour.length) {
        h.rainTenths = rain.tenthsPerHour[k];
        h.rainProbabilityPct = Math.max(h.rainProbabilityPct, 85);
        h.humidityFloorPct = 93;
      } else {
        h.rainTenths = 0;
        h.rainProbabilityPct = Math.min(h.rainProbabilityPct, 30);
      }
    }
  }

  for (const e of cold) {
    const minC = (e as Extract<ControlEvent, { kind: 'cold' }>).minC;
    const onDate = hours.map((h) => dates.of(h.stampMs, e.timeZone));
    const shiftByDate = new Map<string, number>();
    for (const date of e.dates) {
      let lowest = Infinity;
      hours.forEach((h, i) => {
        if (onDate[i] === date) lowest = Math.min(lowest, h.airTempC);
      });
      if (lowest !== Infinity) shiftByDate.set(date, Math.max(0, lowest - minC));
    }
    const inside = hours.map((_, i) => shiftByDate.has(onDate[i]));
    const first = inside.indexOf(true);
    const last = inside.lastIndexOf(true);
    if (first === -1) continue;
    const shifts = hours.map((_, i) => {
      if (inside[i]) return shiftByDate.get(onDate[i]) as number;
      if (i < first && first - i <= COLD_RAMP_HOURS) return (shiftByDate.get(onDate[first]) as number) * (1 - (first - i) / (COLD_RAMP_HOURS + 1));
      if (i > last && i - last <= COLD_RAMP_HOURS) return (shiftByDate.get(onDate[last]) as number) * (1 - (i - last) / (COLD_RAMP_HOURS + 1));
      return 0;
    });
    hours.forEach((h, i) => {
      h.airTempC -= shifts[i];
      h.dewPointC -= shifts[i];
    });
  }
}
