// Daily seed-zone soil temperature. Local days are checked against the IANA time zone database as shipped in
// Node's ICU, read independently through Intl.DateTimeFormat; the estimate against the Biome-BGC 4.x weighting
// (11-day running mean of daily mean air temperature, weights 1…11, after Zheng, Hunt & Running 1993).
import { formatInTimeZone, fromZonedTime } from 'date-fns-tz';
import { describe, expect, it } from 'vitest';
import { dailySoilTemperatures, estimateSoilTempC, localDatesOfSortedInstants, type HourlyTemp } from '@/lib/agronomy/soil-temperature';

/** Local calendar date of an instant, straight from Intl (not from the code under test). */
function intlLocalDate(timeZone: string, instantMs: number): string {
  return new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(
    new Date(instantMs),
  );
}

function hourly(startIso: string, count: number, make: (instantMs: number, index: number) => Omit<HourlyTemp, 'time'>): HourlyTemp[] {
  const start = Date.parse(startIso);
  return Array.from({ length: count }, (_, i) => {
    const instantMs = start + i * 3_600_000;
    return { time: new Date(instantMs).toISOString(), ...make(instantMs, i) };
  });
}

describe('forecast soil temperature', () => {
  it('uses the forecast’s soil temperature when the day’s hours carry it', () => {
    const hours = hourly('2027-09-10T05:00:00Z', 24, (_, i) => ({ airTempC: 20 + (i % 6), soilTempC: 14 + (i % 2) }));
    const [day] = dailySoilTemperatures(hours, 'America/Chicago');
    expect(day).toMatchObject({ date: '2027-09-10', source: 'forecast', hourCount: 24 });
    expect(day.soilTempC).toBeCloseTo(14.5, 12);
  });

  it('falls back to the estimate when most hours lack soil temperature', () => {
    const hours = hourly('2027-09-10T05:00:00Z', 24, (_, i) => ({ airTempC: 18, soilTempC: i < 6 ? 30 : null }));
    const [day] = dailySoilTemperatures(hours, 'America/Chicago');
    expect(day.source).toBe('estimated');
    expect(day.soilTempC).toBeCloseTo(18, 12);
  });
});

describe('estimate from air temperature', () => {
  it('weights the last 11 days 1…11 (Biome-BGC 4.x running weighted mean)', () => {
    // (1·0 + 2·0 + … + 10·0 + 11·66) / 66 = 11
    expect(estimateSoilTempC([...Array(10).fill(0), 66])).toBeCloseTo(11, 12);
    // Fewer days known: the same weighting over what there is, (1·10 + 2·20) / 3.
    expect(estimateSoilTempC([10, 20])).toBeCloseTo(50 / 3, 12);
    // Only the last 11 days count.
    expect(estimateSoilTempC([1000, ...Array(11).fill(5)])).toBeCloseTo(5, 12);
    expect(() => estimateSoilTempC([])).toThrow(RangeError);
  });

  it('a step in air temperature shows up gradually: lagged, damped, complete after 11 days', () => {
    // 11 days at 10 °C, then 14 days at 20 °C, hourly in UTC, no soil forecast.
    const hours = hourly('2027-04-01T00:00:00Z', 25 * 24, (_, i) => ({ airTempC: i < 11 * 24 ? 10 : 20 }));
    const days = dailySoilTemperatures(hours, 'UTC');
    expect(days).toHaveLength(25);
    expect(days.every((d) => d.source === 'estimated')).toBe(true);
    const soil = days.map((d) => d.soilTempC);
    expect(soil.slice(0, 11).every((t) => Math.abs(t - 10) < 1e-12)).toBe(true);
    // First warm day: (10 × (1+…+10) + 20 × 11) / 66 = 770 / 66 = 11.67 °C, far below the 20 °C air.
    expect(soil[11]).toBeCloseTo(770 / 66, 12);
    // Second warm day: weights 10 and 11 at 20 °C → (10 × 45 + 20 × 21) / 66.
    expect(soil[12]).toBeCloseTo((10 * 45 + 20 * 21) / 66, 12);
    for (let i = 12; i < 21; i++) {
      expect(soil[i]).toBeGreaterThan(soil[i - 1]);
      expect(soil[i]).toBeLessThan(20);
    }
    expect(soil[21]).toBeCloseTo(20, 12); // 11 days after the step
  });

  it('damps a daily swing: a hot day after cold ones moves the estimate by 11/66 of the jump', () => {
    const hours = hourly('2027-04-01T00:00:00Z', 11 * 24, (_, i) => ({ airTempC: i >= 10 * 24 ? 30 : 0 }));
    const days = dailySoilTemperatures(hours, 'UTC');
    expect(days.at(-1)!.airTempC).toBe(30);
    expect(days.at(-1)!.soilTempC).toBeCloseTo(30 * (11 / 66), 12);
  });
});

