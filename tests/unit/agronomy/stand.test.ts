// The germination check's arithmetic. Expected values are worked by hand from the catalog's own inputs
// (rates and seed counts in lib/agronomy/species.ts, each with its source there) and the exact acre,
// 43,560 ft² (NIST Handbook 44, Appendix C).
import { describe, expect, it } from 'vitest';
import { expectedStand, judgeStand, plantsPerSqFt, reseedParts, STAND_SOURCES, STAND_THRESHOLDS } from '@/lib/agronomy/stand';
import { blendProfile, getSpecies } from '@/lib/agronomy/species';

describe('plants per square foot', () => {
  it('is the mean of the spots divided by the frame size (arithmetic)', () => {
    expect(plantsPerSqFt([12, 8, 10], 1)).toBe(10);
    // A 2.5 ft² hoop: 30 plants at 3 spots → 10 per spot → 4 per ft².
    expect(plantsPerSqFt([9, 11, 10], 2.5)).toBe(4);
    // A 0.25 m² frame is 2.691 ft² (0.3048 m per ft, exact by the 1959 international yard and pound agreement).
    expect(plantsPerSqFt([27], 0.25 / 0.3048 ** 2)).toBeCloseTo(10.03, 2);
  });

  it('refuses no spots, negative or fractional counts and a frame of no size', () => {
    expect(() => plantsPerSqFt([], 1)).toThrow(/one spot/);
    expect(() => plantsPerSqFt([3, -1], 1)).toThrow(/whole number/);
    expect(() => plantsPerSqFt([2.5], 1)).toThrow(/whole number/);
    expect(() => plantsPerSqFt([3], 0)).toThrow(/more than 0/);
  });
});

describe('expected stand from the seeding rate', () => {
  it('white clover: 6 lb/acre × 800,000 seeds/lb ÷ 43,560 ft² = 110.2 seeds/ft², 30–60 % establishing (hand arithmetic)', () => {
    const e = expectedStand([{ speciesId: 'white-clover', share: 1 }], 'prepared-seedbed');
    expect(e.seedsPerSqFt).toBeCloseTo((6 * 800_000) / 43_560, 6);
    expect(e.lowPerSqFt).toBeCloseTo(33.058, 2);
    expect(e.highPerSqFt).toBeCloseTo(66.116, 2);
    expect(e.midPerSqFt).toBeCloseTo(49.587, 2);
    // The catalog's stand range for the species is the same sum, rounded to 0.1.
    expect(getSpecies('white-clover').expectedStandPlantsPerSqFt.value).toEqual([33.1, 66.1]);
    expect(e.source).toMatch(/43,560/);
    expect(e.source).toMatch(/30–60 %/);
  });

  it('a blend adds its species at their shares: ½ white clover + ½ winter wheat', () => {
    const parts = [
      { speciesId: 'white-clover', share: 0.5 },
      { speciesId: 'winter-wheat', share: 0.5 },
    ];
    const e = expectedStand(parts, 'spray-and-seed');
    const wheat = getSpecies('winter-wheat');
    const wheatMid = (wheat.broadcastRateLbPerAcre.value[0] + wheat.broadcastRateLbPerAcre.value[1]) / 2;
    const seeds = (0.5 * 6 * 800_000 + 0.5 * wheatMid * wheat.seedsPerLb.value) / 43_560;
    expect(e.seedsPerSqFt).toBeCloseTo(seeds, 6);
    expect(e.species.map((s) => s.speciesId)).toEqual(['white-clover', 'winter-wheat']);
    // Consistent with the blend profile's stand range (the species ranges at their shares), to rounding.
    const profile = blendProfile(parts);
    expect(e.lowPerSqFt).toBeCloseTo(profile.expectedStandPlantsPerSqFt[0], 0);
  });

  it('spray-and-seed expects the broadcast midpoint’s stand (the extra seed makes up for losses); frost seeding its own rate’s', () => {
    const blend = [{ speciesId: 'red-clover', share: 1 }];
    const bag = expectedStand(blend, 'prepared-seedbed');
    expect(expectedStand(blend, 'spray-and-seed').midPerSqFt).toBeCloseTo(bag.midPerSqFt, 9);
    // Frost seeding red clover at 7 lb/acre, the middle of the published 6–8 (University of Kentucky Extension column;
    // University of Missouri Extension, Roberts: 8): 7 × 272,200 ÷ 43,560 = 43.7 seeds/ft² (hand arithmetic).
    const frost = expectedStand(blend, 'frost-seeding');
    expect(frost.seedsPerSqFt).toBeCloseTo((7 * 272_200) / 43_560, 6);
    expect(frost.source).toMatch(/frost-seeding rate/);
    // Red clover 13.5 lb/acre × 272,200 seeds/lb (OSU ANR-0132) ÷ 43,560 = 84.4 seeds/ft².
    expect(bag.seedsPerSqFt).toBeCloseTo(84.36, 1);
  });

  it('refuses a blend the catalog does not know', () => {
    expect(() => expectedStand([{ speciesId: 'kudzu', share: 1 }], 'prepared-seedbed')).toThrow(/Unknown species/);
  });
});

describe('verdict', () => {
  const expected = { lowPerSqFt: 20, highPerSqFt: 40, midPerSqFt: 30 };

  it('good at or above the low end, fair down to half of it, poor below (thresholds with their sources)', () => {
    expect(STAND_THRESHOLDS).toEqual({ goodShareOfExpectedLow: 1, fairShareOfExpectedLow: 0.5 });
    expect(STAND_SOURCES.fairShareOfExpectedLow).toMatch(/from memory/);
    expect(STAND_SOURCES.goodShareOfExpectedLow).toMatch(/no source/);
    expect(judgeStand(20, expected).verdict).toBe('good');
    expect(judgeStand(45, expected).verdict).toBe('good');
    expect(judgeStand(19.9, expected).verdict).toBe('fair');
    expect(judgeStand(10, expected).verdict).toBe('fair');
    expect(judgeStand(9.9, expected).verdict).toBe('poor');
    expect(judgeStand(0, expected).verdict).toBe('poor');
  });

  it('says the count and the range in words', () => {
    expect(judgeStand(6, expected).reason).toBe('6.0 plants per ft², less than half the low end (10) of the 20–40 plants per ft² the seeding rate should give');
  });

  it('the missing share is of the expected midpoint, 0 to 1', () => {
    expect(judgeStand(6, expected).missingShare).toBeCloseTo(0.8, 9);
    expect(judgeStand(0, expected).missingShare).toBe(1);
    expect(judgeStand(35, expected).missingShare).toBe(0);
  });
});

describe('reseed blend', () => {
  it('sows each species at the missing share of its rate, the share rounded up to 5 %', () => {
    const parts = [
      { speciesId: 'white-clover', share: 0.5 },
      { speciesId: 'winter-wheat', share: 1 },
    ];
    // 0.81 missing → 85 % of the rate.
    expect(reseedParts(parts, 0.81)).toEqual([
      { speciesId: 'white-clover', share: 0.425 },
      { speciesId: 'winter-wheat', share: 0.85 },
    ]);
    expect(reseedParts(parts, 1)).toEqual(parts);
    // Exactly 80 % stays 80 % (no float creep up to 85 %).
    expect(reseedParts([{ speciesId: 'oats', share: 1 }], 0.8)).toEqual([{ speciesId: 'oats', share: 0.8 }]);
    expect(() => reseedParts(parts, 0)).toThrow(/nothing to reseed/);
  });
});
