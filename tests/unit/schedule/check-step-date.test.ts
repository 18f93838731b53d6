// checkStepDate for a dragged spray-and-seed seeding. The method sprays the burndown right before seeding —
// a day before by default, never more than two (SEQUENCE_SOURCES: common practice, no source) — so a planned
// spray nobody pinned goes along to the new seeding day instead of refusing it; a pinned or done spray stays
// and the two-day limit refuses the day. Forecasts are synthetic (forecast-fixture.ts); weekdays of the
// dates are checked against Intl (ECMA-402) through intlDay, independent of the engine's own formatting.
import { describe, expect, it } from 'vitest';
import { checkStepDate, planPlanting, replan } from '@/lib/schedule/plan';
import { SEQUENCE_DEFAULTS } from '@/lib/schedule/methods';
import type { RuleDecision } from '@/lib/schedule/types';
import { localNoon, makeForecast } from './forecast-fixture';
import { intlDay, planting, step, withStep } from './plantings';

const NOW = localNoon('2027-09-06');
const input = planting({
  method: 'spray-and-seed',
  cover: 'grass-weeds',
  targetSeedDate: '2027-09-10',
  herbicide: { productName: 'Example burndown', rate: { percentSolution: 2 } },
  sprayer: { tankGal: 4, carrierGalPerAcre: 15 },
});
const failing = (decisions: RuleDecision[]) => decisions.filter((d) => !d.ok).map((d) => d.reason);
/** The verdicts on the spray and the order; with a forecast, a dry week also fails seed-before-rain ("no rain in sight"). */
const ordering = (decisions: RuleDecision[]) => decisions.filter((d) => d.rule === 'sequence' || d.rule === 'spray-window');

/** The fixture's calm days (12 km/h at 10 m, about 5.6 mph at 2 m), with 40 km/h all day on `windy` dates —
 *  far over the 8 mph stewardship limit (SPRAY_WINDOW_SOURCES: Pesticide Environmental Stewardship). */
const windyOn = (...windy: string[]) => makeForecast({ startDate: '2027-09-06', windKmh: (h) => (windy.includes(h.date) ? 40 : 12) });

describe('checkStepDate: a dragged spray-and-seed seeding', () => {
  it('uses a one-day gap, two at most, as the method says', () => {
    expect(SEQUENCE_DEFAULTS.sprayToSeedDays).toBe(1);
    expect(SEQUENCE_DEFAULTS.maxSprayToSeedDays).toBe(2);
    const plan = planPlanting(input, null, NOW);
    expect([step(plan, 'spray').date, step(plan, 'seed').date]).toEqual(['2027-09-09', '2027-09-10']);
  });

  it('carries an unpinned spray along to a later day instead of refusing it (no forecast yet)', () => {
    const plan = planPlanting(input, null, NOW);
    const decisions = checkStepDate(input, plan, 'seed', '2027-09-20', null, NOW);
    expect(failing(decisions)).toEqual([]);
    const carried = decisions.find((d) => d.rule === 'spray-window')!;
    // 2027-09-20 − 1 day = 2027-09-19; Thu 9 Sep 2027 and Sun 19 Sep 2027 per Intl.
    expect([intlDay('2027-09-09', true), intlDay('2027-09-19', true)]).toEqual(['Thu 9 Sep', 'Sun 19 Sep']);
    expect(carried).toEqual({ rule: 'spray-window', ok: true, reason: 'spraying moves with it from Thu 9 to Sun 19, 1 day before seeding' });
    expect(decisions.filter((d) => d.rule === 'sequence').map((d) => d.reason)).toEqual([
      'after spraying (Sun 19)',
      '1 day after spraying; spray-and-seed seeds within 2 days',
    ]);
  });

  it('also carries it to an earlier day, but never before today', () => {
    const plan = planPlanting(input, null, NOW);
    const earlier = checkStepDate(input, plan, 'seed', '2027-09-08', null, NOW);
    expect(failing(earlier)).toEqual([]);
    expect(earlier.find((d) => d.rule === 'spray-window')!.reason).toBe('spraying moves with it from Thu 9 to Tue 7, 1 day before seeding');
    // Today is Mon 6 Sep: a seeding today takes the spray the same morning.
    const today = checkStepDate(input, plan, 'seed', '2027-09-06', null, NOW);
    expect(failing(today)).toEqual([]);
    expect(today.find((d) => d.rule === 'spray-window')!.reason).toBe('spraying moves with it from Thu 9 to Mon 6, the morning of seeding');
  });

  it('still refuses a day more than two days past a pinned or a done spray, with the sequence reason', () => {
    const plan = planPlanting(input, null, NOW);
    for (const change of [{ pinned: true }, { status: 'done' as const, doneOn: '2027-09-09' }]) {
      const fixed = withStep(plan, 'spray', change);
      const decisions = checkStepDate(input, fixed, 'seed', '2027-09-20', null, localNoon('2027-09-10'));
      expect(decisions.find((d) => d.rule === 'spray-window')).toBeUndefined();
      expect(failing(decisions)).toEqual(['11 days after spraying; spray-and-seed seeds within 2 days']);
      expect(failing(checkStepDate(input, fixed, 'seed', '2027-09-11', null, localNoon('2027-09-10')))).toEqual([]);
    }
  });

  it('puts the carried spray where the forecast has a window, and says so', () => {
    const forecast = windyOn('2027-09-14');
    const plan = planPlanting(input, forecast, NOW);
    expect(step(plan, 'seed').date).toBe('2027-09-10');
    // Tue 14 is too windy; Mon 13 and Wed 15 are both a day off the usual gap, and the later, fresher cover wins.
    const decisions = checkStepDate(input, plan, 'seed', '2027-09-15', forecast, NOW);
    expect(failing(ordering(decisions))).toEqual([]);
    const carried = decisions.find((d) => d.rule === 'spray-window')!;
    expect(carried.ok).toBe(true);
    expect(carried.reason).toMatch(/^spraying moves with it from Thu 9 to Wed 15, the morning of seeding: spray /);
  });

  it('refuses a seeding day with no spray window in the two days before it', () => {
    const forecast = windyOn('2027-09-13', '2027-09-14', '2027-09-15');
    const plan = planPlanting(input, forecast, NOW);
    const reasons = failing(ordering(checkStepDate(input, plan, 'seed', '2027-09-15', forecast, NOW)));
    expect(reasons).toHaveLength(1);
    expect(reasons[0]).toMatch(/^no spray window in the 2 days before seeding — no spray window of \d+ h on Tue 14: .*wind/);
  });

  it('agrees with the replan that follows the move: the pinned seeding takes the spray to the day the check named', () => {
    const forecast = windyOn('2027-09-14');
    const plan = planPlanting(input, forecast, NOW);
    const moved = withStep(plan, 'seed', { date: '2027-09-15', pinned: true });
    const { plan: next, changes } = replan(input, moved, forecast, NOW);
    expect(step(next, 'seed')).toMatchObject({ date: '2027-09-15', pinned: true });
    expect(step(next, 'spray')).toMatchObject({ date: '2027-09-15', pinned: false });
    expect(changes.find((c) => c.key === 'spray')).toMatchObject({ from: '2027-09-09', to: '2027-09-15' });
    expect(changes.find((c) => c.key === 'spray')!.reason).toMatch(/^moved spraying from Thu 9 to Wed 15: the morning of seeding: /);
  });
});
