// Seed-zone moisture: the FAO Irrigation and Drainage Paper 56 (Allen et al. 1998) chapter 7 evaporation-layer
// water balance — Table 19 soil water characteristics, eq. 73 (TEW), eq. 74 (Kr, from the previous day's depletion),
// eq. 71/76 (E = Kr · Ke max · ET0 for bare soil, few = 1), eq. 77–79 (daily depletion, excess drains). The seed zone
// is wet while it holds at least the soaking rain (0.25 in = 6.35 mm, common practice, no source) above air-dry:
// De ≤ TEW − 6.35 mm — the same threshold seed-before-rain seeds ahead of.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { SEED_BEFORE_RAIN_DEFAULTS } from '@/lib/schedule/rules/seed-before-rain';
import {
  BARE_SOIL_KE_MAX,
  evaporableWater,
  FAO56_TABLE_19,
  firstDrySpell,
  SOAKING_RAIN_MM,
  seedZoneMoisture,
  type SoilTexture,
  type WaterDay,
} from '@/lib/agronomy/water-balance';

const TEXTURES = Object.keys(FAO56_TABLE_19) as SoilTexture[];

function dryingDays(count: number, et0Mm: number, rain: Record<number, number> = {}): WaterDay[] {
  return Array.from({ length: count }, (_, i) => ({
    date: `2027-09-${String(i + 1).padStart(2, '0')}`,
    rainMm: rain[i] ?? 0,
    et0Mm,
  }));
}

describe('FAO-56 Table 19', () => {
  it('holds the published ranges (spot checks: sand, loam, clay)', () => {
    expect(FAO56_TABLE_19.sand).toEqual({
      fieldCapacity: [0.07, 0.17], wiltingPoint: [0.02, 0.07], readilyEvaporableMm: [2, 7], totalEvaporableMm: [6, 12],
    });
    expect(FAO56_TABLE_19.loam).toEqual({
      fieldCapacity: [0.2, 0.3], wiltingPoint: [0.07, 0.17], readilyEvaporableMm: [8, 10], totalEvaporableMm: [16, 22],
    });
    expect(FAO56_TABLE_19.clay).toEqual({
      fieldCapacity: [0.32, 0.4], wiltingPoint: [0.2, 0.24], readilyEvaporableMm: [8, 12], totalEvaporableMm: [22, 29],
    });
    expect(TEXTURES).toHaveLength(9);
  });

  it('TEW for a loam at Ze = 0.10 m by eq. 73 from the midpoints is 19 mm, inside the table’s 16–22 mm', () => {
    // TEW = 1000 (θFC − 0.5 θWP) Ze = 1000 × (0.25 − 0.5 × 0.12) × 0.10 = 19.0 mm.
    const loam = evaporableWater('loam');
    expect(loam.totalEvaporableMm).toBeCloseTo(19, 10);
    expect(loam.readilyEvaporableMm).toBe(9);
  });

  it('eq. 73 from the midpoints lands inside every texture’s printed TEW range, and REW < TEW', () => {
    for (const texture of TEXTURES) {
      const { totalEvaporableMm, readilyEvaporableMm } = evaporableWater(texture);
      const [low, high] = FAO56_TABLE_19[texture].totalEvaporableMm;
      expect(totalEvaporableMm, texture).toBeGreaterThanOrEqual(low);
      expect(totalEvaporableMm, texture).toBeLessThanOrEqual(high);
      expect(readilyEvaporableMm, texture).toBeLessThan(totalEvaporableMm);
    }
  });

  it('a deeper layer (Ze = 0.15 m, FAO-56 upper value) holds proportionally more', () => {
    expect(evaporableWater('loam', 0.15).totalEvaporableMm).toBeCloseTo(28.5, 10);
  });
});

const IN = 25.4;

