// Upkeep as RFC 5545 recurrences. The reference parser is the rrule package's rrulestr (an RFC 5545
// implementation); weekdays are checked with Intl. Intervals are common practice (soil test every 2–3
// years: extension guidance, from memory; mowing about monthly through summer, no source).
import { describe, expect, it } from 'vitest';
import { rrulestr } from 'rrule';
import { planPlanting } from '@/lib/schedule/plan';
import { expandRecurrence, UPKEEP_DEFAULTS } from '@/lib/schedule/rules/upkeep';
import { localNoon } from './forecast-fixture';
import { planting, step, ZONE } from './plantings';

const NOW = localNoon('2027-08-01');
const clover = planting({ targetSeedDate: '2027-09-14', upkeep: true });

const weekday = (date: string) => new Intl.DateTimeFormat('en-US', { weekday: 'long', timeZone: 'UTC' }).format(new Date(`${date}T12:00:00Z`));

describe('upkeep', () => {
  it('adds mowing, grass control, frost seeding and a soil test to a perennial clover stand', () => {
    const plan = planPlanting(clover, null, NOW);
    const keys = plan.steps.filter((s) => s.recurrence).map((s) => s.key);
    expect(keys.sort()).toEqual(['upkeep-frost-seed', 'upkeep-mow', 'upkeep-soil-test', 'upkeep-spot-spray-grass']);
    for (const s of plan.steps.filter((x) => x.recurrence)) {
      expect(s.after).toEqual(['check-germination']);
      expect(s.date > step(plan, 'check-germination').date).toBe(true);
      expect(s.recurrence!.startsWith(`DTSTART;TZID=${ZONE}:${s.date.replace(/-/g, '')}T080000\nRRULE:`)).toBe(true);
    }
  });

  it('mows on the first Saturday of May through August, as an RFC 5545 parser reads it', () => {
    const mow = step(planPlanting(clover, null, NOW), 'upkeep-mow');
    expect(mow.recurrence).toContain('RRULE:FREQ=MONTHLY;BYMONTH=5,6,7,8;BYDAY=+1SA');
    // Parse with rrule's RFC 5545 reader (floating: drop the TZID) and list 2028's dates.
    const rule = rrulestr(mow.recurrence!.replace(`;TZID=${ZONE}`, ''));
    const dates = rule.between(new Date(Date.UTC(2028, 0, 1)), new Date(Date.UTC(2028, 11, 31)), true).map((d) => d.toISOString().slice(0, 10));
    expect(dates).toEqual(['2028-05-06', '2028-06-03', '2028-07-01', '2028-08-05']);
    for (const d of dates) {
      expect(weekday(d)).toBe('Saturday');
      expect(Number(d.slice(8, 10))).toBeLessThanOrEqual(7);
    }
    expect(expandRecurrence(mow.recurrence!, '2028-01-01', '2028-12-31').map((o) => o.date)).toEqual(dates);
  });

  it('tests the soil every three years from the first test', () => {
    const plan = planPlanting(clover, null, NOW);
    const first = step(plan, 'soil-test').date;
    const again = step(plan, 'upkeep-soil-test');
    expect(UPKEEP_DEFAULTS.soilTestEveryYears).toBe(3);
    expect(again.date).toBe(`${Number(first.slice(0, 4)) + 3}${first.slice(4)}`);
    expect(again.recurrence).toContain('FREQ=YEARLY;INTERVAL=3');
    const next = expandRecurrence(again.recurrence!, again.date, `${Number(again.date.slice(0, 4)) + 7}-12-31`).map((o) => o.date.slice(0, 4));
    expect(next).toEqual([again.date.slice(0, 4), String(Number(again.date.slice(0, 4)) + 3), String(Number(again.date.slice(0, 4)) + 6)]);
  });

  it('frost seeds in late winter, about 60 days before the average last frost, with the frost-seeding rate', () => {
    const frost = step(planPlanting(clover, null, NOW), 'upkeep-frost-seed');
    // Last frost 10 April; 60 days before 10 April 2028 is 10 February (31 days of March, then 29 of leap-year February).
    expect(frost.date).toBe('2028-02-10');
    // White clover frost-seeded at 1–2 lb/acre (University of Kentucky Extension county column, 2024, secondary).
    expect(frost.quantities[0].detail).toContain('1.5 lb/acre: the published frost-seeding rate (white clover 1–2 lb/acre)');
  });

  it('gives an annual brassica plot only the soil test', () => {
    const plan = planPlanting({ ...clover, blend: [{ speciesId: 'turnip', share: 1 }] }, null, NOW);
    expect(plan.steps.filter((s) => s.recurrence).map((s) => s.key)).toEqual(['upkeep-soil-test']);
  });

  it('puts herbicide cautions on spot-spraying grass', () => {
    const spot = step(planPlanting(clover, null, NOW), 'upkeep-spot-spray-grass');
    expect(spot.cautions.map((c) => c.text).join(' ')).toContain('label is the law');
    expect(spot.recurrence).toContain('FREQ=YEARLY;BYMONTH=4,9;BYDAY=+2SA');
    // Select 2 EC label: clethodim controls grasses, not broadleaf plants — so it goes over a clover stand.
    expect(spot.reason).toContain('clethodim or sethoxydim, which spare clover');
  });
});
