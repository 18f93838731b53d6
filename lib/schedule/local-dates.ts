// Local calendar dates ('YYYY-MM-DD') and their link to instants in a property's IANA zone.
// Calendar arithmetic is done on the civil date alone (a day is a day, whatever DST does to its length);
// instants go through date-fns-tz, which reads the IANA database shipped in the runtime's Intl.
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';

const DAY_MS = 86_400_000;
const DATE_RE = /^(\d{4})-(\d{2})-(\d{2})$/;

export function isLocalDate(value: unknown): value is string {
  if (typeof value !== 'string') return false;
  const m = DATE_RE.exec(value);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  const t = new Date(Date.UTC(y, mo - 1, d));
  return t.getUTCFullYear() === y && t.getUTCMonth() === mo - 1 && t.getUTCDate() === d;
}

// Plans keep asking about the same few hundred dates; parsing each once is enough.
const dayNumbers = new Map<string, number>();

/** Days since 1970-01-01 of a civil date. */
export function dayNumber(date: string): number {
  const known = dayNumbers.get(date);
  if (known !== undefined) return known;
  const m = DATE_RE.exec(date);
  if (!m) throw new Error(`Not a date (YYYY-MM-DD): ${JSON.stringify(date)}`);
  const n = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) / DAY_MS;
  if (dayNumbers.size > 20_000) dayNumbers.clear();
  dayNumbers.set(date, n);
  return n;
}

const pad2 = (n: number) => (n < 10 ? `0${n}` : `${n}`);

/** Civil date of a day number (H. Hinnant's days-to-civil algorithm; proleptic Gregorian). */
export function fromDayNumber(n: number): string {
  const z = n + 719_468;
  const era = Math.floor(z / 146_097);
  const doe = z - era * 146_097;
  const yoe = Math.floor((doe - Math.floor(doe / 1460) + Math.floor(doe / 36_524) - Math.floor(doe / 146_096)) / 365);
  const doy = doe - (365 * yoe + Math.floor(yoe / 4) - Math.floor(yoe / 100));
  const mp = Math.floor((5 * doy + 2) / 153);
  const d = doy - Math.floor((153 * mp + 2) / 5) + 1;
  const m = mp < 10 ? mp + 3 : mp - 9;
  const y = yoe + era * 400 + (m <= 2 ? 1 : 0);
  return `${String(y).padStart(4, '0')}-${pad2(m)}-${pad2(d)}`;
}

export function addDays(date: string, days: number): string {
  return fromDayNumber(dayNumber(date) + days);
}

/** b − a in days. */
export function daysBetween(a: string, b: string): number {
  return dayNumber(b) - dayNumber(a);
}

export function maxDate(...dates: (string | null | undefined)[]): string {
  let best: string | null = null;
  for (const d of dates) if (d && (best === null || d > best)) best = d;
  if (best === null) throw new Error('maxDate needs at least one date');
  return best;
}

export function clampDate(date: string, earliest: string, latest: string): string {
  if (date < earliest) return earliest;
  if (date > latest) return latest;
  return date;
}

/** Day of the year, 1 = 1 January (FAO-56's J). */
export function dayOfYear(date: string): number {
  return dayNumber(date) - dayNumber(`${date.slice(0, 4)}-01-01`) + 1;
}

export function isLeapYear(year: number): boolean {
  return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
}

/** 'MM-DD' in a given year; 29 February falls back to the 28th outside leap years. */
export function monthDayInYear(monthDay: string, year: number): string {
  const m = /^(\d{2})-(\d{2})$/.exec(monthDay);
  if (!m) throw new Error(`Not a month-day (MM-DD): ${JSON.stringify(monthDay)}`);
  const candidate = `${String(year).padStart(4, '0')}-${m[1]}-${m[2]}`;
  if (isLocalDate(candidate)) return candidate;
  if (m[1] === '02' && m[2] === '29') return `${String(year).padStart(4, '0')}-02-28`;
  throw new Error(`Not a month-day (MM-DD): ${JSON.stringify(monthDay)}`);
}

export function isMonthDay(value: unknown): value is string {
  if (typeof value !== 'string' || !/^\d{2}-\d{2}$/.test(value)) return false;
  return isLocalDate(`2024-${value}`); // 2024 is a leap year, so 02-29 is accepted
}

const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'];
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

export function weekdayIndex(date: string): number {
  return new Date(dayNumber(date) * DAY_MS).getUTCDay();
}

