// Frost deadline. Crimson clover: sow 6–8 weeks before the average first frost (Michigan State University
// Extension / University of Georgia; the catalog keeps 6). Soybeans are frost-tender (catalog, from memory).
// The spring margin of 7 days after the average last frost is common practice, no source.
import { describe, expect, it } from 'vitest';
import { planPlanting } from '@/lib/schedule/plan';
import { FROST_DEADLINE_DEFAULTS } from '@/lib/schedule/rules/frost-deadline';
import { localNoon, makeForecast } from './forecast-fixture';
import { intlDay, planting, step } from './plantings';

describe('frost deadline', () => {
  it('warns past the fall deadline and names the latest date, without moving the seeding', () => {
    // First frost 15 October; 6 weeks (42 days) earlier is 3 September.
    const input = planting({ blend: [{ speciesId: 'crimson-clover', share: 1 }], avgFirstFallFrost: '10-15', targetSeedDate: '2027-09-20' });
    const plan = planPlanting(input, null, localNoon('2027-08-20'));
    const seed = step(plan, 'seed');
    expect(seed.date).toBe('2027-09-20');
    const latest = intlDay('2027-09-03', true);
    expect(latest).toBe('Fri 3 Sep');
    expect(seed.warnings.join(' ')).toContain(`the latest date is ${latest}`);
    expect(plan.warnings.join(' ')).toContain(`the latest date is ${latest}`);
    expect(seed.rules.find((r) => r.rule === 'frost-deadline')).toMatchObject({ ok: false });
  });

  it('is satisfied when the seeding is early enough', () => {
    const input = planting({ blend: [{ speciesId: 'crimson-clover', share: 1 }], avgFirstFallFrost: '10-15', targetSeedDate: '2027-09-01' });
    const seed = step(planPlanting(input, null, localNoon('2027-08-20')), 'seed');
    expect(seed.warnings).toEqual([]);
    expect(seed.rules.find((r) => r.rule === 'frost-deadline')).toMatchObject({ ok: true });
  });

  it('never lets the weather push a seeding past the deadline', () => {
    // Planned on the deadline, 3 September; the only soaking rain comes later, Tue 7 September: seeding stays.
    const input = planting({ blend: [{ speciesId: 'crimson-clover', share: 1 }], avgFirstFallFrost: '10-15', targetSeedDate: '2027-09-03' });
    const forecast = makeForecast({ startDate: '2027-08-30', rain: [{ date: '2027-09-07', fromHour: 15, hours: 6, totalMm: 15 }] });
    const seed = step(planPlanting(input, forecast, localNoon('2027-08-30')), 'seed');
    expect(seed.date).toBe('2027-09-03');
    expect(seed.window?.latest).toBe('2027-09-03');
  });

  it('holds frost-tender spring seed until the average last frost plus the margin', () => {
    expect(FROST_DEADLINE_DEFAULTS.springMarginDays).toBe(7);
    const input = planting({
      blend: [{ speciesId: 'soybeans', share: 1 }],
      season: 'spring',
      avgLastSpringFrost: '04-20',
      targetSeedDate: '2027-04-15',
    });
    const seed = step(planPlanting(input, null, localNoon('2027-03-20')), 'seed');
    expect(seed.date).toBe('2027-04-27');
    expect(seed.warnings.join(' ')).toContain('before Tue 27 Apr');
    expect(seed.rules.find((r) => r.rule === 'frost-deadline')).toMatchObject({ ok: true });
  });

  it('does not hold back a spring blend with no frost-tender species', () => {
    const input = planting({ season: 'spring', avgLastSpringFrost: '04-20', targetSeedDate: '2027-04-01' });
    expect(step(planPlanting(input, null, localNoon('2027-03-20')), 'seed').date).toBe('2027-04-01');
  });
});
