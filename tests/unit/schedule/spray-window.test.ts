// The spray window: daylight, rain-free rainfast period, wind band, temperature, Delta T.
// Sources named per check: Pesticide Environmental Stewardship ("Evaluate the weather": 3–8 mph absent label
// directions); FAO-56 Example 14 (10-m wind to 2 m: ×4.87/ln(67.8·10 − 5.42) ≈ 0.748); Stull (2011) wet bulb
// for Delta T; Australian BoM / GRDC Delta T bands (secondary: 2–8 °C good, 8–10 marginal, >10 avoid);
// NWS measurable rain 0.01 in. Forecasts are synthetic.
import { describe, expect, it } from 'vitest';
import { mphToKmh } from '@/lib/agronomy/units';
import { indexForecast } from '@/lib/schedule/forecast-days';
import { planPlanting } from '@/lib/schedule/plan';
import { bestSprayDay, SPRAY_WINDOW_DEFAULTS, sprayDay, type SprayContext } from '@/lib/schedule/rules/spray-window';
import { localNoon, makeForecast, type FixtureOptions } from './forecast-fixture';
import { planting, step, ZONE } from './plantings';

// FAO-56 Example 14: 3.2 m/s at 10 m is 2.4 m/s at 2 m; the factor is 4.87 / ln(672.58).
const TEN_TO_TWO_M = 4.87 / Math.log(67.8 * 10 - 5.42);
const tenMetreKmhFor = (mphAt2m: number) => mphToKmh(mphAt2m / TEN_TO_TWO_M);

/** Stull (2011), J. Appl. Meteor. Climatol. 50:2267, eq. 1 — the outside reference for Delta T. */
function stullDeltaT(t: number, rh: number): number {
  const tw =
    t * Math.atan(0.151977 * Math.sqrt(rh + 8.313659)) +
    Math.atan(t + rh) -
    Math.atan(rh - 1.676331) +
    0.00391838 * rh ** 1.5 * Math.atan(0.023101 * rh) -
    4.686035;
  return t - tw;
}

const DAY = '2027-09-14';

function ctxFor(o: Partial<FixtureOptions>, product: SprayContext['product'] = null): SprayContext {
  const forecast = makeForecast({ startDate: '2027-09-12', days: 5, airTempC: 20, ...o });
  const fc = indexForecast(forecast, ZONE, { measurableRainMm: 0.25, eventGapHours: 6, soakingRainMm: 6.35, soakingWindowHours: 72 });
  return { fc, latitudeDeg: 38.6, longitudeDeg: -90.2, product, params: SPRAY_WINDOW_DEFAULTS };
}