describe('local days in the property’s zone (IANA database via Intl)', () => {
  it('groups by local date across the spring DST change (America/Chicago, 2027-03-14 has 23 hours)', () => {
    const zone = 'America/Chicago';
    const valueOf: Record<string, number> = { '2027-03-13': 10, '2027-03-14': 20, '2027-03-15': 30 };
    // From local midnight 13 March (CST, 06:00Z) to local midnight 16 March (CDT, 05:00Z): 24 + 23 + 24 hours.
    const hours = hourly('2027-03-13T06:00:00Z', 71, (ms) => {
      const value = valueOf[intlLocalDate(zone, ms)];
      return { airTempC: value, soilTempC: value };
    });
    // Independent check of the database: the offset really changes that day.
    const offset = (iso: string) =>
      new Intl.DateTimeFormat('en-US', { timeZone: zone, timeZoneName: 'shortOffset' })
        .formatToParts(new Date(iso))
        .find((p) => p.type === 'timeZoneName')!.value;
    expect(offset('2027-03-14T07:00:00Z')).toBe('GMT-6');
    expect(offset('2027-03-14T09:00:00Z')).toBe('GMT-5');

    const days = dailySoilTemperatures(hours, zone);
    expect(days.map((d) => [d.date, d.hourCount, d.soilTempC, d.source])).toEqual([
      ['2027-03-13', 24, 10, 'forecast'],
      ['2027-03-14', 23, 20, 'forecast'],
      ['2027-03-15', 24, 30, 'forecast'],
    ]);
  });

  it('groups the autumn change too (America/Chicago, 2027-11-07 has 25 hours)', () => {
    const zone = 'America/Chicago';
    const hours = hourly('2027-11-07T05:00:00Z', 25, () => ({ airTempC: 8, soilTempC: 9 }));
    expect(hours.every((h) => intlLocalDate(zone, Date.parse(h.time)) === '2027-11-07')).toBe(true);
    const days = dailySoilTemperatures(hours, zone);
    expect(days).toHaveLength(1);
    expect(days[0]).toMatchObject({ date: '2027-11-07', hourCount: 25 });
  });

  it('the same instants fall on different local dates in different zones', () => {
    const hours = hourly('2027-06-01T00:00:00Z', 48, (ms) => ({ airTempC: 15, soilTempC: 16 }));
    for (const zone of ['America/Chicago', 'Australia/Adelaide', 'Asia/Kolkata']) {
      const dates = dailySoilTemperatures(hours, zone).map((d) => d.date);
      const expected = [...new Set(hours.map((h) => intlLocalDate(zone, Date.parse(h.time))))];
      expect(dates, zone).toEqual(expected);
    }
  });

  it('sorts unsorted input and refuses unknown zones or bad times', () => {
    const hours = hourly('2027-06-01T00:00:00Z', 48, (_, i) => ({ airTempC: i < 24 ? 10 : 20 }));
    const forward = dailySoilTemperatures(hours, 'UTC');
    expect(dailySoilTemperatures([...hours].reverse(), 'UTC')).toEqual(forward);
    expect(() => dailySoilTemperatures(hours, 'America/Springfield')).toThrow(/Unknown time zone/);
    expect(() => dailySoilTemperatures([{ time: 'tomorrow', airTempC: 10 }], 'UTC')).toThrow(/not an ISO date-time/);
    expect(() => dailySoilTemperatures([{ time: '2027-06-01T00:00:00Z', airTempC: Number.NaN }], 'UTC')).toThrow(RangeError);
    expect(dailySoilTemperatures([], 'UTC')).toEqual([]);
  });
});

