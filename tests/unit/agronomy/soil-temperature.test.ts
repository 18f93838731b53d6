// Daily seed-zone soil temperature. Local days are checked against the IANA time zone database as shipped in
// Node's ICU, read independently through Intl.DateTimeFormat; the estimate against the Biome-BGC 4.x weighting
// (11-day running mean of daily mean air temperature, weights 1…11, after Zheng, Hunt & Running 1993).
import { describe, expect, it } from 'vitest';
import { dailySoilTemperatures, estimateSoilTempC, type HourlyTemp } from '@/lib/agronomy/soil-temperature';

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