describe('spray window', () => {
  it('defaults to the stewardship wind band and a 6 h rainfast period, and treats 0.25 mm as measurable rain', () => {
    expect(SPRAY_WINDOW_DEFAULTS.windMinMph).toBe(3);
    expect(SPRAY_WINDOW_DEFAULTS.windMaxMph).toBe(8);
    expect(SPRAY_WINDOW_DEFAULTS.rainfastHours).toBe(6);
    // NWS: measurable precipitation is 0.01 in = 0.254 mm.
    expect(SPRAY_WINDOW_DEFAULTS.measurableRainMm).toBeCloseTo(0.01 * 25.4, 2);
  });

  it('keeps to 3–8 mph at spray height: too windy in the morning, too calm late in the day', () => {
    const ctx = ctxFor({
      windKmh: ({ hour }) => (hour < 12 ? tenMetreKmhFor(10) : hour < 15 ? tenMetreKmhFor(5) : tenMetreKmhFor(1.5)),
    });
    const day = sprayDay(ctx, DAY);
    expect(day.level).toBe('good');
    expect(day.hours).toEqual({ start: '12:00', end: '15:00' });
    expect(day.decision.reason).toContain('wind 5 mph');
    const calm = ctxFor({ windKmh: tenMetreKmhFor(1.5) });
    const none = sprayDay(calm, DAY);
    expect(none.level).toBe('none');
    expect(none.decision.ok).toBe(false);
    expect(none.decision.reason).toContain('wind below 3 mph (inversion risk)');
  });

  it("uses the label's wind limit where it gives one", () => {
    const ctx = ctxFor(
      { windKmh: ({ hour }) => (hour < 12 ? tenMetreKmhFor(10) : hour < 15 ? tenMetreKmhFor(5) : tenMetreKmhFor(1.5)) },
      { productName: 'Example burndown', rate: { percentSolution: 2 }, maxWindMph: 12 },
    );
    // Daylight on 14 Sep at 38.6° N, 90.2° W runs about 06:40–19:10 CDT (NOAA solar equations); spraying starts
    // an hour after sunrise (NDSU AE1876 / auxin labels), so the first whole hour is 08:00.
    expect(sprayDay(ctx, DAY).hours).toEqual({ start: '08:00', end: '15:00' });
  });

  it('needs the rainfast period dry after the last of the spray goes on', () => {
    // 2 mm falls 16:00–17:00 local. With a 6 h rainfast period any spraying from 10:00 on is washed.
    const rain = [{ date: DAY, fromHour: 16, hours: 1, totalMm: 2 }];
    const ctx = ctxFor({ windKmh: tenMetreKmhFor(5), rain });
    const day = sprayDay(ctx, DAY);
    expect(day.hours).toEqual({ start: '08:00', end: '10:00' });
    // A label that is rainfast in 1 h leaves the whole morning and early afternoon.
    const quick = ctxFor({ windKmh: tenMetreKmhFor(5), rain }, { productName: 'Example burndown', rate: { percentSolution: 2 }, rainfastHours: 1 });
    expect(sprayDay(quick, DAY).hours).toEqual({ start: '08:00', end: '15:00' });
    // A trace (0.1 mm, under the 0.25 mm measurable line) does not block anything.
    // (The chance of rain is held low here so only the amount is judged.)
    const trace = ctxFor({ windKmh: tenMetreKmhFor(5), rain: [{ date: DAY, fromHour: 9, hours: 1, totalMm: 0.1 }], rainProbabilityPct: 10 });
    expect(sprayDay(trace, DAY).hours).toEqual({ start: '08:00', end: '17:00' });
  });

  it('keeps Delta T in the good band, allows the marginal band with care, and avoids above 10 °C', () => {
    // At 25 °C: RH 20 % → Delta T above 10 (avoid); RH 35 % → 8–10 (marginal); RH 60 % → under 8 (good).
    expect(stullDeltaT(25, 20)).toBeGreaterThan(10);
    expect(stullDeltaT(25, 35)).toBeGreaterThan(8);
    expect(stullDeltaT(25, 35)).toBeLessThan(10);
    expect(stullDeltaT(25, 60)).toBeLessThan(8);
    expect(stullDeltaT(25, 60)).toBeGreaterThan(2);
    const mixed = ctxFor({ airTempC: 25, windKmh: tenMetreKmhFor(5), relativeHumidityPct: ({ hour }) => (hour < 10 ? 20 : hour < 13 ? 35 : 60) });
    const day = sprayDay(mixed, DAY);
    expect(day.level).toBe('good');
    expect(day.hours).toEqual({ start: '13:00', end: '17:00' });

    const marginal = sprayDay(ctxFor({ airTempC: 25, windKmh: tenMetreKmhFor(5), relativeHumidityPct: 35 }), DAY);
    expect(marginal.level).toBe('marginal');
    expect(marginal.decision).toMatchObject({ ok: true, marginal: true });
    expect(marginal.decision.reason).toContain('marginal');

    const dry = sprayDay(ctxFor({ airTempC: 25, windKmh: tenMetreKmhFor(5), relativeHumidityPct: 20 }), DAY);
    expect(dry.level).toBe('none');
    expect(dry.decision.reason).toContain('Delta T above 10 °C');
  });

  it('keeps air temperature in the product range (default 50–85 °F, common practice)', () => {
    // 35 °C = 95 °F all day.
    const hot = sprayDay(ctxFor({ airTempC: 35, relativeHumidityPct: 70, windKmh: tenMetreKmhFor(5) }), DAY);
    expect(hot.level).toBe('none');
    expect(hot.decision.reason).toContain('above 85 °F');
  });

  it('never offers hours that have already gone by', () => {
    const forecast = makeForecast({ startDate: '2027-09-12', days: 5, airTempC: 20, windKmh: tenMetreKmhFor(5) });
    const fc = indexForecast(forecast, ZONE, { measurableRainMm: 0.25, eventGapHours: 6, soakingRainMm: 6.35, soakingWindowHours: 72 });
    const afterNoon = sprayDay({ fc, latitudeDeg: 38.6, longitudeDeg: -90.2, product: null, params: SPRAY_WINDOW_DEFAULTS, notBeforeMs: localNoon(DAY).getTime() }, DAY);
    expect(afterNoon.hours).toEqual({ start: '12:00', end: '17:00' });
  });

  it('finds the best day: a windy planned spray day moves to the nearest calm one', () => {
    // Prepared seedbed, seeding Tue 28 Sep: spraying is planned 14 days earlier, Tue 14. Tue 14 and Wed 15 blow
    // 12 mph; Mon 13 is calm: the spray moves one day earlier, not two later.
    const input = planting({
      cover: 'grass-weeds',
      targetSeedDate: '2027-09-28',
      herbicide: { productName: 'Example burndown', rate: { percentSolution: 2 } },
      sprayer: { tankGal: 4, carrierGalPerAcre: 15 },
    });
    const forecast = makeForecast({
      startDate: '2027-09-06',
      airTempC: 20,
      windKmh: ({ date }) => (date === '2027-09-14' || date === '2027-09-15' ? tenMetreKmhFor(12) : tenMetreKmhFor(5)),
    });
    const plan = planPlanting(input, forecast, localNoon('2027-09-06'));
    const spray = step(plan, 'spray');
    expect(spray.date).toBe('2027-09-13');
    expect(spray.hours).toEqual({ start: '08:00', end: '17:00' });
    expect(step(plan, 'kill-wait').date).toBe('2027-09-27');
    // The rule's own best-day search agrees.
    const fc = indexForecast(forecast, ZONE, { measurableRainMm: 0.25, eventGapHours: 6, soakingRainMm: 6.35, soakingWindowHours: 72 });
    const best = bestSprayDay({ fc, latitudeDeg: 38.6, longitudeDeg: -90.2, product: null, params: SPRAY_WINDOW_DEFAULTS }, '2027-09-14', '2027-09-21', '2027-09-14');
    expect(best?.date).toBe('2027-09-16');
    expect(bestSprayDay({ fc, latitudeDeg: 38.6, longitudeDeg: -90.2, product: null, params: SPRAY_WINDOW_DEFAULTS }, '2027-09-14', '2027-09-15', '2027-09-14')).toBeNull();
  });
  it('sprays from an hour after sunrise to two hours before sunset (NDSU Extension AE1876; auxin label language)', () => {
    expect(SPRAY_WINDOW_DEFAULTS.afterSunriseHours).toBe(1);
    expect(SPRAY_WINDOW_DEFAULTS.beforeSunsetHours).toBe(2);
    // NOAA solar equations: sunrise about 06:40 and sunset about 19:10 CDT on 14 Sep at 38.6° N, 90.2° W.
    const day = sprayDay(ctxFor({ windKmh: tenMetreKmhFor(5) }), DAY);
    expect(day.hours).toEqual({ start: '08:00', end: '17:00' });
    // Calm enough only in the first morning hours: those are inversion hours, so no window at all.
    const early = sprayDay(ctxFor({ windKmh: ({ hour }) => (hour >= 6 && hour < 9 ? tenMetreKmhFor(5) : tenMetreKmhFor(12)) }), DAY);
    expect(early.level).toBe('none');
    expect(early.decision.reason).toContain('within 1 h after sunrise or 2 h before sunset (inversion hours)');
  });

  it('stops for gusts above 15 mph at spray height (dicamba label: not in gusty wind or over 15 mph)', () => {
    expect(SPRAY_WINDOW_DEFAULTS.gustMaxMph).toBe(15);
    // Mean wind 5 mph all day; gusts 20 mph at spray height in the morning, 10 mph after 13:00.
    const gusty = ctxFor({ windKmh: tenMetreKmhFor(5), windGustKmh: ({ hour }) => (hour < 13 ? tenMetreKmhFor(20) : tenMetreKmhFor(10)) });
    expect(sprayDay(gusty, DAY).hours).toEqual({ start: '13:00', end: '17:00' });
    const allDay = sprayDay(ctxFor({ windKmh: tenMetreKmhFor(5), windGustKmh: tenMetreKmhFor(20) }), DAY);
    expect(allDay.level).toBe('none');
    expect(allDay.decision.reason).toContain('gusts above 15 mph');
  });

  it('reads the chance of rain in the rainfast period: 30 % asks for care, 60 % stops the spraying (common practice, no source)', () => {
    const likely = sprayDay(ctxFor({ windKmh: tenMetreKmhFor(5), rainProbabilityPct: 70 }), DAY);
    expect(likely.level).toBe('none');
    expect(likely.decision.reason).toContain('a 60 % or higher chance of rain within 6 h after spraying');
    const chance = sprayDay(ctxFor({ windKmh: tenMetreKmhFor(5), rainProbabilityPct: 40 }), DAY);
    expect(chance.level).toBe('marginal');
    expect(chance.decision.reason).toContain('a 30–60 % chance of rain in the rainfast period: watch the radar');
    expect(sprayDay(ctxFor({ windKmh: tenMetreKmhFor(5), rainProbabilityPct: 10 }), DAY).level).toBe('good');
  });
});
