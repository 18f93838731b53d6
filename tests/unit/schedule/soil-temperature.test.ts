// Seeding never goes into soil colder than the blend's minimum (the most demanding species).
// Minimums from the species catalog's sources: NDSU Extension (oats 45 °F, winter wheat 40 °F, soybeans 50 °F);
// SARE Managing Cover Crops Profitably (cowpeas 65 °F). Forecasts are synthetic.
import { describe, expect, it } from 'vitest';
import { blendProfile } from '@/lib/agronomy/species';
import { fToC } from '@/lib/agronomy/units';
import { indexForecast } from '@/lib/schedule/forecast-days';
import { checkStepDate, planPlanting } from '@/lib/schedule/plan';
import { soilTemperatureOn, SOIL_TEMPERATURE_DEFAULTS } from '@/lib/schedule/rules/soil-temperature';
import { localNoon, makeForecast } from './forecast-fixture';
import { planting, step, ZONE } from './plantings';

const NOW = localNoon('2027-09-06');
const OPTS = { measurableRainMm: 0.25, eventGapHours: 6, soakingRainMm: 6.35, soakingWindowHours: 72 };

describe('soil temperature', () => {
  it("takes the blend's most demanding species: oats (45 °F, NDSU) over winter wheat (40 °F, NDSU)", () => {
    const profile = blendProfile([
      { speciesId: 'winter-wheat', share: 0.5 },
      { speciesId: 'oats', share: 0.5 },
    ]);
    const fc = indexForecast(makeForecast({ startDate: '2027-09-06', soilTempC: fToC(43) }), ZONE, OPTS);
    const verdict = soilTemperatureOn(fc, '2027-09-10', profile, SOIL_TEMPERATURE_DEFAULTS);
    expect(verdict.level).toBe('cold');
    expect(verdict.decision.reason).toBe('soil 43 °F (forecast), below the 45 °F minimum for oats');
  });

  it('does not seed ahead of a rain while the soil is below the minimum; it waits for warm enough soil', () => {
    const input = planting({ blend: [{ speciesId: 'oats', share: 1 }], targetSeedDate: '2027-09-14' });
    // Cold (42 °F) through Wed 15, then 55 °F; a soaking rain Mon 13 that would otherwise draw seeding to Sun 12.
    const forecast = makeForecast({
      startDate: '2027-09-06',
      soilTempC: ({ date }) => (date <= '2027-09-15' ? fToC(42) : fToC(55)),
      rain: [{ date: '2027-09-13', fromHour: 6, hours: 6, totalMm: 15 }],
    });
    const plan = planPlanting(input, forecast, NOW);
    const seed = step(plan, 'seed');
    expect(seed.date).toBe('2027-09-16');
    expect(seed.rules.find((r) => r.rule === 'soil-temperature')).toMatchObject({ ok: true });
    expect(seed.reason).toContain('soil 55 °F');
    const sunday = checkStepDate(input, plan, 'seed', '2027-09-12', forecast).find((r) => r.rule === 'soil-temperature')!;
    expect(sunday.ok).toBe(false);
    expect(sunday.reason).toContain('below the 45 °F minimum for oats');
  });

  it('puts seeding past the forecast, never on a cold day, when the whole forecast is too cold (cowpeas need 65 °F, SARE)', () => {
    const input = planting({ blend: [{ speciesId: 'cowpeas', share: 1 }], season: 'spring', targetSeedDate: '2027-05-12', avgLastSpringFrost: '04-10' });
    const forecast = makeForecast({ startDate: '2027-05-06', soilTempC: fToC(58) });
    const plan = planPlanting(input, forecast, localNoon('2027-05-06'));
    expect(plan.forecastThrough).toBe('2027-05-21');
    const seed = step(plan, 'seed');
    expect(seed.date).toBe('2027-05-22');
    expect(seed.warnings.join(' ')).toContain('re-checks as the forecast extends');
  });

  it('prefers the optimum band between two days equally near the planned date', () => {
    // White clover: minimum 40 °F, optimum 55–75 °F (catalog). Planned Wed 15. Rain from Tue 14 14:00 makes
    // Mon 13 and Tue 14 lead it; rain from Fri 17 14:00 makes Thu 16 and Fri 17 lead it. Tue 14 and Thu 16 are
    // both a day off; Tue 14's soil is 47 °F, Thu 16's 60 °F — in the optimum band — so Thu 16 wins.
    const input = planting({ targetSeedDate: '2027-09-15' });
    const forecast = makeForecast({
      startDate: '2027-09-06',
      soilTempC: ({ date }) => (date === '2027-09-14' ? fToC(47) : fToC(60)),
      rain: [
        { date: '2027-09-14', fromHour: 14, hours: 6, totalMm: 12 },
        { date: '2027-09-17', fromHour: 14, hours: 6, totalMm: 12 },
      ],
    });
    expect(step(planPlanting(input, forecast, NOW), 'seed').date).toBe('2027-09-16');
    // With Tue 14 warm as well, the tie goes to the earlier day.
    const warm = makeForecast({
      startDate: '2027-09-06',
      soilTempC: fToC(60),
      rain: [
        { date: '2027-09-14', fromHour: 14, hours: 6, totalMm: 12 },
        { date: '2027-09-17', fromHour: 14, hours: 6, totalMm: 12 },
      ],
    });
    expect(step(planPlanting(input, warm, NOW), 'seed').date).toBe('2027-09-14');
  });
});
