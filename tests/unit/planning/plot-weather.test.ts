// The plot weather chart's data: local days of the stored forecast as the engine reads them. Sources named per
// check: NIST SP 811 (2008) B.8–B.9 (1 in = 25.4 mm exactly; t/°F = 1.8 t/°C + 32); ECMA-402 Intl for weekday
// names; Pesticide Environmental Stewardship ("Evaluate the weather": 3–8 mph absent label directions); FAO-56
// (Allen et al. 1998) Table 19 and eq. 73 for the loam surface layer (REW 8–10 mm, TEW 19 mm at Ze 0.10 m);
// NDSU for the soybean 50 °F minimum as the catalog cites it. Forecasts are synthetic (tests/unit/schedule).
import { describe, expect, it } from 'vitest';
import { mphToKmh } from '@/lib/agronomy/units';
import { compareSeedingDates } from '@/lib/planning/compare-seeding';
import { currentPlanting, forecastFreshness, plotWeather } from '@/lib/planning/plot-weather';
import { planPlanting } from '@/lib/schedule/plan';
import type { PlanStep, PlantingInput } from '@/lib/schedule/types';
import type { PlantingFormInput } from '@/lib/validations/planting';
import { localNoon, makeForecast, type FixtureOptions } from '../schedule/forecast-fixture';
import { intlDay, planting, ZONE } from '../schedule/plantings';

const PLACE = { timeZone: ZONE, latitudeDeg: 38.6, longitudeDeg: -90.2 };
const START = '2027-05-10';
const NOW = localNoon(START);

// FAO-56 Example 14: wind at 10 m to 2 m is × 4.87 / ln(67.8 · 10 − 5.42) over short grass.
const TEN_TO_TWO_M = 4.87 / Math.log(67.8 * 10 - 5.42);
const tenMetreKmhFor = (mphAt2m: number) => mphToKmh(mphAt2m / TEN_TO_TWO_M);

/** 9 °C for the first four days, 11 °C after — either side of 10 °C = 50 °F (NIST SP 811 B.9). */
const soilStepUp: FixtureOptions['soilTempC'] = (h) => (h.date < '2027-05-14' ? 9 : 11);

function forecast(o: Partial<FixtureOptions> = {}) {
  return makeForecast({ startDate: START, days: 16, windKmh: tenMetreKmhFor(5), soilTempC: soilStepUp, ...o });
}

function seedStep(date: string, change: Partial<PlanStep> = {}): PlanStep {
  return {
    key: 'seed', kind: 'seed', title: 'Seed', date, window: null, status: 'planned', pinned: false, after: [],
    quantities: [], cautions: [], reason: 'ahead of the rain on Fri 14', rules: [], warnings: [], ...change,
  };
}

const soybeans = (o: Partial<PlantingInput> = {}) =>
  planting({ season: 'spring', method: 'prepared-seedbed', blend: [{ speciesId: 'soybeans', share: 1 }], targetSeedDate: '2027-05-14', ...o });

describe('plotWeather: days and units', () => {
  it('gives the local days from today through the last full forecast day, in inches and °F', () => {
    // 27.94 mm on Wed 12 = 1.1 in exactly (1 in = 25.4 mm, NIST SP 811 B.8).
    const w = plotWeather({ forecast: forecast({ rain: [{ date: '2027-05-12', fromHour: 14, hours: 4, totalMm: 27.94 }], airTempC: 10 }), place: PLACE, now: NOW });
    expect(w.today).toBe(START);
    expect(w.days).toHaveLength(16);
    expect(w.days[0]).toMatchObject({ date: START, isToday: true, hours: 24 });
    expect(w.days[0].label).toBe(intlDay(START)); // weekday as ECMA-402 Intl spells it
    const wed = w.days.find((d) => d.date === '2027-05-12')!;
    expect(wed.rainMm).toBeCloseTo(27.94, 9);
    expect(wed.rainIn).toBeCloseTo(1.1, 12);
    expect(wed.rainProbabilityMaxPct).toBe(80);
    // 10 °C = 50 °F (NIST SP 811 B.9: 1.8 × 10 + 32).
    expect(wed.airMinF).toBeCloseTo(50, 12);
    expect(wed.airMaxF).toBeCloseTo(50, 12);
    expect(w.summary).toContain(`1.1 in of rain expected ${intlDay('2027-05-12', true)}.`);
  });

  it('drops days that have gone by when the stored forecast is older than today', () => {
    const w = plotWeather({ forecast: forecast(), place: PLACE, now: localNoon('2027-05-12') });
    expect(w.days[0].date).toBe('2027-05-12');
    expect(w.days).toHaveLength(14);
  });

  it('says so when there is nothing to show', () => {
    const w = plotWeather({ forecast: { timeZone: ZONE, fetchedAt: NOW.toISOString(), hours: [] }, place: PLACE, now: NOW });
    expect(w.days).toEqual([]);
    expect(w.summary).toEqual(['The stored forecast covers no days from today on.']);
  });
});

