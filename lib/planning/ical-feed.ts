// A person's steps as an RFC 5545 iCalendar feed (written by ical-generator), for phone calendars to subscribe to.
// The same steps the season calendar shows (lib/data/calendar.ts selects them), in each property's own dates:
// - a step without hours is an all-day event, DTSTART;VALUE=DATE on its local date (RFC 5545 §3.6.1: a DATE
//   event takes the whole day wherever the reader is, which is what a local date means);
// - a step with hours (a spray window) is timed, DTSTART;TZID=<the property's zone> with that zone's VTIMEZONE
//   in the feed, so the 09:00 is 09:00 on the ground whatever zone the phone is in;
// - recurring upkeep keeps its RRULE, its DTSTART on the first occurrence at the step's local start time.
// VEVENT has no "completed" status (RFC 5545 §3.8.1.11 allows TENTATIVE, CONFIRMED, CANCELLED; COMPLETED is for
// VTODO), and subscribed calendars do not show VTODOs on most phones, so a done step stays an event and its
// SUMMARY starts with "✓ Done:"; a skipped one is CANCELLED and says "Skipped:".
import { TZDate } from '@date-fns/tz';
import ical, { ICalCalendarMethod, ICalEventStatus } from 'ical-generator';
import type { CalendarStepRow } from '@/lib/data/calendar';
import { cautionsFor } from '@/lib/schedule/cautions';
import { addDays, dayWithMonth } from '@/lib/schedule/local-dates';
import type { Caution, Quantity } from '@/lib/schedule/types';
import { vtimezone } from './vtimezone';

export interface FeedStepDetail {
  hours: { start: string; end: string } | null;
  quantities: Quantity[];
  cautions: Caution[];
  reason: string;
  notes: string | null;
  doneOn: string | null;
  updatedAt: Date;
}

export interface FeedInput {
  rows: CalendarStepRow[];
  details: Map<string, FeedStepDetail>;
  now: Date;
  baseUrl: string;
  ownerName: string;
}

/** How far ahead the VTIMEZONE blocks reach: recurring upkeep runs on for years. */
export const VTIMEZONE_YEARS_AHEAD = 10;

// SEQUENCE must grow with each revision (RFC 5545 §3.8.7.4): seconds since 2020 of the step's last change.
const SEQUENCE_EPOCH_MS = Date.UTC(2020, 0, 1);
const sequenceOf = (updatedAt: Date) => Math.max(0, Math.floor((updatedAt.getTime() - SEQUENCE_EPOCH_MS) / 1000));

const parseDate = (date: string) => date.split('-').map(Number) as [number, number, number];
const parseClock = (clock: string) => clock.split(':').map(Number) as [number, number];

/** A wall-clock time in a zone, as the TZDate ical-generator writes with TZID (its documented date-fns path). */
function wallTime(date: string, clock: string, timeZone: string): TZDate {
  const [y, mo, d] = parseDate(date);
  const [h, mi] = parseClock(clock);
  return new TZDate(y, mo - 1, d, h, mi, 0, timeZone);
}

/** Midnight UTC of a local date: ical-generator writes a DATE from the UTC fields when no zone is set. */
const dayValue = (date: string) => {
  const [y, mo, d] = parseDate(date);
  return new Date(Date.UTC(y, mo - 1, d));
};

function parseRecurrence(recurrence: string): { timeZone: string; date: string; clock: string; rrule: string } | null {
  const start = /DTSTART;TZID=([^:\s]+):(\d{4})(\d{2})(\d{2})T(\d{2})(\d{2})\d{2}/.exec(recurrence);
  const rrule = recurrence.split(/\r?\n/).find((line) => line.startsWith('RRULE:'));
  if (!start || !rrule) return null;
  const [, timeZone, y, mo, d, hh, mm] = start;
  return { timeZone, date: `${y}-${mo}-${d}`, clock: `${hh}:${mm}`, rrule };
}

