// Seed-zone moisture: the FAO Irrigation and Drainage Paper 56 (Allen et al. 1998) chapter 7 evaporation-layer
// water balance — Table 19 soil water characteristics, eq. 73 (TEW), eq. 74 (Kr), eq. 77–79 (daily depletion).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  BARE_SOIL_KE_MAX,
  evaporableWater,
  FAO56_TABLE_19,
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

describe('seedZoneMoisture', () => {
  it('a wet loam dries out of stage 1 on the third day at ET0 = 3 mm/day (worked by hand)', () => {
    // Ke max = 1.05 (eq. 72 standard climate Kc max 1.20 − bare-soil Kcb 0.15), so stage 1 loses 3.15 mm/day.
    // Loam REW = 9 mm, TEW = 19 mm. Day 1: De = 3.15 (< 9, moist). Day 2: 6.30 (moist). Day 3: 9.45 (≥ 9, dry).
    // Day 4 is stage 2: Kr = (19 − 9.45) / (19 − 9) = 0.955 (eq. 74); E = 0.955 × 1.05 × 3 = 3.00825; De = 12.45825.
    expect(BARE_SOIL_KE_MAX).toBe(1.05);
    const result = seedZoneMoisture(dryingDays(4, 3), { texture: 'loam', initialDepletionMm: 0 });
    expect(result.days.map((d) => d.depletionMm)).toEqual([
      expect.closeTo(3.15, 10),
      expect.closeTo(6.3, 10),
      expect.closeTo(9.45, 10),
      expect.closeTo(12.45825, 10),
    ]);
    expect(result.days.map((d) => d.moist)).toEqual([true, true, false, false]);
    expect(result.moistDays).toBe(2);
    expect(result.firstDryDate).toBe('2027-09-03');
    expect(result.readilyEvaporableMm).toBe(9);
    expect(result.totalEvaporableMm).toBeCloseTo(19, 10);
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

  it('rain resets depletion and never drives it below zero (eq. 78–79: excess drains)', () => {
    const result = seedZoneMoisture(dryingDays(8, 4, { 4: 25 }), { texture: 'silt-loam', initialDepletionMm: 0 });
    const day5 = result.days[4];
    // 25 mm falls on a layer depleted well under 25 mm → refilled to 0, then the day's stage-1 loss 4 × 1.05 = 4.2 mm.
    expect(day5.depletionMm).toBeCloseTo(4.2, 10);
    expect(day5.moist).toBe(true);
    expect(result.firstDryDate).toBe('2027-09-03'); // silt loam REW 9.5 mm: 4.2, 8.4, 12.6 → dry on day 3
    expect(result.days.every((d) => d.depletionMm >= 0)).toBe(true);
  });

  it('sand (REW 4.5 mm) dries sooner than clay (REW 10 mm) at the same ET0 (Table 19 midpoints)', () => {
    const days = dryingDays(10, 2.5);
    const sand = seedZoneMoisture(days, { texture: 'sand', initialDepletionMm: 0 });
    const clay = seedZoneMoisture(days, { texture: 'clay', initialDepletionMm: 0 });
    // Stage 1 loses 2.625 mm/day: sand dry on day 2 (5.25 ≥ 4.5), clay on day 4 (10.5 ≥ 10).
    expect(sand.moistDays).toBe(1);
    expect(clay.moistDays).toBe(3);
  });

  it('without a known wetting it starts dried out (Sowcast default), so only rain makes it moist', () => {
    const dry = seedZoneMoisture(dryingDays(3, 3), { texture: 'loam' });
    expect(dry.moistDays).toBe(0);
    expect(dry.firstDryDate).toBe('2027-09-01');
    const rained = seedZoneMoisture(dryingDays(3, 3, { 0: 30 }), { texture: 'loam' });
    expect(rained.days[0].moist).toBe(true);
  });

  it('with no evaporative demand a wet layer stays moist through the forecast', () => {
    const still = seedZoneMoisture(dryingDays(5, 0), { texture: 'loam', initialDepletionMm: 0 });
    expect(still.moistDays).toBe(5);
    expect(still.firstDryDate).toBeNull();
  });

  it('refuses bad input with readable messages', () => {
    expect(() => seedZoneMoisture([{ date: '2027-09-01', rainMm: -1, et0Mm: 3 }], {})).toThrow(/Rain on 2027-09-01/);
    expect(() => seedZoneMoisture([{ date: '2027-09-01', rainMm: 0, et0Mm: Number.NaN }], {})).toThrow(RangeError);
    expect(() => seedZoneMoisture([], { texture: 'peat' as SoilTexture })).toThrow(/Unknown soil texture/);
    expect(() => seedZoneMoisture([], { initialDepletionMm: 50 })).toThrow(/between 0 and 19.0/);
  });

  it('property: 0 ≤ De ≤ TEW for any rain and ET0 sequence, and moist means De < REW', () => {
    const day = fc.record({ rainMm: fc.double({ min: 0, max: 60, noNaN: true }), et0Mm: fc.double({ min: 0, max: 10, noNaN: true }) });
    fc.assert(
      fc.property(fc.array(day, { maxLength: 20 }), fc.constantFrom(...TEXTURES), (raw, texture) => {
        const days = raw.map((d, i) => ({ ...d, date: `d${i}` }));
        const result = seedZoneMoisture(days, { texture, initialDepletionMm: 0 });
        for (const d of result.days) {
          expect(d.depletionMm).toBeGreaterThanOrEqual(0);
          expect(d.depletionMm).toBeLessThanOrEqual(result.totalEvaporableMm + 1e-9);
          expect(d.moist).toBe(d.depletionMm < result.readilyEvaporableMm);
        }
        expect(result.moistDays).toBeLessThanOrEqual(days.length);
      }),
    );
  });
});
