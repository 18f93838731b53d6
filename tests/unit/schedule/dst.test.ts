// Local dates across DST in the property's zone. Reference: the IANA tz database as shipped in Node's ICU,
// read through Intl (ECMA-402 timeZoneName 'shortOffset'). America/Chicago springs forward on Sunday
// 14 March 2027 (02:00 CST → 03:00 CDT) and falls back on Sunday 7 November 2027 (02:00 CDT → 01:00 CST).
import { describe, expect, it } from 'vitest';
import { RRule } from 'rrule';
import { indexForecast } from '@/lib/schedule/forecast-days';
import { localDateOf, offsetsForSortedInstants, zoneOffsetMs } from '@/lib/schedule/local-dates';
import { planPlanting } from '@/lib/schedule/plan';
import { expandRecurrence, recurrenceFrom } from '@/lib/schedule/rules/upkeep';
import { SPRAY_WINDOW_DEFAULTS, sprayDay } from '@/lib/schedule/rules/spray-window';
import { makeForecast } from './forecast-fixture';
import { planting, step, ZONE } from './plantings';

const OPTS = { measurableRainMm: 0.25, eventGapHours: 6, soakingRainMm: 6.35, soakingWindowHours: 72 };

function offsetAt(isoInstant: string): string {
  const parts = new Intl.DateTimeFormat('en-US', { timeZone: ZONE, timeZoneName: 'shortOffset' }).formatToParts(new Date(isoInstant));
  return parts.find((p) => p.type === 'timeZoneName')!.value;
}

describe('DST in the property zone', () => {
  it('the reference agrees on the transitions', () => {
    expect(offsetAt('2027-03-14T07:59:00Z')).toBe('GMT-6');
    expect(offsetAt('2027-03-14T08:00:00Z')).toBe('GMT-5');
    expect(offsetAt('2027-11-07T06:59:00Z')).toBe('GMT-5');
    expect(offsetAt('2027-11-07T07:00:00Z')).toBe('GMT-6');
  });

  it('finds the same UTC offset as Intl for every hour of 2027, singly and by bisection over runs', () => {
    const start = Date.parse('2027-01-01T00:00:00Z');
    const hours = Array.from({ length: 365 * 24 }, (_, i) => start + i * 3_600_000);
    const bisected = offsetsForSortedInstants(ZONE, hours);
    for (let i = 0; i < hours.length; i++) {
      const intl = offsetAt(new Date(hours[i]).toISOString()); // 'GMT-6' / 'GMT-5'
      const expected = Number(intl.slice(3)) * 3_600_000;
      expect(zoneOffsetMs(ZONE, hours[i])).toBe(expected);
      expect(bisected[i]).toBe(expected);
    }
  });

  it('gives 14 March 23 local hours and 7 November 25, with the right local clock', () => {
    const spring = indexForecast(makeForecast({ timeZone: ZONE, startDate: '2027-03-12', days: 5 }), ZONE, OPTS);
    const march14 = spring.byDate.get('2027-03-14')!;
    expect(march14.lastHour - march14.firstHour + 1).toBe(23);
    const clocks = spring.hours.slice(march14.firstHour, march14.firstHour + 4).map((h) => h.clock);
    expect(clocks).toEqual(['00:00', '01:00', '03:00', '04:00']);
    const fall = indexForecast(makeForecast({ timeZone: ZONE, startDate: '2027-11-05', days: 5 }), ZONE, OPTS);
    const nov7 = fall.byDate.get('2027-11-07')!;
    expect(nov7.lastHour - nov7.firstHour + 1).toBe(25);
    expect(fall.hours.slice(nov7.firstHour, nov7.firstHour + 4).map((h) => h.clock)).toEqual(['00:00', '01:00', '01:00', '02:00']);
    // Each hour's local date is the one Intl gives for its instant.
    for (const h of [...spring.hours, ...fall.hours]) {
      expect(h.date).toBe(new Intl.DateTimeFormat('en-CA', { timeZone: ZONE }).format(h.ms));
    }
  });

  it('reads `now` in the property zone on the night of the change', () => {
    expect(localDateOf(new Date('2027-03-14T05:30:00Z'), ZONE)).toBe('2027-03-13'); // 23:30 CST
    expect(localDateOf(new Date('2027-03-14T08:30:00Z'), ZONE)).toBe('2027-03-14'); // 03:30 CDT
    expect(localDateOf(new Date('2027-11-08T05:30:00Z'), ZONE)).toBe('2027-11-07'); // 23:30 CST
    const input = planting({ season: 'spring', targetSeedDate: '2027-03-20', method: 'frost-seeding', cover: 'existing-stand', lime: { tonsPerAcre: 1 } });
    const plan = planPlanting(input, null, new Date('2027-03-14T05:30:00Z'));
    expect(step(plan, 'soil-test').date).toBe('2027-03-13');
  });

  it('keeps a spray window in local hours on the 23-hour day', () => {
    // Calm (2 mph at 2 m) except local 12:00–16:00 CDT = 17:00–21:00 UTC, when it is 5 mph.
    const forecast = makeForecast({
      timeZone: ZONE,
      startDate: '2027-03-12',
      days: 5,
      airTempC: 18,
      windKmh: ({ date, hour }) => (date === '2027-03-14' && hour >= 12 && hour < 16 ? 12 : 4),
    });
    const fc = indexForecast(forecast, ZONE, OPTS);
    const day = sprayDay({ fc, latitudeDeg: 38.6, longitudeDeg: -90.2, product: null, params: SPRAY_WINDOW_DEFAULTS }, '2027-03-14');
    expect(day.hours).toEqual({ start: '12:00', end: '16:00' });
    expect(fc.hours[day.fromIndex!].ms).toBe(Date.parse('2027-03-14T17:00:00Z'));
  });

  it('keeps a recurring step at 08:00 local across both changes', () => {
    const weekly = recurrenceFrom({ freq: RRule.WEEKLY }, '2027-03-06', '08:00', ZONE);
    expect(weekly.recurrence.split('\n')[0]).toBe('DTSTART;TZID=America/Chicago:20270306T080000');
    const spring = expandRecurrence(weekly.recurrence, '2027-03-06', '2027-03-20');
    expect(spring.map((o) => [o.date, o.clock, o.startsAt])).toEqual([
      ['2027-03-06', '08:00', '2027-03-06T14:00:00.000Z'],
      ['2027-03-13', '08:00', '2027-03-13T14:00:00.000Z'],
      ['2027-03-20', '08:00', '2027-03-20T13:00:00.000Z'],
    ]);
    const fall = expandRecurrence(weekly.recurrence, '2027-10-30', '2027-11-13');
    expect(fall.map((o) => o.startsAt)).toEqual(['2027-10-30T13:00:00.000Z', '2027-11-06T13:00:00.000Z', '2027-11-13T14:00:00.000Z']);
    for (const o of [...spring, ...fall]) {
      expect(new Intl.DateTimeFormat('en-GB', { timeZone: ZONE, hour: '2-digit', minute: '2-digit' }).format(new Date(o.startsAt))).toBe('08:00');
    }
  });
});
