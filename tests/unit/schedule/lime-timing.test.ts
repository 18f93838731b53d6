// Lime timing in the plan, against the published guidance:
// - Mississippi State University Extension (cool-season food plots): lime moves and reacts slowly, so apply it
//   three to six months before planting and disk it in (secondary: as reproduced online); NCDA&CS (2005): it
//   takes several months to fully react, apply it as soon as the need is recognized.
// - Virginia Cooperative Extension 452-703: where more than 2 t/acre are recommended, apply one-half and work it
//   in, then the second half and disk it in.
// - Penn State AASL home-garden notes: larger rates divided and applied six months apart (surface).
// - Penn State Extension forages, "Nitrogen Management for Legumes": inoculated legumes need no N; N feeds the
//   grass and weeds.
// Until this issue the lime went on the spray or seed day and moved with the seeding when it was dragged.
import { describe, expect, it } from 'vitest';
import { daysBetween } from '@/lib/schedule/local-dates';
import { checkStepDate, planPlanting, replan } from '@/lib/schedule/plan';
import { LIME_TIMING_DEFAULTS, LIME_TIMING_SOURCES } from '@/lib/schedule/rules/lime-timing';
import { localNoon, makeForecast } from './forecast-fixture';
import { planting, step, withStep } from './plantings';

const LIME_NOW = 'lime now; it needs months to react — expect the full effect next season';

describe('lime timing', () => {
  it('every default names its source', () => {
    for (const key of Object.keys(LIME_TIMING_DEFAULTS) as (keyof typeof LIME_TIMING_DEFAULTS)[]) {
      expect(LIME_TIMING_SOURCES[key].length, key).toBeGreaterThan(20);
    }
    expect(LIME_TIMING_SOURCES.splitAboveTonsPerAcre).toContain('452-703');
  });

  it('goes on about six months before the planned seeding when there is time, after the soil test’s results', () => {
    const plan = planPlanting(planting({ targetSeedDate: '2027-09-14', lime: { tonsPerAcre: 1.5 } }), null, localNoon('2027-01-10'));
    const lime = step(plan, 'lime');
    const soil = step(plan, 'soil-test');
    expect(daysBetween(lime.date, '2027-09-14')).toBe(180);
    expect(daysBetween(soil.date, lime.date)).toBe(14);
    expect(lime.reason).toContain('about 6 months before the planned seeding');
    expect(lime.reason).toContain('lime needs 3–6 months to react');
    expect(lime.warnings).toEqual([]);
    expect(lime.rules.find((r) => r.rule === 'lime-timing')).toMatchObject({ ok: true });
    expect(lime.quantities[0]).toMatchObject({ amount: 3000, unit: 'lb' });
  });

  it('when time is short: lime now, and the plan says to expect the full effect next season', () => {
    const plan = planPlanting(
      planting({ method: 'spray-and-seed', cover: 'grass-weeds', targetSeedDate: '2027-09-14', lime: { tonsPerAcre: 1 } }),
      null,
      localNoon('2027-08-20'),
    );
    const lime = step(plan, 'lime');
    // The soil test today, its numbers in two weeks; the seeding is not held back for the lime.
    expect(lime.date).toBe('2027-09-03');
    expect(lime.reason).toContain(LIME_NOW);
    expect(lime.warnings.join(' ')).toContain('expect the full effect next season');
    expect(step(plan, 'seed').after).not.toContain('lime');
    expect(lime.rules.find((r) => r.rule === 'lime-timing')).toMatchObject({ marginal: true });
  });

  it('splits a rate above 2 t/acre: half months ahead, half before the final seedbed pass, worked in', () => {
    const plan = planPlanting(planting({ targetSeedDate: '2027-09-14', lime: { tonsPerAcre: 3 } }), null, localNoon('2027-01-10'));
    const first = step(plan, 'lime');
    const second = step(plan, 'lime-second');
    expect(first.quantities[0].amount).toBe(3000); // 1.5 t of the 3 t on 1 acre
    expect(second.quantities[0].amount).toBe(3000);
    expect(second.date).toBe(step(plan, 'rake-till').date);
    expect(step(plan, 'rake-till').after).toContain('lime-second');
    expect(first.reason).toContain('3 t/acre is more than 2 t/acre, so it goes on in two halves');
    expect(second.reason).toContain('disk it in');
  });

  it('splits on the surface six months apart when nothing works it in (spray-and-seed)', () => {
    const plan = planPlanting(
      planting({ method: 'spray-and-seed', cover: 'grass-weeds', targetSeedDate: '2027-09-14', lime: { tonsPerAcre: 2.5 } }),
      null,
      localNoon('2027-01-10'),
    );
    expect(daysBetween(step(plan, 'lime').date, step(plan, 'lime-second').date)).toBe(180);
    expect(step(plan, 'lime-second').reason).toContain('on the surface');
  });

  it('does not follow the seeding: a replan that moves the seeding for rain leaves the lime where it was', () => {
    const input = planting({ method: 'spray-and-seed', cover: 'grass-weeds', targetSeedDate: '2027-08-24', lime: { tonsPerAcre: 1 } });
    const planned = planPlanting(input, null, localNoon('2027-08-01'));
    const tested = withStep(planned, 'soil-test', { status: 'done', doneOn: '2027-08-01' });
    const now = localNoon('2027-08-10');
    const rain = makeForecast({ startDate: '2027-08-10', rain: [{ date: '2027-08-19', fromHour: 4, hours: 8, totalMm: 18 }] });
    const { plan: next } = replan(input, tested, rain, now);
    expect(step(next, 'seed').date).not.toBe('2027-08-24');
    expect(step(next, 'lime').date).toBe('2027-08-15'); // the soil test's numbers, two weeks after sampling
    // Dragging the seeding does not carry the lime along, nor ask it to follow.
    const decisions = checkStepDate(input, next, 'seed', '2027-08-12', rain, now);
    expect(decisions.map((d) => d.reason).join(' ')).not.toContain('liming');
    expect(step(next, 'seed').after).not.toContain('lime');
  });
});

describe('nitrogen on a legume-only blend', () => {
  it('warns when an N target is set on clover alone, and says why', () => {
    const plan = planPlanting(
      planting({ targetSeedDate: '2027-09-14', blend: [{ speciesId: 'white-clover', share: 1 }], fertilizer: { grade: [13, 13, 13], target: { n: 30 } } }),
      null,
      localNoon('2027-08-01'),
    );
    const text = [...plan.warnings, ...step(plan, 'fertilize').warnings].join(' ');
    expect(text).toContain('inoculated legumes fix their own nitrogen');
    expect(text).toContain('feeds the grass and weeds');
  });

  it('says nothing when the blend has a grass or a grain, or when no N is asked for', () => {
    const mixed = planPlanting(
      planting({
        targetSeedDate: '2027-09-14',
        blend: [
          { speciesId: 'white-clover', share: 0.5 },
          { speciesId: 'oats', share: 0.5 },
        ],
        fertilizer: { grade: [13, 13, 13], target: { n: 30 } },
      }),
      null,
      localNoon('2027-08-01'),
    );
    expect(mixed.warnings.join(' ')).not.toContain('fix their own nitrogen');
    const noN = planPlanting(planting({ targetSeedDate: '2027-09-14', fertilizer: { grade: [0, 20, 20], target: { p2o5: 40 } } }), null, localNoon('2027-08-01'));
    expect(noN.warnings.join(' ')).not.toContain('fix their own nitrogen');
  });
});
