// Fertilize before rain: with the seeding on a prepared seedbed; once the stand is confirmed for spray-and-seed;
// ahead of at least 0.25 in within 48 h, never ahead of a washout (about 2 in a day). Thresholds are common
// practice, no source (the issue's); forecasts are synthetic.
import { describe, expect, it } from 'vitest';
import { planPlanting, replan } from '@/lib/schedule/plan';
import { localNoon, makeForecast } from './forecast-fixture';
import { planting, step, withStep } from './plantings';

const NOW = localNoon('2027-09-06');
const fertilizer = { grade: [13, 13, 13] as [number, number, number], target: { n: 20 } };

describe('fertilize before rain', () => {
  it('goes on with the seeding on a prepared seedbed, and says the rain will carry it in', () => {
    const input = planting({ targetSeedDate: '2027-09-14', fertilizer });
    const forecast = makeForecast({ startDate: '2027-09-06', rain: [{ date: '2027-09-15', fromHour: 3, hours: 8, totalMm: 18 }] });
    const plan = planPlanting(input, forecast, NOW);
    const seed = step(plan, 'seed');
    const fert = step(plan, 'fertilize');
    expect(fert.date).toBe(seed.date);
    expect(fert.rules.find((r) => r.rule === 'fertilize-before-rain')).toMatchObject({ ok: true });
    expect(fert.reason).toContain('0.7 in of rain forecast in the 48 h after spreading');
  });

  it('waits for the stand in spray-and-seed, then goes ahead of the next soaking rain but not ahead of a washout', () => {
    const input = planting({
      method: 'spray-and-seed',
      cover: 'grass-weeds',
      targetSeedDate: '2027-08-25',
      fertilizer,
    });
    const plan = planPlanting(input, null, localNoon('2027-08-20'));
    // The stand was confirmed on Mon 6 September.
    const checked = withStep(withStep(withStep(plan, 'spray', { status: 'done', doneOn: '2027-08-24' }), 'seed', { status: 'done', doneOn: '2027-08-25' }), 'check-germination', {
      status: 'done',
      doneOn: '2027-09-06',
    });
    const soaking = makeForecast({ startDate: '2027-09-06', rain: [{ date: '2027-09-10', fromHour: 6, hours: 8, totalMm: 12 }] });
    const { plan: next } = replan(input, checked, soaking, NOW);
    // Rain from Fri 10 06:00: Wed 8 (42 h) and Thu 9 (18 h) lead it; Wed 8 is nearer the earliest day.
    expect(step(next, 'fertilize').date).toBe('2027-09-08');
    const washout = makeForecast({
      startDate: '2027-09-06',
      rain: [
        { date: '2027-09-08', fromHour: 6, hours: 12, totalMm: 70 },
        { date: '2027-09-12', fromHour: 6, hours: 8, totalMm: 12 },
      ],
    });
    const { plan: wet } = replan(input, checked, washout, NOW);
    const fert = step(wet, 'fertilize');
    // Mon 6 and Tue 7 lead the 2.8-in washout of Wed 8, and Wed 8 is in it; Fri 10 and Sat 11 lead the soaking rain.
    expect(['2027-09-06', '2027-09-07', '2027-09-08']).not.toContain(fert.date);
    expect(fert.date).toBe('2027-09-10');
  });
});
