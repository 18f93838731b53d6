// Germination check: after the first soaking rain, once soil degree days above the blend's minimum reach
// days-to-emergence × (optimum midpoint − minimum). Degree days by the simple average method, (max + min)/2 −
// base (Iowa State University Agronomy), with the optimum top as upper cap. White clover: minimum 40 °F,
// optimum 55–75 °F, 5–10 days to emergence (catalog, from memory) → 10 × (65 − 40) = 250 degree days.
import { describe, expect, it } from 'vitest';
import { blendProfile } from '@/lib/agronomy/species';
import { fToC } from '@/lib/agronomy/units';
import { planPlanting, replan } from '@/lib/schedule/plan';
import { localNoon, makeForecast } from './forecast-fixture';
import { planting, step, withStep } from './plantings';

const NOW = localNoon('2027-09-06');
const input = planting({ targetSeedDate: '2027-09-14' });
const rain = [{ date: '2027-09-14', fromHour: 15, hours: 6, totalMm: 15 }];

describe('germination check', () => {
  it('uses the blend the catalog describes', () => {
    const p = blendProfile(input.blend);
    expect(p.minSoilTempF).toBe(40);
    expect(p.optimumSoilTempF).toEqual([55, 75]);
    expect(p.daysToEmergence[1]).toBe(10);
  });

  it('comes the blend\'s days to emergence after the soaking rain when the soil sits at the optimum', () => {
    // Soil 65 °F: (65 + 65)/2 − 40 = 25 degree days a day → 250 in 10 days after the rain of Tue 14.
    const plan = planPlanting(input, makeForecast({ startDate: '2027-09-06', soilTempC: fToC(65), rain }), NOW);
    expect(step(plan, 'seed').date).toBe('2027-09-14');
    const check = step(plan, 'check-germination');
    expect(check.date).toBe('2027-09-24');
    expect(check.reason).toContain('250 soil degree days above 40 °F from the first soaking rain (Tue 14)');
  });

  it('comes later in cool soil, by the degree days', () => {
    // Soil 52.5 °F: 12.5 a day. Forecast days 15–21 give 7 × 12.5 = 87.5; the remaining 162.5 at the optimum
    // rate of 25 take 6.5 → 7 days: 14 days in all → Tue 28.
    const plan = planPlanting(input, makeForecast({ startDate: '2027-09-06', soilTempC: fToC(52.5), rain }), NOW);
    expect(step(plan, 'check-germination').date).toBe('2027-09-28');
    // Warm soil above the optimum top (75 °F) counts as 75 (upper cap): 35 a day → 250 in 8 days → Wed 22.
    const warm = planPlanting(input, makeForecast({ startDate: '2027-09-06', soilTempC: fToC(85), rain }), NOW);
    expect(step(warm, 'check-germination').date).toBe('2027-09-22');
  });

  it('waits for the first soaking rain after a seeding into dry weather', () => {
    // Seeding done Thu 16, after the rain; no later rain in the forecast (through Tue 21): moisture is taken
    // to come the day after the forecast ends (Wed 22), then 10 days at the optimum → Sat 2 Oct.
    const forecast = makeForecast({ startDate: '2027-09-06', soilTempC: fToC(65), rain });
    const plan = planPlanting(input, forecast, NOW);
    const done = withStep(plan, 'seed', { status: 'done', doneOn: '2027-09-16' });
    const { plan: next, changes } = replan(input, done, forecast, NOW);
    const check = step(next, 'check-germination');
    expect(check.date).toBe('2027-10-02');
    expect(check.warnings.join(' ')).toContain('No soaking rain is forecast after seeding');
    expect(changes.find((c) => c.key === 'check-germination')).toMatchObject({ from: '2027-09-24', to: '2027-10-02' });
  });
});