function description(row: CalendarStepRow, detail: FeedStepDetail | undefined, link: string): string {
  const lines = [`${row.property_name} · ${row.plot_name}`];
  if (detail?.hours) lines.push(`Best hours: ${detail.hours.start}–${detail.hours.end} (${row.time_zone})`);
  if (row.status === 'done') lines.push(`Done${detail?.doneOn ? ` on ${dayWithMonth(detail.doneOn)}` : ''}.`);
  if (row.assignee_name) lines.push(`Assigned to ${row.assignee_name}.`);
  if (detail?.reason) lines.push('', `Why this date: ${detail.reason}`);
  const carry = detail?.quantities ?? [];
  if (carry.length) lines.push('', 'What to carry:', ...carry.map((q) => `• ${q.detail}`));
  // The stored cautions are the plan's own; a step saved without them still gets its kind's cautions.
  const cautions = detail?.cautions.length ? detail.cautions : cautionsFor(row.kind);
  if (cautions.length) lines.push('', 'Cautions:', ...cautions.map((c) => `• ${c.text}`));
  if (detail?.notes) lines.push('', `Notes: ${detail.notes}`);
  lines.push('', `Open in Sowcast: ${link}`);
  return lines.join('\n');
}

function summary(row: CalendarStepRow): string {
  const text = `${row.plot_name} — ${row.title}`;
  if (row.status === 'done') return `✓ Done: ${text}`;
  if (row.status === 'skipped') return `Skipped: ${text}`;
  return text;
}

/** The feed's iCalendar text. */
export function buildCalendarFeed(input: FeedInput): string {
  const { rows, details, now, baseUrl } = input;
  const years = rows.map((r) => Number(r.local_date.slice(0, 4)));
  const fromYear = Math.min(now.getUTCFullYear() - 1, ...years);
  const toYear = now.getUTCFullYear() + VTIMEZONE_YEARS_AHEAD;
  const calendar = ical({
    name: `Sowcast — ${input.ownerName}`,
    description: 'Food plot steps from Sowcast, in each property’s local time.',
    prodId: { company: 'Sowcast', product: 'Steps feed', language: 'EN' },
    method: ICalCalendarMethod.PUBLISH,
    // Phones refresh subscribed calendars on their own schedule; this asks for about every six hours.
    ttl: 6 * 3600,
  });
  // name: null keeps DTSTAMP and LAST-MODIFIED in UTC (ical-generator writes them in the calendar's zone when
  // it has one); the generator still writes a VTIMEZONE for every zone an event uses.
  calendar.timezone({ name: null, generator: (zone) => vtimezone(zone, fromYear, toYear) });

  for (const row of rows) {
    const detail = details.get(row.step_id);
    const link = `${baseUrl}/steps/${row.step_id}`;
    const updatedAt = detail?.updatedAt ?? now;
    const common = {
      id: `${row.step_id}@sowcast`,
      sequence: sequenceOf(updatedAt),
      stamp: now,
      lastModified: updatedAt,
      summary: summary(row),
      description: description(row, detail, link),
      location: `${row.property_name}, ${row.plot_name}`,
      url: link,
      status: row.status === 'skipped' ? ICalEventStatus.CANCELLED : ICalEventStatus.CONFIRMED,
    };
    const recurrence = row.recurrence ? parseRecurrence(row.recurrence) : null;
    if (recurrence) {
      calendar.createEvent({
        ...common,
        start: wallTime(recurrence.date, recurrence.clock, recurrence.timeZone),
        timezone: recurrence.timeZone,
        repeating: recurrence.rrule,
      });
      continue;
    }
    if (detail?.hours) {
      const { start, end } = detail.hours;
      // A window that ends at or before it starts runs past midnight ('22:00'–'00:00').
      const endDate = end <= start ? addDays(row.local_date, 1) : row.local_date;
      calendar.createEvent({
        ...common,
        start: wallTime(row.local_date, start, row.time_zone),
        end: wallTime(endDate, end, row.time_zone),
        timezone: row.time_zone,
      });
      continue;
    }
    calendar.createEvent({ ...common, allDay: true, start: dayValue(row.local_date), end: dayValue(addDays(row.local_date, 1)) });
  }
  return calendar.toString();
}