describe('plotWeather: soil temperature against the blend minimum', () => {
  it('marks the day soil reaches the soybean minimum of 50 °F (NDSU, as the catalog cites it)', () => {
    const input = soybeans();
    const w = plotWeather({ forecast: forecast(), place: PLACE, planting: { input, steps: [seedStep('2027-05-14')] }, now: NOW });
    expect(w.blend).toMatchObject({ minSoilTempF: 50, limitingSpecies: 'Soybeans (forage type)' });
    expect(w.blend!.minSoilTempC).toBeCloseTo(10, 12); // NIST SP 811 B.9
    // 9 °C = 48.2 °F and 11 °C = 51.8 °F (1.8 t + 32).
    expect(w.days[0].soilTempF).toBeCloseTo(48.2, 9);
    expect(w.days[0].soilLevel).toBe('cold');
    expect(w.days.find((d) => d.date === '2027-05-14')!.soilTempF).toBeCloseTo(51.8, 9);
    expect(w.days.filter((d) => d.soilLevel === 'cold').map((d) => d.date)).toEqual(['2027-05-10', '2027-05-11', '2027-05-12', '2027-05-13']);
    expect(w.summary[0]).toBe(`Soil reaches 50 °F, the blend minimum (soybeans (forage type)), on ${intlDay('2027-05-14', true)}.`);
  });

  it('without a planting gives soil temperatures but no blend band', () => {
    const w = plotWeather({ forecast: forecast(), place: PLACE, now: NOW });
    expect(w.blend).toBeNull();
    expect(w.days.every((d) => d.soilLevel === null)).toBe(true);
    expect(w.summary[0]).toBe(`Soil 48–52 °F through ${intlDay('2027-05-25', true)}.`);
  });
});

describe('plotWeather: spray-suitable hours', () => {
  it('uses the stewardship 3–8 mph band without a label, and counts only daylight hours', () => {
    const w = plotWeather({ forecast: forecast(), place: PLACE, now: NOW });
    expect(w.spray).toMatchObject({ windMinMph: 3, windMaxMph: 8, rainfastHours: 6, fromLabel: false, productName: null });
    const later = w.days.slice(1, -1);
    // Mid-May at 38.6° N has about 14 h of daylight (from memory); a day has 24 hours, and night hours never count,
    // nor the hour after sunrise and the two before sunset (NDSU Extension AE1876, inversions): about 11 h.
    for (const d of later) {
      expect(d.spray.suitableHours).toBeGreaterThanOrEqual(9);
      expect(d.spray.suitableHours).toBeLessThanOrEqual(12);
      expect(d.spray.window).not.toBeNull();
    }
    // Today: the hours before noon (now) have gone by; on the last day the forecast ends inside the rainfast period.
    expect(w.days[0].spray.suitableHours).toBeLessThan(later[0].spray.suitableHours);
    expect(w.days.at(-1)!.spray.suitableHours).toBeLessThan(later[0].spray.suitableHours);
  });

  it('takes the herbicide label’s wind limit over the default band', () => {
    const input = soybeans({ herbicide: { productName: 'Generic glyphosate 41%', rate: { percentSolution: 2 }, maxWindMph: 4 } });
    const w = plotWeather({ forecast: forecast(), place: PLACE, planting: { input, steps: [seedStep('2027-05-14')] }, now: NOW });
    expect(w.spray).toMatchObject({ windMaxMph: 4, fromLabel: true, productName: 'Generic glyphosate 41%' });
    // 5 mph at spray height is above the label's 4 mph all day.
    expect(w.days.every((d) => d.spray.suitableHours === 0 && d.spray.window === null)).toBe(true);
    expect(w.days[1].spray.reason).toMatch(/wind above 4 mph \(the label limit\)/);
    expect(w.summary.at(-1)).toBe(`No spray window of 2 h through ${intlDay('2027-05-25', true)}.`);
  });

  it('blocks the hours whose 6-hour rainfast period a rain falls into', () => {
    const dry = plotWeather({ forecast: forecast(), place: PLACE, now: NOW });
    // Rain in the hours ending 16:00 and 17:00: spraying an hour [t, t+1] needs no rain through t+7 h, so
    // t = 09:00 … 16:00 are out — 8 daylight hours (arithmetic on the 6 h default).
    const wet = plotWeather({ forecast: forecast({ rain: [{ date: '2027-05-13', fromHour: 15, hours: 2, totalMm: 4 }] }), place: PLACE, now: NOW });
    const on = (w: typeof dry) => w.days.find((d) => d.date === '2027-05-13')!.spray.suitableHours;
    expect(on(dry) - on(wet)).toBe(8);
  });

  it('shows the same spray window the planner put on the spray step', () => {
    const input = soybeans({
      method: 'spray-and-seed',
      cover: 'grass-weeds',
      targetSeedDate: '2027-05-20',
      herbicide: { productName: 'Generic glyphosate 41%', rate: { percentSolution: 2 } },
      sprayer: { tankGal: 4, carrierGalPerAcre: 15 },
    });
    const fc = forecast();
    const plan = planPlanting(input, fc, NOW);
    const spray = plan.steps.find((s) => s.key === 'spray')!;
    expect(spray.hours).toBeTruthy();
    const w = plotWeather({ forecast: fc, place: PLACE, planting: { input, steps: plan.steps }, now: NOW });
    expect(w.days.find((d) => d.date === spray.date)!.spray.window).toEqual(spray.hours);
  });
});

