// RFC 5545 §3.6.5 VTIMEZONE blocks from the runtime's own IANA time-zone data (ECMAScript Intl), the same
// data every other instant in Sowcast is computed with (date-fns-tz reads it too), so a feed can never
// disagree with the app about when 08:00 in a property's zone is.
//
// Each offset change in the covered years becomes its own STANDARD or DAYLIGHT observance with a single
// DTSTART onset (no RRULE): longer than a rule-based block, but exact for any zone and any year the
// runtime knows, including zones whose rules changed. Before the first onset the block starts with the
// offset in force on 1 January of the first year.

const MINUTE_MS = 60_000;
const DAY_MS = 86_400_000;

const partsFormats = new Map<string, Intl.DateTimeFormat>();
const nameFormats = new Map<string, Intl.DateTimeFormat>();

function partsFormat(timeZone: string) {
  let f = partsFormats.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', {
      timeZone,
      hourCycle: 'h23',
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      second: '2-digit',
    });
    partsFormats.set(timeZone, f);
  }
  return f;
}

function wallClock(ms: number, timeZone: string) {
  const parts = Object.fromEntries(partsFormat(timeZone).formatToParts(ms).map((p) => [p.type, p.value]));
  return { y: Number(parts.year), mo: Number(parts.month), d: Number(parts.day), h: Number(parts.hour), mi: Number(parts.minute), s: Number(parts.second) };
}

/** Minutes east of UTC in force at the instant `ms`. */
export function offsetMinutes(ms: number, timeZone: string): number {
  const w = wallClock(ms, timeZone);
  const asUtc = Date.UTC(w.y, w.mo - 1, w.d, w.h, w.mi, w.s);
  return Math.round((asUtc - Math.floor(ms / 1000) * 1000) / MINUTE_MS);
}

function shortName(ms: number, timeZone: string): string {
  let f = nameFormats.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-US', { timeZone, timeZoneName: 'short' });
    nameFormats.set(timeZone, f);
  }
  return f.formatToParts(ms).find((p) => p.type === 'timeZoneName')?.value ?? '';
}

const pad = (n: number, w = 2) => String(n).padStart(w, '0');

/** '-0500', '+0530' (RFC 5545 §3.3.14 UTC-OFFSET). */
function utcOffset(minutes: number): string {
  const sign = minutes < 0 ? '-' : '+';
  const m = Math.abs(minutes);
  return `${sign}${pad(Math.floor(m / 60))}${pad(m % 60)}`;
}

/** Local date-time text of an instant in a fixed offset (the onset is written in the offset before it). */
function localStamp(ms: number, offset: number): string {
  const t = new Date(ms + offset * MINUTE_MS);
  return `${pad(t.getUTCFullYear(), 4)}${pad(t.getUTCMonth() + 1)}${pad(t.getUTCDate())}T${pad(t.getUTCHours())}${pad(t.getUTCMinutes())}${pad(t.getUTCSeconds())}`;
}

export interface OffsetChange {
  /** The first instant of the new offset. */
  atMs: number;
  fromMinutes: number;
  toMinutes: number;
}

/** Every offset change of a zone between two instants, to the minute. */
export function offsetChanges(timeZone: string, fromMs: number, toMs: number): OffsetChange[] {
  const changes: OffsetChange[] = [];
  let t = fromMs;
  let before = offsetMinutes(t, timeZone);
  // Zones change at most a few times a year and never twice within a day, so a daily probe finds each one.
  while (t < toMs) {
    const next = Math.min(t + DAY_MS, toMs);
    const after = offsetMinutes(next, timeZone);
    if (after !== before) {
      let lo = t;
      let hi = next;
      while (hi - lo > MINUTE_MS) {
        const mid = lo + Math.floor((hi - lo) / 2 / MINUTE_MS) * MINUTE_MS;
        if (offsetMinutes(mid, timeZone) === before) lo = mid;
        else hi = mid;
      }
      changes.push({ atMs: hi, fromMinutes: before, toMinutes: after });
      before = after;
    }
    t = next;
  }
  return changes;
}

/** The VTIMEZONE block for `timeZone`, covering 1 January of `fromYear` to 31 December of `toYear`. */
export function vtimezone(timeZone: string, fromYear: number, toYear: number): string {
  const fromMs = Date.UTC(fromYear, 0, 1) - 14 * 3_600_000; // local 1 January anywhere on Earth
  const toMs = Date.UTC(toYear + 1, 0, 1);
  const changes = offsetChanges(timeZone, fromMs, toMs);
  // A year's smallest offset is its standard time; anything above it is daylight (RFC 5545 STANDARD/DAYLIGHT).
  const standardOf = (ms: number) => {
    const y = new Date(ms).getUTCFullYear();
    return Math.min(offsetMinutes(Date.UTC(y, 0, 1), timeZone), offsetMinutes(Date.UTC(y, 6, 1), timeZone));
  };
  const observance = (atMs: number, from: number, to: number) => {
    const kind = to > standardOf(atMs) ? 'DAYLIGHT' : 'STANDARD';
    const name = shortName(atMs, timeZone);
    return [
      `BEGIN:${kind}`,
      `DTSTART:${localStamp(atMs, from)}`,
      `TZOFFSETFROM:${utcOffset(from)}`,
      `TZOFFSETTO:${utcOffset(to)}`,
      ...(name ? [`TZNAME:${name}`] : []),
      `END:${kind}`,
    ];
  };
  const first = offsetMinutes(fromMs, timeZone);
  const lines = ['BEGIN:VTIMEZONE', `TZID:${timeZone}`, ...observance(fromMs, first, first)];
  for (const c of changes) lines.push(...observance(c.atMs, c.fromMinutes, c.toMinutes));
  lines.push('END:VTIMEZONE');
  return lines.join('\r\n');
}
