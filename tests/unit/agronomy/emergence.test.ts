// Days to emergence by soil temperature, against the published tables and degree-day requirements.
// HM = Harrington & Minges (1954), "Days required for seedling emergence at various soil temperatures from seed
// planted ½ inch deep", as reproduced in Knott's Handbook for Vegetable Growers (1997) and printed in whole days in
// Teaching Organic Farming and Gardening (UC Santa Cruz), Unit 1.3 Appendix 4.
import { describe, expect, it } from 'vitest';
import { daysToEmergence, emergenceCalibration, emergenceDay } from '@/lib/agronomy/emergence';
import { SPECIES } from '@/lib/agronomy/species';

describe('daysToEmergence: Harrington & Minges table rows', () => {
  it('turnip: 5 days at 50 °F, 3 at 59, 2 at 68, 1 at 77, none at 41 (HM row "Turnip": NG NG 5 3 2 1 1 1 3)', () => {
    // The anchor: turnips about 5 days at 50 °F (the old degree-day engine said 15).
    expect(daysToEmergence('turnip', 50)).toBe(5);
    expect(daysToEmergence('turnip', 59)).toBe(3);
    expect(daysToEmergence('turnip', 68)).toBe(2);
    expect(daysToEmergence('turnip', 77)).toBe(1);
    expect(daysToEmergence('turnip', 104)).toBe(3);
    expect(daysToEmergence('turnip', 41)).toBe(Infinity);
    expect(daysToEmergence('turnip', 35)).toBe(Infinity);
  });

  it('radish: 29 days at 41 °F, 11 at 50, 6 at 59, 3 at 86 (HM row "Radish": NG 29 11 6 4 4 3 — —)', () => {
    expect(daysToEmergence('forage-radish', 41)).toBe(29);
    expect(daysToEmergence('forage-radish', 50)).toBe(11);
    expect(daysToEmergence('forage-radish', 59)).toBe(6);
    expect(daysToEmergence('forage-radish', 86)).toBe(3);
    expect(daysToEmergence('forage-radish', 32)).toBe(Infinity);
  });

  it('pea: 36 days at 41 °F, 14 at 50, 9 at 59, 8 at 68, 6 at 77 (HM row "Pea": — 36 14 9 8 6 6 — —)', () => {
    expect(daysToEmergence('austrian-winter-peas', 41)).toBe(36);
    expect(daysToEmergence('austrian-winter-peas', 50)).toBe(14);
    expect(daysToEmergence('austrian-winter-peas', 59)).toBe(9);
    expect(daysToEmergence('austrian-winter-peas', 68)).toBe(8);
    expect(daysToEmergence('austrian-winter-peas', 77)).toBe(6);
    // Not tested below 41 °F: Sowcast does not extrapolate, so no emergence is promised.
    expect(daysToEmergence('austrian-winter-peas', 38)).toBe(Infinity);
  });

  it('between tested temperatures the rate (1/days) is interpolated linearly (derived from the HM rows)', () => {
    // Turnip at 54.5 °F: rates 1/5 and 1/3, halfway → 0.26667 per day → 3.75 days (not the 4 a straight line in days gives).
    expect(daysToEmergence('turnip', 54.5)).toBeCloseTo(1 / ((1 / 5 + 1 / 3) / 2), 10);
    expect(daysToEmergence('turnip', 54.5)).toBeCloseTo(3.75, 10);
    // Turnip at 45.5 °F: from NG (rate 0) at 41 to 1/5 at 50 → 0.1 per day → 10 days.
    expect(daysToEmergence('turnip', 45.5)).toBeCloseTo(10, 10);
    // Pea at 45.5 °F: (1/36 + 1/14)/2 = 0.0496 per day → 20.16 days.
    expect(daysToEmergence('austrian-winter-peas', 45.5)).toBeCloseTo(2 / (1 / 36 + 1 / 14), 10);
  });

  it('closest rows where the table has none are named in the source', () => {
    expect(emergenceCalibration('forage-rape').source).toContain('row "Turnip"');
    expect(emergenceCalibration('chicory').source).toContain('row "Lettuce"');
    expect(emergenceCalibration('cowpeas').source).toContain('row "Bean, snap"');
    // Chicory by the lettuce row: 7 days at 50 °F, 4 at 59; cowpeas by the snap-bean row: none at 50, 16 at 59, 8 at 77.
    expect(daysToEmergence('chicory', 50)).toBe(7);
    expect(daysToEmergence('chicory', 59)).toBe(4);
    expect(daysToEmergence('cowpeas', 50)).toBe(Infinity);
    expect(daysToEmergence('cowpeas', 59)).toBe(16);
    expect(daysToEmergence('cowpeas', 77)).toBe(8);
  });
});