describe('plotWeather: seed-zone moisture after seeding', () => {
  it('is moist after an inch of rain on the seeding day, and not shown before seeding', () => {
    // 25.4 mm exceeds the loam layer's TEW of 19 mm (FAO-56 eq. 73), so it refills; moist while depletion < REW.
    const fc = forecast({ rain: [{ date: '2027-05-14', fromHour: 4, hours: 4, totalMm: 25.4 }] });
    const w = plotWeather({ forecast: fc, place: PLACE, planting: { input: soybeans(), steps: [seedStep('2027-05-14')] }, now: NOW });
    expect(w.moisture).toMatchObject({ fromDate: '2027-05-14', startsAtForecast: false, texture: 'loam', totalEvaporableMm: 19 });
    expect(w.moisture!.readilyEvaporableMm).toBeGreaterThanOrEqual(8);
    expect(w.moisture!.readilyEvaporableMm).toBeLessThanOrEqual(10);
    expect(w.days.filter((d) => d.date < '2027-05-14').every((d) => d.moisture === null)).toBe(true);
    expect(w.days.find((d) => d.date === '2027-05-14')!.moisture!.state).toBe('moist');
    expect(w.moisture!.moistDays).toBeGreaterThanOrEqual(1);
    expect(w.seeding).toMatchObject({ date: '2027-05-14', status: 'planned', inForecast: true, reason: 'ahead of the rain on Fri 14' });
  });

  it('stays dry with no rain in the forecast (the layer starts air-dry at the forecast start)', () => {
    const w = plotWeather({ forecast: forecast(), place: PLACE, planting: { input: soybeans(), steps: [seedStep('2027-05-14')] }, now: NOW });
    expect(w.moisture!.firstMoistDate).toBeNull();
    expect(w.days.filter((d) => d.date >= '2027-05-14').every((d) => d.moisture?.state === 'dry')).toBe(true);
    expect(w.summary).toContain(`Seeding planned ${intlDay('2027-05-14', true)}: the seed zone stays dry through ${intlDay('2027-05-25', true)}: no rain in the forecast soaks it.`);
  });

  it('agrees with the seeding comparison for the same date', () => {
    const fc = forecast({ rain: [{ date: '2027-05-15', fromHour: 2, hours: 6, totalMm: 20 }] });
    const property = {
      time_zone: ZONE, latitude: PLACE.latitudeDeg, longitude: PLACE.longitudeDeg, elevation_m: 150,
      avg_last_spring_frost: '04-10', avg_first_fall_frost: '11-20',
    } as Parameters<typeof compareSeedingDates>[0]['property'];
    const form = { season: 'spring', method: 'prepared-seedbed', blend: [{ speciesId: 'soybeans', share: 1 }], targetSeedDate: '2027-05-14' } as PlantingFormInput;
    const [option] = compareSeedingDates({ property, plot: { acres: 1, cover: 'tilled' }, form, seedDates: ['2027-05-14'], forecast: fc, now: NOW });
    const w = plotWeather({ forecast: fc, place: PLACE, planting: { input: soybeans(), steps: [seedStep('2027-05-14')] }, now: NOW });
    expect(option.moisture).not.toBeNull();
    expect(w.moisture!.fromDate).toBe(option.moisture!.fromDate);
    expect(w.moisture!.moistDays).toBe(option.moisture!.moistDays);
    expect(w.moisture!.firstDryDate).toBe(option.moisture!.firstDryDate);
    // The comparison's own germination reading is the plan's: its check date is the emergence it reports (no delay
    // by default), and the seed zone wets on the rain day in both.
    expect(option.germination.checkDate).toBe(option.germination.emergenceDate);
    expect(option.germination.moistDate).toBe('2027-05-15');
    expect(w.moisture!.firstMoistDate).toBe('2027-05-15');
  });

  it('starts at the forecast for a seeding done before it, and waits for a seeding beyond it', () => {
    const done = seedStep('2027-05-06', { status: 'done', doneOn: '2027-05-07' });
    const past = plotWeather({ forecast: forecast(), place: PLACE, planting: { input: soybeans(), steps: [done] }, now: NOW });
    expect(past.seeding).toMatchObject({ date: '2027-05-07', status: 'done', inForecast: false });
    expect(past.moisture).toMatchObject({ fromDate: START, startsAtForecast: true });
    expect(past.summary.some((s) => s.startsWith(`Seeded ${intlDay('2027-05-07', true)}, before the forecast begins`))).toBe(true);

    const beyond = plotWeather({ forecast: forecast(), place: PLACE, planting: { input: soybeans(), steps: [seedStep('2027-06-20')] }, now: NOW });
    expect(beyond.moisture).toBeNull();
    expect(beyond.days.every((d) => d.moisture === null)).toBe(true);
    expect(beyond.summary).toContain(`Seeding planned ${intlDay('2027-06-20', true)}, beyond the forecast; the seed-zone outlook appears once the forecast reaches it.`);
  });
});

