// Burn window: only with a permit or approval recorded; humidity 25–55 % and 20-ft wind 5–15 mph (common
// practice for prescribed-fire prescriptions; 20-ft wind ≈ 10-m wind ÷ 1.15, US fire-weather practice, from
// memory); always "check local burn rules". Forecasts are synthetic.
import { describe, expect, it } from 'vitest';
import { mphToKmh } from '@/lib/agronomy/units';
import { planPlanting, replan } from '@/lib/schedule/plan';
import { BURN_WINDOW_DEFAULTS } from '@/lib/schedule/rules/burn-window';
import { localNoon, makeForecast } from './forecast-fixture';
import { planting, step, withStep } from './plantings';

const input = planting({ cover: 'grass-weeds', targetSeedDate: '2027-09-23', burn: { planned: true, permitInHand: true } });
// Spraying 14 days before the burn day (Wed 22) → Wed 8; kill wait ends Wed 22.
const tenMetre = (mph20ft: number) => mphToKmh(mph20ft * 1.15);
const first = planPlanting(input, null, localNoon('2027-09-01'));
const sprayed = withStep(first, 'spray', { status: 'done', doneOn: '2027-09-08' });
const NOW = localNoon('2027-09-12');

describe('burn window', () => {
  it('uses the usual prescribed-fire band', () => {
    expect(BURN_WINDOW_DEFAULTS).toMatchObject({ rhMinPct: 25, rhMaxPct: 55, windMinMph: 5, windMaxMph: 15 });
  });

  it('burns on a day with humidity and wind in the band, after the kill wait, before the seeding', () => {
    const forecast = makeForecast({
      startDate: '2027-09-12',
      // Wed 22 too humid (70 %); Thu 23 in band (40 %, 8 mph at 20 ft); otherwise too dry (18 %).
      relativeHumidityPct: ({ date }) => (date === '2027-09-22' ? 70 : date === '2027-09-23' ? 40 : 18),
      windKmh: tenMetre(8),
    });
    expect(step(first, 'spray').date).toBe('2027-09-08');
    const { plan } = replan(input, sprayed, forecast, NOW);
    const burn = step(plan, 'burn');
    expect(step(plan, 'kill-wait').date).toBe('2027-09-22');
    expect(burn.date).toBe('2027-09-23');
    expect(burn.hours).not.toBeNull();
    expect(burn.reason).toContain('humidity 40 %');
    expect(burn.reason).toContain('check local burn rules');
    expect(step(plan, 'seed').date > burn.date).toBe(true);
  });

  it('reports a day outside the band plainly', () => {
    const forecast = makeForecast({ startDate: '2027-09-12', relativeHumidityPct: 18, windKmh: tenMetre(20) });
    const { plan } = replan(input, sprayed, forecast, NOW);
    const burn = step(plan, 'burn');
    // No fitting day in the forecast (through Mon 27): it goes to the first day past it.
    expect(burn.date).toBe('2027-09-28');
    expect(burn.reason).toContain('no burn window in the forecast');
  });
});