describe('seedZoneMoisture', () => {
  it('soaking in seed-before-rain and wet in the balance are one number, a quarter inch', () => {
    expect(SOAKING_RAIN_MM).toBeCloseTo(0.25 * IN, 10);
    expect(SEED_BEFORE_RAIN_DEFAULTS.soakingRainMm).toBe(SOAKING_RAIN_MM);
  });

  it('a 1 in rain on air-dry loam, then dry days at ET0 = 5 mm/day: wet through stage 1, dry on day 4 (worked by hand)', () => {
    // Loam, FAO-56 Table 19 midpoints: REW = 9 mm; TEW = 1000 (0.25 − 0.5 × 0.12) × 0.10 = 19 mm (eq. 73).
    // Wet while De ≤ TEW − 6.35 = 12.65 mm. Ke max = 1.05, so stage 1 loses 1.05 × 5 = 5.25 mm/day. Start air-dry, De = 19.
    // Day 1: Kr from De = 19 is 0 (eq. 74), E = 0; 25.4 mm refills the layer, the rest drains (eq. 78–79): De = 0, wet.
    // Day 2: Kr(0) = 1, E = 5.25 → De = 5.25, wet.   Day 3: Kr(5.25) = 1 (still ≤ REW), E = 5.25 → De = 10.5, wet.
    // Day 4: stage 2, Kr(10.5) = (19 − 10.5)/(19 − 9) = 0.85, E = 4.4625 → De = 14.9625 > 12.65: dry.
    // Day 5: Kr = (19 − 14.9625)/10 = 0.40375, E = 2.1196875 → De = 17.0821875.
    // Day 6: Kr = 0.19178125, E = 1.0068515625 → De = 18.0890390625.
    const result = seedZoneMoisture(dryingDays(6, 5, { 0: IN }), { texture: 'loam' });
    expect(result.days.map((d) => d.depletionMm)).toEqual(
      [0, 5.25, 10.5, 14.9625, 17.0821875, 18.0890390625].map((v) => expect.closeTo(v, 9)),
    );
    expect(result.days.map((d) => d.kr)).toEqual([0, 1, 1, 0.85, 0.40375, 0.19178125].map((v) => expect.closeTo(v, 9)));
    expect(result.days.map((d) => d.moist)).toEqual([true, true, true, false, false, false]);
    expect(result.firstMoistDate).toBe('2027-09-01');
    expect(result.firstDryDate).toBe('2027-09-04');
    expect(result.moistDays).toBe(3);
    expect(result.wetDepletionMm).toBeCloseTo(12.65, 10);
    // The old reading (moist only while De < REW) called day 3 dry — two days after an inch of rain.
    expect(result.days[2].depletionMm).toBeGreaterThan(result.readilyEvaporableMm);
    expect(result.days[2].moist).toBe(true);
  });

  it('a 0.3–0.5 in rain wets an air-dry seed zone; 0.2 in does not (loam, ET0 = 5 mm/day)', () => {
    // 0.3 in = 7.62 mm: De = 19 − 7.62 = 11.38 ≤ 12.65, wet; next day Kr(11.38) = 0.762, E = 4.0005 → 15.3805, dry.
    const third = seedZoneMoisture(dryingDays(2, 5, { 0: 0.3 * IN }), { texture: 'loam' });
    expect(third.days.map((d) => d.depletionMm)).toEqual([expect.closeTo(11.38, 9), expect.closeTo(15.3805, 9)]);
    expect(third.days.map((d) => d.moist)).toEqual([true, false]);
    // 0.5 in = 12.7 mm: De = 6.3; day 2 Kr = 1 → 11.55, wet; day 3 Kr(11.55) = 0.745, E = 3.91125 → 15.46125, dry.
    const half = seedZoneMoisture(dryingDays(3, 5, { 0: 0.5 * IN }), { texture: 'loam' });
    expect(half.days.map((d) => d.depletionMm)).toEqual([6.3, 11.55, 15.46125].map((v) => expect.closeTo(v, 9)));
    expect(half.days.map((d) => d.moist)).toEqual([true, true, false]);
    // 0.2 in = 5.08 mm, under the soaking rain: De = 13.92 > 12.65, still dry.
    const light = seedZoneMoisture(dryingDays(1, 5, { 0: 0.2 * IN }), { texture: 'loam' });
    expect(light.days[0].depletionMm).toBeCloseTo(13.92, 9);
    expect(light.firstMoistDate).toBeNull();
  });

  it('a dry spell is that many dry days in a row after the first wetting, and a soaking rain ends it', () => {
    const inch = seedZoneMoisture(dryingDays(6, 5, { 0: IN }), { texture: 'loam' });
    expect(firstDrySpell(inch, 3)).toEqual({ startDate: '2027-09-04', endDate: '2027-09-06' });
    // Two dry days are not a three-day spell.
    expect(firstDrySpell(seedZoneMoisture(dryingDays(5, 5, { 0: IN }), { texture: 'loam' }), 3)).toBeNull();
    // 0.3 in on day 5: Kr(14.9625) = 0.40375, E = 2.1196875; De = 14.9625 − 7.62 + 2.1196875 = 9.4621875, wet again.
    // Day 6: Kr = 0.95378125, E = 5.0073515625 → 14.4695390625, dry; days 7 and 8 drier still: the spell is days 6–8.
    const rewet = seedZoneMoisture(dryingDays(8, 5, { 0: IN, 4: 0.3 * IN }), { texture: 'loam' });
    expect(rewet.days[4].depletionMm).toBeCloseTo(9.4621875, 9);
    expect(rewet.days[5].depletionMm).toBeCloseTo(14.4695390625, 9);
    expect(firstDrySpell(rewet, 3)).toEqual({ startDate: '2027-09-06', endDate: '2027-09-08' });
    // A seed zone that never wets has no dry spell to warn about: the seed has not started.
    expect(firstDrySpell(seedZoneMoisture(dryingDays(6, 5), { texture: 'loam' }), 3)).toBeNull();
    expect(() => firstDrySpell(inch, 0)).toThrow(/whole number of days/);
  });

  it('rain before the reported days still wets them: seed sown the day after an inch of rain goes into a wet seed zone', () => {
    // Same days as the worked inch above, reported from day 2: 5.25 and 10.5 mm (wet), then 14.9625 (dry).
    const result = seedZoneMoisture(dryingDays(4, 5, { 0: IN }), { texture: 'loam', reportFrom: '2027-09-02' });
    expect(result.days.map((d) => d.date)).toEqual(['2027-09-02', '2027-09-03', '2027-09-04']);
    expect(result.firstMoistDate).toBe('2027-09-02');
    expect(result.firstDryDate).toBe('2027-09-04');
    expect(result.moistDays).toBe(2);
  });

  it('stage 2 slows drying and depletion never passes TEW (eq. 74; De ≤ TEW)', () => {
    const result = seedZoneMoisture(dryingDays(30, 6), { texture: 'loam', initialDepletionMm: 0 });
    const depletion = result.days.map((d) => d.depletionMm);
    for (let i = 1; i < depletion.length; i++) expect(depletion[i]).toBeGreaterThanOrEqual(depletion[i - 1]);
    expect(Math.max(...depletion)).toBeLessThanOrEqual(19 + 1e-9);
    expect(depletion.at(-1)).toBeGreaterThan(18.9);
    // Daily loss in stage 2 is below the stage-1 rate of 6.3 mm.
    expect(depletion[3] - depletion[2]).toBeLessThan(6.3);
  });

  it('sand dries sooner than clay after the same inch of rain (Table 19 midpoints, ET0 = 2.5 mm/day)', () => {
    // Stage 1 loses 1.05 × 2.5 = 2.625 mm/day. Sand: TEW = 1000 (0.12 − 0.5 × 0.045) × 0.1 = 9.75 mm, REW 4.5, wet while
    // De ≤ 3.4: days 1–2 (0, 2.625), dry on day 3 (5.25). Clay: TEW = 1000 (0.36 − 0.5 × 0.22) × 0.1 = 25 mm, REW 10,
    // wet while De ≤ 18.65: 0, 2.625, 5.25, 7.875, 10.5 (stage 1), then Kr(10.5) = 14.5/15 → 13.0375, → 15.1309,
    // → 16.8579, → 18.2827 (still wet, day 9), → 19.4586 on day 10: dry.
    const days = dryingDays(12, 2.5, { 0: IN });
    const sand = seedZoneMoisture(days, { texture: 'sand' });
    const clay = seedZoneMoisture(days, { texture: 'clay' });
    expect(sand.totalEvaporableMm).toBeCloseTo(9.75, 10);
    expect(clay.totalEvaporableMm).toBeCloseTo(25, 10);
    expect(sand.firstDryDate).toBe('2027-09-03');
    expect(clay.days[8].depletionMm).toBeCloseTo(18.2827, 3);
    expect(clay.firstDryDate).toBe('2027-09-10');
  });

  it('without a known wetting it starts air-dry (Sowcast default), so only rain wets it', () => {
    const dry = seedZoneMoisture(dryingDays(3, 3), { texture: 'loam' });
    expect(dry.moistDays).toBe(0);
    expect(dry.firstMoistDate).toBeNull();
    expect(dry.firstDryDate).toBeNull();
    const rained = seedZoneMoisture(dryingDays(3, 3, { 0: 30 }), { texture: 'loam' });
    expect(rained.days[0].moist).toBe(true);
  });

  it('with no evaporative demand a wet layer stays moist through the forecast', () => {
    const still = seedZoneMoisture(dryingDays(5, 0), { texture: 'loam', initialDepletionMm: 0 });
    expect(still.moistDays).toBe(5);
    expect(still.firstDryDate).toBeNull();
  });

  it('a larger soaking rain set per planting raises the bar for wet', () => {
    // Half an inch as the soaking rain: wet only while De ≤ 19 − 12.7 = 6.3 mm, so 0.3 in on dry loam is not enough.
    const result = seedZoneMoisture(dryingDays(1, 5, { 0: 0.3 * IN }), { texture: 'loam', soakingRainMm: 0.5 * IN });
    expect(result.wetDepletionMm).toBeCloseTo(6.3, 10);
    expect(result.firstMoistDate).toBeNull();
  });

  it('refuses bad input with readable messages', () => {
    expect(() => seedZoneMoisture([{ date: '2027-09-01', rainMm: -1, et0Mm: 3 }], {})).toThrow(/Rain on 2027-09-01/);
    expect(() => seedZoneMoisture([{ date: '2027-09-01', rainMm: 0, et0Mm: Number.NaN }], {})).toThrow(RangeError);
    expect(() => seedZoneMoisture([], { texture: 'peat' as SoilTexture })).toThrow(/Unknown soil texture/);
    expect(() => seedZoneMoisture([], { initialDepletionMm: 50 })).toThrow(/between 0 and 19.0/);
    expect(() => seedZoneMoisture([], { soakingRainMm: 0 })).toThrow(/soaking rain/);
  });

  it('property: 0 ≤ De ≤ TEW for any rain and ET0 sequence, and wet means De ≤ TEW − the soaking rain', () => {
    const day = fc.record({ rainMm: fc.double({ min: 0, max: 60, noNaN: true }), et0Mm: fc.double({ min: 0, max: 10, noNaN: true }) });
    fc.assert(
      fc.property(fc.array(day, { maxLength: 20 }), fc.constantFrom(...TEXTURES), (raw, texture) => {
        const days = raw.map((d, i) => ({ ...d, date: `d${i}` }));
        const result = seedZoneMoisture(days, { texture });
        for (const d of result.days) {
          expect(d.depletionMm).toBeGreaterThanOrEqual(0);
          expect(d.depletionMm).toBeLessThanOrEqual(result.totalEvaporableMm + 1e-9);
          expect(d.moist).toBe(d.depletionMm <= result.totalEvaporableMm - SOAKING_RAIN_MM + 1e-9);
        }
        expect(result.moistDays).toBeLessThanOrEqual(days.length);
      }),
    );
  });
});
