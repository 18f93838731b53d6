// expandRecurrence keeps parsed rules and expanded ranges between calls (a large club's calendar asks for the
// same few hundred rules on every request). The answers must be what an uncached expansion gives: the
// reference for the dates is the rrule package's RFC 5545 reader (rrulestr, floating: the TZID dropped), and
// for the instants the IANA tz database as Node's ICU ships it, read through Intl.DateTimeFormat.
// America/Chicago springs forward on Sunday 14 March 2027 and falls back on Sunday 7 November 2027.
import { describe, expect, it } from 'vitest';
import { RRule, rrulestr } from 'rrule';
import { expandRecurrence, recurrenceFrom } from '@/lib/schedule/rules/upkeep';

const ZONE = 'America/Chicago';

/** Dates and clocks by rrule's own reader, for a DTSTART;TZID=…/RRULE text. */
function reference(recurrence: string, from: string, to: string): { date: string; clock: string }[] {
  const rule = rrulestr(recurrence.replace(/;TZID=[^:]+/, ''));
  return rule
    .between(new Date(`${from}T00:00:00Z`), new Date(`${to}T23:59:00Z`), true)
    .map((d) => ({ date: d.toISOString().slice(0, 10), clock: d.toISOString().slice(11, 16) }));
}

/** The wall clock and date an instant shows in a zone, by Intl. */
function wallClock(instant: string, timeZone: string): { date: string; clock: string } {
  const parts = Object.fromEntries(
    new Intl.DateTimeFormat('en-US', { timeZone, hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit' })
      .formatToParts(new Date(instant))
      .map((p) => [p.type, p.value]),
  );
  return { date: `${parts.year}-${parts.month}-${parts.day}`, clock: `${parts.hour}:${parts.minute}` };
}

const weekly = recurrenceFrom({ freq: RRule.WEEKLY }, '2027-03-06', '08:00', ZONE).recurrence;
const firstSaturday = recurrenceFrom({ freq: RRule.MONTHLY, bymonth: [5, 6, 7, 8], byweekday: [RRule.SA.nth(1)] }, '2027-05-01', '08:00', ZONE).recurrence;
const everyThreeYears = recurrenceFrom({ freq: RRule.YEARLY, interval: 3, bymonth: [3], bymonthday: [14] }, '2027-03-14', '08:00', ZONE).recurrence;

describe('expandRecurrence, cached', () => {
  it('gives rrule’s own dates and the 08:00 wall clock across both DST changes, first call and repeated', () => {
    const ranges: [string, string][] = [
      ['2027-03-06', '2027-03-20'], // spring forward on the 14th
      ['2027-10-30', '2027-11-13'], // fall back on the 7th
      ['2027-01-01', '2027-12-31'],
    ];
    for (const recurrence of [weekly, firstSaturday, everyThreeYears]) {
      for (const [from, to] of ranges) {
        const expected = reference(recurrence, from, to);
        for (let call = 0; call < 2; call++) {
          const got = expandRecurrence(recurrence, from, to);
          expect(got.map((o) => ({ date: o.date, clock: o.clock }))).toEqual(expected);
          for (const o of got) expect(wallClock(o.startsAt, ZONE)).toEqual({ date: o.date, clock: '08:00' });
        }
      }
    }
    // The UTC offsets on either side of the changes (CST −6, CDT −5), so the check above is not vacuous.
    expect(expandRecurrence(weekly, '2027-03-13', '2027-03-20').map((o) => o.startsAt)).toEqual(['2027-03-13T14:00:00.000Z', '2027-03-20T13:00:00.000Z']);
    expect(expandRecurrence(weekly, '2027-11-06', '2027-11-13').map((o) => o.startsAt)).toEqual(['2027-11-06T13:00:00.000Z', '2027-11-13T14:00:00.000Z']);
  });

  it('keeps each range apart and hands every caller an array of its own', () => {
    const march = expandRecurrence(weekly, '2027-03-01', '2027-03-31');
    const april = expandRecurrence(weekly, '2027-04-01', '2027-04-30');
    expect(march.map((o) => o.date)).toEqual(reference(weekly, '2027-03-01', '2027-03-31').map((o) => o.date));
    expect(april.map((o) => o.date)).toEqual(reference(weekly, '2027-04-01', '2027-04-30').map((o) => o.date));
    march.length = 0;
    expect(expandRecurrence(weekly, '2027-03-01', '2027-03-31')).toHaveLength(4);
    // The same rule in another zone is another rule: same local dates, other instants.
    const denver = weekly.replace(`TZID=${ZONE}`, 'TZID=America/Denver');
    const there = expandRecurrence(denver, '2027-03-01', '2027-03-31');
    expect(there.map((o) => o.date)).toEqual(reference(weekly, '2027-03-01', '2027-03-31').map((o) => o.date));
    for (const o of there) expect(wallClock(o.startsAt, 'America/Denver')).toEqual({ date: o.date, clock: '08:00' });
    expect(there[0].startsAt).not.toBe(expandRecurrence(weekly, '2027-03-01', '2027-03-31')[0].startsAt);
  });

  it('puts the instant in JSON like any other field', () => {
    const [first] = expandRecurrence(weekly, '2027-03-13', '2027-03-13');
    expect(JSON.parse(JSON.stringify(first))).toEqual({ date: '2027-03-13', clock: '08:00', startsAt: '2027-03-13T14:00:00.000Z' });
  });

  it('stays right past the cache’s size: 6,000 distinct rules, each against rrule', () => {
    const rules = Array.from({ length: 6_000 }, (_, i) => {
      const day = String(1 + (i % 28)).padStart(2, '0');
      const month = String(1 + (Math.floor(i / 28) % 12)).padStart(2, '0');
      const year = 2027 + Math.floor(i / 336);
      return `DTSTART;TZID=${ZONE}:${year}${month}${day}T0${6 + (i % 4)}0000\nRRULE:FREQ=MONTHLY;INTERVAL=${1 + (i % 3)}`;
    });
    for (const recurrence of rules) expandRecurrence(recurrence, '2040-01-01', '2040-12-31');
    for (const recurrence of [rules[0], rules[2_999], rules[5_999]]) {
      expect(expandRecurrence(recurrence, '2040-01-01', '2040-12-31').map((o) => ({ date: o.date, clock: o.clock }))).toEqual(reference(recurrence, '2040-01-01', '2040-12-31'));
    }
  });

  it('refuses a text without DTSTART;TZID or RRULE, every time', () => {
    for (let call = 0; call < 2; call++) {
      expect(() => expandRecurrence('RRULE:FREQ=WEEKLY', '2027-01-01', '2027-12-31')).toThrow(/DTSTART;TZID/);
    }
  });
});