describe('currentPlanting', () => {
  const p = (id: string, status: string, date: string, steps: PlanStep[] = []) => ({ id, status, targetSeedDate: date, steps });
  it('takes the active planting whose seeding is nearest today, the coming one on a tie', () => {
    const picked = currentPlanting([p('old', 'active', '2027-03-01'), p('soon', 'active', '2027-05-20'), p('gone', 'abandoned', '2027-05-10')], '2027-05-10');
    expect(picked?.id).toBe('soon');
    expect(currentPlanting([p('before', 'active', '2027-05-07'), p('after', 'active', '2027-05-13')], '2027-05-10')?.id).toBe('after');
    // The seeding step's date (moved by the engine) counts, not the date first asked for.
    expect(currentPlanting([p('moved', 'active', '2027-09-01', [seedStep('2027-05-11')]), p('other', 'active', '2027-05-14')], '2027-05-10')?.id).toBe('moved');
    expect(currentPlanting([p('done', 'finished', '2027-05-10')], '2027-05-10')).toBeNull();
  });
});

describe('forecastFreshness', () => {
  const fetchedAt = '2027-05-10T00:00:00.000Z';
  it('is fresh for 12 hours, then stale since fetchedAt + 12 h', () => {
    expect(forecastFreshness({ fetchedAt, now: new Date('2027-05-10T11:59:00Z'), failingSince: null })).toEqual({ stale: false, staleReason: null, staleSince: null });
    expect(forecastFreshness({ fetchedAt, now: new Date('2027-05-10T13:00:00Z'), failingSince: null })).toEqual({ stale: true, staleReason: 'old', staleSince: '2027-05-10T12:00:00.000Z' });
  });
  it('names failing refreshes, since the first failure', () => {
    expect(forecastFreshness({ fetchedAt, now: new Date('2027-05-10T03:00:00Z'), failingSince: '2027-05-10T02:00:00.000Z' })).toEqual({
      stale: true,
      staleReason: 'failing',
      staleSince: '2027-05-10T02:00:00.000Z',
    });
  });
});
