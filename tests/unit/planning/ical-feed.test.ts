// The feed builder alone, read back with ical.js (an independent RFC 5545 parser). Expected instants are worked
// by hand from each zone's legal time: Arizona keeps UTC−7 all year (it is exempt from US daylight time under
// 15 U.S.C. §260a); India keeps UTC+05:30 all year; New South Wales keeps UTC+10 and UTC+11 from the first
// Sunday of October to the first Sunday of April (Standard Time Act 1987 (NSW), from memory).
import ICAL from 'ical.js';
import { describe, expect, it } from 'vitest';
import type { CalendarStepRow } from '@/lib/data/calendar';
import { buildCalendarFeed, type FeedStepDetail } from '@/lib/planning/ical-feed';
import { offsetChanges } from '@/lib/planning/vtimezone';

const NOW = new Date('2027-01-05T12:00:00Z');

function row(id: string, timeZone: string, date: string, o: Partial<CalendarStepRow> = {}): CalendarStepRow {
  return {
    step_id: id, key: id, kind: 'spray', title: 'Spray', local_date: date, position: 1, status: 'planned', pinned: false, recurrence: null,
    assignee_id: null, assignee_name: null, planting_id: 'p', plot_id: 'plot', plot_name: 'Back forty', property_id: 'prop',
    property_name: 'Test ground', time_zone: timeZone, role: 'owner', ...o,
  };
}

const detail = (hours: FeedStepDetail['hours']): FeedStepDetail => ({ hours, quantities: [], cautions: [], reason: 'test', notes: null, doneOn: null, updatedAt: NOW });

function parse(text: string) {
  const calendar = new ICAL.Component(ICAL.parse(text));
  for (const tz of calendar.getAllSubcomponents('vtimezone')) ICAL.TimezoneService.register(tz);
  return new Map(calendar.getAllSubcomponents('vevent').map((v) => { const e = new ICAL.Event(v); return [e.uid, e]; }));
}

describe('timed steps in zones around the world', () => {
  const cases: [string, string, string, string][] = [
    // zone, local date, 09:00 local as UTC (worked by hand)
    ['America/Phoenix', '2027-07-01', '2027-07-01T16:00:00.000Z', 'UTC−7 in summer too'],
    ['Asia/Kolkata', '2027-07-01', '2027-07-01T03:30:00.000Z', 'UTC+05:30'],
    ['Australia/Sydney', '2027-01-20', '2027-01-19T22:00:00.000Z', 'UTC+11 in the southern summer'],
    ['Australia/Sydney', '2027-07-20', '2027-07-19T23:00:00.000Z', 'UTC+10 in the southern winter'],
  ];
  const rows = cases.map(([zone, date], i) => row(`s${i}`, zone, date));
  const details = new Map(rows.map((r) => [r.step_id, detail({ start: '09:00', end: '11:00' })]));
  const events = parse(buildCalendarFeed({ rows, details, now: NOW, baseUrl: 'https://sowcast.test', ownerName: 'Test' }));
  cases.forEach(([zone, date, utc, why], i) => {
    it(`${zone} ${date} 09:00 is ${utc} (${why})`, () => {
      const e = events.get(`s${i}@sowcast`)!;
      expect(e.startDate.zone.tzid).toBe(zone);
      expect(e.startDate.toJSDate().toISOString()).toBe(utc);
      expect(e.endDate.toJSDate().getTime() - e.startDate.toJSDate().getTime()).toBe(2 * 3_600_000);
    });
  });

  it('a window ending at midnight ends on the next day', () => {
    const r = row('late', 'America/Phoenix', '2027-07-01');
    const e = parse(buildCalendarFeed({ rows: [r], details: new Map([['late', detail({ start: '22:00', end: '00:00' })]]), now: NOW, baseUrl: 'x', ownerName: 'T' })).get('late@sowcast')!;
    expect(e.endDate.toString()).toBe('2027-07-02T00:00:00');
  });

  it('finds both US changes of a year to the minute (15 U.S.C. §260a: 2:00 local, second Sunday of March, first Sunday of November)', () => {
    const changes = offsetChanges('America/Chicago', Date.UTC(2027, 0, 1), Date.UTC(2028, 0, 1));
    // 14 March 2027 02:00 CST = 08:00 UTC; 7 November 2027 02:00 CDT = 07:00 UTC.
    expect(changes.map((c) => [new Date(c.atMs).toISOString(), c.fromMinutes, c.toMinutes])).toEqual([
      ['2027-03-14T08:00:00.000Z', -360, -300],
      ['2027-11-07T07:00:00.000Z', -300, -360],
    ]);
  });
});
