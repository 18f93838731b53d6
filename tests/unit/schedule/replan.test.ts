// replan keeps what people did and decided, re-places only steps inside the forecast, and reports each move.
// Rain thresholds are the (common practice, no source); forecasts are synthetic.
import { describe, expect, it } from 'vitest';
import { fToC } from '@/lib/agronomy/units';
import { planPlanting, replan } from '@/lib/schedule/plan';
import { localNoon, makeForecast } from './forecast-fixture';
import { planting, step, withStep } from './plantings';

const NOW = localNoon('2027-09-06');
const sprayAndSeed = planting({
  method: 'spray-and-seed',
  cover: 'grass-weeds',
  acres: 0.5,
  targetSeedDate: '2027-09-14',
  herbicide: { productName: 'Example burndown', rate: { percentSolution: 2 } },
  sprayer: { tankGal: 4, carrierGalPerAcre: 15 },
  fertilizer: { grade: [13, 13, 13], target: { n: 20 } },
  upkeep: true,
});
const rainMon13 = makeForecast({ startDate: '2027-09-06', rain: [{ date: '2027-09-13', fromHour: 6, hours: 6, totalMm: 15 }] });
const rainFri17 = makeForecast({ startDate: '2027-09-06', rain: [{ date: '2027-09-17', fromHour: 14, hours: 6, totalMm: 20 }] });

describe('replan', () => {
  it('changes nothing when the forecast has not changed', () => {
    for (const forecast of [rainMon13, rainFri17, makeForecast({ startDate: '2027-09-06' })]) {
      const plan = planPlanting(sprayAndSeed, forecast, NOW);
      const { plan: again, changes } = replan(sprayAndSeed, plan, forecast, NOW);
      expect(changes).toEqual([]);
      expect(again.steps.map((s) => [s.key, s.date])).toEqual(plan.steps.map((s) => [s.key, s.date]));
    }
  });

  it('follows a new rain: seeding and its spraying move, and each move says from, to and why', () => {
    const plan = planPlanting(sprayAndSeed, rainMon13, NOW);
    expect(step(plan, 'seed').date).toBe('2027-09-12');
    expect(step(plan, 'spray').date).toBe('2027-09-11');
    const { plan: next, changes } = replan(sprayAndSeed, plan, rainFri17, NOW);
    // Rain Fri 17 from 14:00: Thu 16 (26 h ahead) is nearest the current Sun 12 among Thu 16 / Fri 17.
    expect(step(next, 'seed').date).toBe('2027-09-16');
    expect(step(next, 'spray').date).toBe('2027-09-15');
    const seedMove = changes.find((c) => c.key === 'seed')!;
    expect(seedMove).toMatchObject({ kind: 'seed', from: '2027-09-12', to: '2027-09-16' });
    expect(seedMove.reason).toMatch(/^moved seeding from Sun 12 to Thu 16: 0\.8 in of rain forecast Fri 17; soil 64 °F — on Sun 12: no rain in sight/);
    expect(changes.find((c) => c.key === 'spray')).toMatchObject({ from: '2027-09-11', to: '2027-09-15' });
  });

  it('never moves a done step, and counts the following steps from its real date', () => {
    const plan = planPlanting(sprayAndSeed, rainMon13, NOW);
    const done = withStep(withStep(plan, 'spray', { status: 'done', doneOn: '2027-09-11' }), 'seed', { status: 'done', doneOn: '2027-09-12' });
    const { plan: next, changes } = replan(sprayAndSeed, done, rainFri17, localNoon('2027-09-13'));
    expect(step(next, 'spray')).toMatchObject({ date: '2027-09-11', status: 'done', doneOn: '2027-09-11' });
    expect(step(next, 'seed')).toMatchObject({ date: '2027-09-12', status: 'done' });
    expect(changes.map((c) => c.key)).not.toContain('seed');
    expect(changes.map((c) => c.key)).not.toContain('spray');
  });

  it('never moves a pinned step, and says what the rules think of its day', () => {
    const plan = planPlanting(sprayAndSeed, rainMon13, NOW);
    const pinned = withStep(plan, 'seed', { pinned: true });
    const { plan: next, changes } = replan(sprayAndSeed, pinned, rainFri17, NOW);
    const seed = step(next, 'seed');
    expect(seed).toMatchObject({ date: '2027-09-12', pinned: true, status: 'planned' });
    expect(changes.map((c) => c.key)).not.toContain('seed');
    expect(seed.warnings.join(' ')).toContain('Pinned on Sun 12: no rain in sight');
    // The spraying still fits the pinned seeding: within two days before it.
    expect(step(next, 'spray').date <= '2027-09-12').toBe(true);
  });

  it('does not re-place a step that lies past the forecast', () => {
    const late = { ...sprayAndSeed, targetSeedDate: '2027-10-05' };
    const plan = planPlanting(late, null, NOW);
    expect(step(plan, 'seed').date).toBe('2027-10-05');
    // The forecast ends Tue 21 Sep; rain on Fri 17 is inside it, seeding is not.
    const { plan: next, changes } = replan(late, plan, rainFri17, NOW);
    expect(step(next, 'seed').date).toBe('2027-10-05');
    expect(changes).toEqual([]);
    expect(next.forecastThrough).toBe('2027-09-21');
  });

  it('moves an overdue step that nobody marked done up to today', () => {
    const plan = planPlanting(planting({ targetSeedDate: '2027-09-08' }), makeForecast({ startDate: '2027-09-06' }), NOW);
    expect(step(plan, 'seed').date).toBe('2027-09-08');
    const later = localNoon('2027-09-10');
    const { plan: next } = replan(planting({ targetSeedDate: '2027-09-08' }), plan, makeForecast({ startDate: '2027-09-10' }), later);
    expect(step(next, 'seed').date).toBe('2027-09-10');
    for (const s of next.steps) if (s.status === 'planned' && !s.pinned) expect(s.date >= '2027-09-10').toBe(true);
  });

  it('keeps a fertilizing after the germination check for spray-and-seed, ahead of rain once in view', () => {
    const soilWarm = makeForecast({ startDate: '2027-09-06', soilTempC: fToC(65), rain: [{ date: '2027-09-13', fromHour: 6, hours: 6, totalMm: 15 }] });
    const plan = planPlanting(sprayAndSeed, soilWarm, NOW);
    expect(step(plan, 'fertilize').date >= step(plan, 'check-germination').date).toBe(true);
    expect(step(plan, 'fertilize').after).toEqual(['check-germination']);
  });
});