/** 'Tue 14' */
export function shortDay(date: string): string {
  return `${WEEKDAYS[weekdayIndex(date)]} ${Number(date.slice(8, 10))}`;
}

/** 'Tue 14 Sep' */
export function dayWithMonth(date: string): string {
  return `${shortDay(date)} ${MONTHS[Number(date.slice(5, 7)) - 1]}`;
}

/** Two dates as a person says them: 'Tue 14' and 'Sun 12' in one month, with the month otherwise. */
export function dayPair(a: string, b: string): [string, string] {
  return a.slice(0, 7) === b.slice(0, 7) ? [shortDay(a), shortDay(b)] : [dayWithMonth(a), dayWithMonth(b)];
}

const knownZones = new Set<string>();

export function isKnownTimeZone(timeZone: string): boolean {
  if (knownZones.has(timeZone)) return true;
  try {
    new Intl.DateTimeFormat('en-US', { timeZone });
    knownZones.add(timeZone);
    return true;
  } catch {
    return false;
  }
}

/** The local date of an instant in a zone. */
export function localDateOf(instant: Date | number, timeZone: string): string {
  return formatInTimeZone(instant, timeZone, 'yyyy-MM-dd');
}

const offsetFormats = new Map<string, Intl.DateTimeFormat>();

/**
 * The zone's offset from UTC at an instant, in milliseconds (east positive): the wall clock Intl shows for
 * the instant, read as if it were UTC, minus the instant. (date-fns-tz's getTimezoneOffset reads its Date
 * argument as a wall-clock time in the system zone, which is not what an instant needs.)
 */
export function zoneOffsetMs(timeZone: string, instantMs: number): number {
  let format = offsetFormats.get(timeZone);
  if (!format) {
    try {
      format = new Intl.DateTimeFormat('en-US', {
        timeZone,
        hourCycle: 'h23',
        year: 'numeric',
        month: 'numeric',
        day: 'numeric',
        hour: 'numeric',
        minute: 'numeric',
        second: 'numeric',
      });
    } catch {
      throw new RangeError(`Unknown time zone: ${timeZone}`);
    }
    offsetFormats.set(timeZone, format);
  }
  const f: Record<string, number> = {};
  for (const part of format.formatToParts(instantMs)) if (part.type !== 'literal') f[part.type] = Number(part.value);
  const wallAsUtc = Date.UTC(f.year, f.month - 1, f.day, f.hour, f.minute, f.second);
  const wholeSecond = instantMs - (((instantMs % 1000) + 1000) % 1000);
  return wallAsUtc - wholeSecond;
}

/** The instant a local wall-clock time names in a zone ('2027-03-14', '08:00'). */
export function instantOf(date: string, time: string, timeZone: string): Date {
  return fromZonedTime(`${date}T${time}:00`, timeZone);
}

/** Local 'HH:mm' of an instant. */
export function localClock(instantMs: number, timeZone: string): string {
  return formatInTimeZone(instantMs, timeZone, 'HH:mm');
}

/**
 * Zone offsets for a sorted run of instants, found by bisection: an offset changes only at a zone
 * transition, so a 16-day hourly forecast needs a handful of lookups, not 384. Runs longer than a week
 * are split, so two transitions never hide between two equal end points.
 */
export function offsetsForSortedInstants(timeZone: string, instantsMs: readonly number[]): number[] {
  const out = new Array<number>(instantsMs.length);
  const WEEK_MS = 7 * DAY_MS;
  const fill = (lo: number, hi: number, offLo: number, offHi: number) => {
    if (offLo === offHi && instantsMs[hi] - instantsMs[lo] <= WEEK_MS) {
      for (let i = lo; i <= hi; i++) out[i] = offLo;
      return;
    }
    if (hi - lo <= 1) {
      out[lo] = offLo;
      out[hi] = offHi;
      return;
    }
    const mid = (lo + hi) >> 1;
    const offMid = zoneOffsetMs(timeZone, instantsMs[mid]);
    fill(lo, mid, offLo, offMid);
    fill(mid, hi, offMid, offHi);
  };
  if (instantsMs.length === 0) return out;
  const last = instantsMs.length - 1;
  fill(0, last, zoneOffsetMs(timeZone, instantsMs[0]), zoneOffsetMs(timeZone, instantsMs[last]));
  return out;
}