describe('daysToEmergence: degree-day species', () => {
  it('corn: 110 GDD by the 86/50 °F method (Purdue, Nielsen: 100–120) — about 12 days at 59 °F', () => {
    // 59 °F: 9 GDD a day → 110/9 = 12.2 days. The anchor (published ≈ 12; the old engine said 6); HM's
    // sweet-corn row gives 12 days at 59 °F too.
    expect(daysToEmergence('corn', 59)).toBeCloseTo(110 / 9, 10);
    expect(Math.round(daysToEmergence('corn', 59))).toBe(12);
    // 68 °F: 18 a day → 6.1 (HM sweet corn 7); 77 °F: 27 a day → 4.1 (HM 4); 95 °F counts as the 86 °F cap → 3.06 (HM 3).
    expect(daysToEmergence('corn', 68)).toBeCloseTo(110 / 18, 10);
    expect(daysToEmergence('corn', 77)).toBeCloseTo(110 / 27, 10);
    expect(daysToEmergence('corn', 95)).toBeCloseTo(110 / 36, 10);
    expect(daysToEmergence('corn', 50)).toBe(Infinity);
  });

  it('soybeans: 110 GDD, base 50 °F (Iowa State ICM: 90–130) — about 2 weeks at 58 °F', () => {
    expect(daysToEmergence('soybeans', 58)).toBeCloseTo(110 / 8, 10);
    expect(daysToEmergence('soybeans', 77)).toBeCloseTo(110 / 27, 10);
  });

  it('small grains, base 32 °F (NDSU/NDAWN): wheat 180 GDD — 10 days at 50 °F, 20 at 41; oats 176 (barley’s figure)', () => {
    expect(daysToEmergence('winter-wheat', 50)).toBeCloseTo(10, 10);
    expect(daysToEmergence('winter-wheat', 41)).toBeCloseTo(20, 10);
    expect(daysToEmergence('oats', 50)).toBeCloseTo(176 / 18, 10);
    expect(daysToEmergence('cereal-rye', 50)).toBeCloseTo(10, 10);
    expect(daysToEmergence('winter-wheat', 32)).toBe(Infinity);
  });

  it('clovers: 90 °C·d above 0 °C (Nori 2013, arrowleaf clover field emergence) — 9 days at 50 °F, capped at 68 °F', () => {
    // 50 °F = 10 °C: 90/10 = 9 days; 162 °F·d above 32 °F is the same.
    expect(daysToEmergence('arrowleaf-clover', 50)).toBeCloseTo(9, 10);
    expect(daysToEmergence('crimson-clover', 59)).toBeCloseTo(6, 10);
    // Above the 16–20 °C germination optimum the rate is held: 86 °F counts as 68 °F → 162/36 = 4.5 days.
    expect(daysToEmergence('white-clover', 86)).toBeCloseTo(4.5, 10);
    expect(emergenceCalibration('white-clover').source).toContain('Sowcast’s assumption');
  });
});

describe('daysToEmergence: every species, every temperature', () => {
  it('has a calibration for every species in the catalog, and days never rise as soil warms from 40 to 68 °F', () => {
    for (const species of SPECIES) {
      let previous = Infinity;
      for (let f = 40; f <= 68; f += 1) {
        const days = daysToEmergence(species.id, f);
        expect(days, `${species.id} at ${f} °F`).toBeGreaterThan(0);
        expect(days, `${species.id} at ${f} °F`).toBeLessThanOrEqual(previous);
        previous = days;
      }
      expect(Number.isFinite(daysToEmergence(species.id, 68)), species.id).toBe(true);
    }
  });

  it('refuses an unknown species or a temperature that is not a number, naming it', () => {
    expect(() => daysToEmergence('kudzu', 60)).toThrow(/No emergence calibration for species "kudzu"/);
    expect(() => daysToEmergence('corn', Number.NaN)).toThrow(/soilTempF must be a number/);
  });
});

describe('emergenceDay: development-rate summation', () => {
  it('at a steady temperature it is the table’s days, rounded up to a whole day', () => {
    expect(emergenceDay('turnip', Array(10).fill(50))).toBe(5);
    expect(emergenceDay('corn', Array(20).fill(59))).toBe(13); // 12.2 days → up on day 13
    expect(emergenceDay('turnip', Array(4).fill(50))).toBeNull();
  });

  it('for a degree-day species it is the day the GDD sum reaches the requirement (Nielsen’s method)', () => {
    // Corn: 3 days at 59 °F (9 GDD each = 27), then 77 °F (27 a day): 27 + 3 × 27 = 108 < 110 after day 6; 135 on day 7.
    expect(emergenceDay('corn', [59, 59, 59, 77, 77, 77, 77, 77])).toBe(7);
  });

  it('cold days add nothing, so a cold snap delays emergence day for day', () => {
    // Turnip: 2 days at 41 °F (no germination), then 50 °F: up on day 2 + 5 = 7.
    expect(emergenceDay('turnip', [41, 41, 50, 50, 50, 50, 50, 50])).toBe(7);
  });
});