// The local date of each hour is found from the zone's offsets, looked up at a few instants per forecast; the
// reference here is date-fns-tz's formatInTimeZone (reference npm library, over the same ICU database),
// applied to every instant on its own. Transitions in 2027 per the IANA database (as the reference reads it):
// America/Chicago 14 Mar (02:00 CST → 03:00 CDT) and 7 Nov (02:00 CDT → 01:00 CST); Australia/Sydney
// 4 Apr (03:00 AEDT → 02:00 AEST) and 3 Oct (02:00 AEST → 03:00 AEDT), the southern seasons the other way
// round; Asia/Kolkata none, at UTC+05:30, so its local midnight falls at 18:30 UTC, between hourly stamps.
describe('local dates from zone offsets agree with date-fns-tz over a DST year', () => {
  const ZONES = ['America/Chicago', 'Asia/Kolkata', 'Australia/Sydney'];
  const HALF_HOUR_MS = 30 * 60_000;
  const GRID_START = Date.parse('2026-12-31T00:00:00Z');
  const GRID_END = Date.parse('2028-01-20T00:00:00Z');
  // The reference, once per instant of a half-hour grid over the year (half hours reach Kolkata's midnights).
  const referenceGrid = new Map<string, Map<number, string>>();
  const reference = (zone: string, ms: number) => {
    let grid = referenceGrid.get(zone);
    if (!grid) {
      grid = new Map();
      for (let t = GRID_START; t <= GRID_END; t += HALF_HOUR_MS) grid.set(t, formatInTimeZone(t, zone, 'yyyy-MM-dd'));
      referenceGrid.set(zone, grid);
    }
    return grid.get(ms) ?? formatInTimeZone(ms, zone, 'yyyy-MM-dd');
  };

  it('the reference sees the transitions the comment names', () => {
    const offset = (zone: string, iso: string) => formatInTimeZone(Date.parse(iso), zone, 'XXX');
    expect([offset('America/Chicago', '2027-03-14T07:59:00Z'), offset('America/Chicago', '2027-03-14T08:00:00Z')]).toEqual(['-06:00', '-05:00']);
    expect([offset('America/Chicago', '2027-11-07T06:59:00Z'), offset('America/Chicago', '2027-11-07T07:00:00Z')]).toEqual(['-05:00', '-06:00']);
    expect([offset('Australia/Sydney', '2027-04-03T15:59:00Z'), offset('Australia/Sydney', '2027-04-03T16:00:00Z')]).toEqual(['+11:00', '+10:00']);
    expect([offset('Australia/Sydney', '2027-10-02T15:59:00Z'), offset('Australia/Sydney', '2027-10-02T16:00:00Z')]).toEqual(['+10:00', '+11:00']);
    expect(offset('Asia/Kolkata', '2027-06-01T00:00:00Z')).toBe('+05:30');
  });

  it('every half hour of 2027, and the millisecond either side of each local midnight', () => {
    for (const zone of ZONES) {
      const instants: number[] = [];
      for (let ms = GRID_START; ms <= GRID_END; ms += HALF_HOUR_MS) instants.push(ms);
      for (let day = Date.parse('2027-01-01T00:00:00Z'); day < Date.parse('2028-01-01T00:00:00Z'); day += 86_400_000) {
        const midnight = fromZonedTime(`${new Date(day).toISOString().slice(0, 10)}T00:00:00`, zone).getTime();
        instants.push(midnight - 1, midnight);
      }
      instants.sort((a, b) => a - b);
      const got = localDatesOfSortedInstants(zone, instants);
      const wrong = instants.filter((ms, i) => got[i] !== reference(zone, ms)).map((ms) => new Date(ms).toISOString());
      expect(wrong, zone).toEqual([]);
    }
  });

  it('daily soil temperatures group a year of hours into the same days, with the same hour counts', () => {
    for (const zone of ZONES) {
      const hours = hourly('2026-12-31T12:00:00Z', 366 * 24, (_, i) => ({ airTempC: 10 + (i % 7), soilTempC: i % 5 === 0 ? null : 12 }));
      const counts = new Map<string, number>();
      for (const h of hours) {
        const date = reference(zone, Date.parse(h.time));
        counts.set(date, (counts.get(date) ?? 0) + 1);
      }
      const days = dailySoilTemperatures(hours, zone);
      expect(days.map((d) => [d.date, d.hourCount]), zone).toEqual([...counts.entries()]);
    }
    // The short and long days really are there.
    const year = hourly('2027-01-01T00:00:00Z', 365 * 24, () => ({ airTempC: 10 }));
    const hoursOn = (zone: string, date: string) => dailySoilTemperatures(year, zone).find((d) => d.date === date)!.hourCount;
    expect([hoursOn('America/Chicago', '2027-03-14'), hoursOn('America/Chicago', '2027-11-07')]).toEqual([23, 25]);
    expect([hoursOn('Australia/Sydney', '2027-04-04'), hoursOn('Australia/Sydney', '2027-10-03')]).toEqual([25, 23]);
  });

  it('16-day forecasts starting on every day of the year, on the hour and at half past', () => {
    for (const zone of ZONES) {
      for (let day = 0; day < 365; day++) {
        const start = new Date(Date.parse('2027-01-01T00:00:00Z') + day * 86_400_000 + (day % 2) * HALF_HOUR_MS).toISOString();
        const hours = hourly(start, 16 * 24, () => ({ airTempC: 10, soilTempC: 11 }));
        const expected = [...new Set(hours.map((h) => reference(zone, Date.parse(h.time))))];
        const got = dailySoilTemperatures(hours, zone).map((d) => d.date);
        if (got.join() !== expected.join()) expect(got, `${zone} from ${start}`).toEqual(expected);
      }
    }
  });
});
