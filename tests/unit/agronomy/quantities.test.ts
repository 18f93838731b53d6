// Seed, spray-mix, fertilizer and lime arithmetic. Checks name their source beside them: NIST (1 US gal = 128 US
// fl oz; 1 acre = 43,560 ft²), Virginia Tech SPES-201 (oxide factors and product = target ÷ grade fraction),
// LSU AgCenter (1/128-acre sprayer calibration), IUPAC standard atomic weights, and trade practice where marked.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  fertilizerAmount,
  K2O_TO_K,
  k2oToK,
  K_TO_K2O,
  kToK2o,
  limeAmount,
  P2O5_TO_P,
  p2o5ToP,
  P_TO_P2O5,
  pToP2o5,
  seedAmount,
  sprayMix,
} from '@/lib/agronomy/quantities';

describe('sprayMix', () => {
  it('half an acre with a 4-gallon backpack at 15 gal/acre takes two fills (derived)', () => {
    // One 4-gal fill at 15 gal/acre covers 4/15 = 0.267 acre, a little over a quarter acre; 0.5 acre needs 1.875 fills.
    const mix = sprayMix({ acres: 0.5, carrierGalPerAcre: 15, tankGal: 4, product: { percentSolution: 2 } });
    expect(mix.acresPerFullTank).toBeCloseTo(0.2667, 4);
    expect(mix.totalSprayGal).toBeCloseTo(7.5, 12);
    expect(mix.tankLoads).toBe(2);
  });

  it('a 2 % solution is 2.56 fl oz of product per gallon of mix (NIST: 1 US gal = 128 US fl oz; 0.02 × 128)', () => {
    const oneGallon = sprayMix({ acres: 1, carrierGalPerAcre: 1, tankGal: 1, product: { percentSolution: 2 } });
    expect(oneGallon.productFlOzPerFullTank).toBeCloseTo(2.56, 12);
    expect(oneGallon.productFlOz).toBeCloseTo(2.56, 12);
    // …and the water is the rest of the gallon: 128 − 2.56 = 125.44 fl oz (derived).
    expect(oneGallon.waterGal * 128).toBeCloseTo(125.44, 10);
    // A 25-gallon tank at 2 %: 25 × 2.56 = 64 fl oz (derived).
    const tank = sprayMix({ acres: 3, carrierGalPerAcre: 20, tankGal: 25, product: { percentSolution: 2 } });
    expect(tank.productFlOzPerFullTank).toBeCloseTo(64, 10);
    expect(tank.productFlOz).toBeCloseTo(0.02 * 60 * 128, 10);
    expect(tank.tankLoads).toBe(3); // 60 gal of spray in 25-gal loads (derived)
  });

  it('LSU AgCenter 1/128-acre calibration: ounces caught from 1/128 acre (≈ 340 ft²) equal gallons per acre', () => {
    // 43,560 ft² / 128 = 340.3 ft² (LSU rounds to 340). Spraying that area at C gal/acre uses C/128 gal = C fl oz.
    for (const carrierGalPerAcre of [10, 15, 20, 32.5]) {
      const exact = sprayMix({ acres: 1 / 128, carrierGalPerAcre, tankGal: 4, product: { flOzPerAcre: 32 } });
      expect(exact.totalSprayGal * 128).toBeCloseTo(carrierGalPerAcre, 10);
      const lsuArea = sprayMix({ acres: 340 / 43_560, carrierGalPerAcre, tankGal: 4, product: { flOzPerAcre: 32 } });
      expect(Math.abs(lsuArea.totalSprayGal * 128 - carrierGalPerAcre) / carrierGalPerAcre).toBeLessThan(0.001);
    }
  });

  it('a fl oz per acre rate scales with the plot and with the acres one tank covers (derived)', () => {
    const mix = sprayMix({ acres: 2, carrierGalPerAcre: 10, tankGal: 25, product: { flOzPerAcre: 32 } });
    expect(mix.productFlOz).toBe(64);
    expect(mix.productFlOzPerFullTank).toBeCloseTo(80, 12); // one 25-gal tank covers 2.5 acres × 32 fl oz
    expect(mix.waterGal).toBeCloseTo(20 - 64 / 128, 12);
    expect(mix.tankLoads).toBe(1);
  });

  it('refuses impossible input with a readable RangeError', () => {
    const ok = { acres: 1, carrierGalPerAcre: 15, tankGal: 4, product: { percentSolution: 2 } };
    expect(() => sprayMix({ ...ok, acres: 0 })).toThrow(RangeError);
    expect(() => sprayMix({ ...ok, acres: -1 })).toThrow(/acres/);
    expect(() => sprayMix({ ...ok, tankGal: 0 })).toThrow(/tank/i);
    expect(() => sprayMix({ ...ok, carrierGalPerAcre: Number.NaN })).toThrow(/gallons per acre/);
    expect(() => sprayMix({ ...ok, product: { percentSolution: 0 } })).toThrow(/Percent/);
    expect(() => sprayMix({ ...ok, product: { percentSolution: 120 } })).toThrow(/100/);
    expect(() => sprayMix({ ...ok, product: { flOzPerAcre: -5 } })).toThrow(RangeError);
    // 3,000 fl oz is 23.4 gal — more than the 15 gal of spray per acre.
    expect(() => sprayMix({ ...ok, product: { flOzPerAcre: 3000 } })).toThrow(/spray volume/);
  });
});

describe('seedAmount', () => {
  // The rate per acre comes from lib/agronomy/seeding-rate.ts (tests/unit/agronomy/seeding-rate.test.ts); this is
  // the arithmetic: pounds = rate × acres, bags rounded up (derived).
  it('8.5 lb/acre × 2 on half an acre is 8.5 lb, one 8.5-lb bag; a little more needs a second bag', () => {
    const half = seedAmount({ ratePerAcreLb: 17, acres: 0.5, bagLb: 8.5 });
    expect(half.pounds).toBeCloseTo(8.5, 12);
    expect(half.bags).toBe(1);
    expect(seedAmount({ ratePerAcreLb: 17, acres: 0.55, bagLb: 8.5 }).bags).toBe(2);
    expect(seedAmount({ ratePerAcreLb: 8.5, acres: 1, bagLb: 8.5 })).toEqual({ pounds: 8.5, bags: 1 });
  });

  it('gives bags only when a bag size is given', () => {
    expect(seedAmount({ ratePerAcreLb: 5, acres: 1 })).not.toHaveProperty('bags');
    expect(seedAmount({ ratePerAcreLb: 100, acres: 1.2, bagLb: 50 }).bags).toBe(3);
  });

  it('refuses bad input', () => {
    expect(() => seedAmount({ ratePerAcreLb: 5, acres: 0 })).toThrow(RangeError);
    expect(() => seedAmount({ ratePerAcreLb: 0, acres: 1 })).toThrow(/Seeding rate/);
    expect(() => seedAmount({ ratePerAcreLb: 5, acres: 1, bagLb: 0 })).toThrow(/bag/);
  });
});

describe('fertilizerAmount', () => {
  it('40 lb N from 13-13-13 is 307.7 lb of product (Virginia Tech SPES-201 method: 40 ÷ 0.13, derived)', () => {
    const result = fertilizerAmount({ grade: [13, 13, 13], target: { n: 40 }, acres: 1 });
    expect(result.lbPerAcre).toBeCloseTo(307.7, 1);
    expect(result.supplied.n).toBeCloseTo(40, 10);
    expect(result.supplied.p2o5).toBeCloseTo(40, 10);
    expect(result.bags).toBe(7); // 307.7 lb in 50-lb bags, rounded up
  });

  it('the nutrient needing the most product decides, and the rest is reported as supplied (SPES-201, derived)', () => {
    // 6-24-24 for 60 P₂O₅ and 40 K₂O: 60 ÷ 0.24 = 250 lb; that also gives 60 K₂O and 15 N.
    const result = fertilizerAmount({ grade: [6, 24, 24], target: { p2o5: 60, k2o: 40 }, acres: 0.5, bagLb: 40 });
    expect(result.lbPerAcre).toBeCloseTo(250, 10);
    expect(result.totalLb).toBeCloseTo(125, 10);
    expect(result.bags).toBe(4);
    expect(result.supplied).toEqual({ n: expect.closeTo(15, 10), p2o5: expect.closeTo(60, 10), k2o: expect.closeTo(60, 10) });
  });

  it('a grade without a needed nutrient says so', () => {
    expect(() => fertilizerAmount({ grade: [13, 0, 0], target: { p2o5: 30 }, acres: 1 })).toThrow(
      new RangeError('13-0-0 cannot supply P₂O₅.'),
    );
    expect(() => fertilizerAmount({ grade: [0, 46, 0], target: { n: 30, p2o5: 30 }, acres: 1 })).toThrow(/cannot supply N/);
    expect(() => fertilizerAmount({ grade: [13, 13, 13], target: {}, acres: 1 })).toThrow(/at least one nutrient/);
    expect(() => fertilizerAmount({ grade: [60, 30, 30], target: { n: 1 }, acres: 1 })).toThrow(/more than 100/);
    expect(() => fertilizerAmount({ grade: [13, 13, 13], target: { n: 40 }, acres: 0 })).toThrow(/acres/);
    expect(() => fertilizerAmount({ grade: [13, 13, 13], target: { n: -4 }, acres: 1 })).toThrow(RangeError);
  });
});

describe('oxide conversions', () => {
  it('match Virginia Tech SPES-201: P₂O₅ → P × 0.4365, P → P₂O₅ × 2.2910, K₂O → K × 0.8301, K → K₂O × 1.2051', () => {
    expect(P2O5_TO_P).toBe(0.4365);
    expect(P_TO_P2O5).toBe(2.291);
    expect(K2O_TO_K).toBe(0.8301);
    expect(K_TO_K2O).toBe(1.2051);
    expect(p2o5ToP(100)).toBeCloseTo(43.65, 10);
    expect(pToP2o5(100)).toBeCloseTo(229.1, 10);
    expect(k2oToK(100)).toBeCloseTo(83.01, 10);
    expect(kToK2o(100)).toBeCloseTo(120.51, 10);
  });

  it('agree with the molar masses (IUPAC standard atomic weights P 30.973762, K 39.0983, O 15.999)', () => {
    const P = 30.973762;
    const K = 39.0983;
    const O = 15.999;
    expect(Math.abs(P2O5_TO_P - (2 * P) / (2 * P + 5 * O))).toBeLessThan(2e-4);
    expect(Math.abs(P_TO_P2O5 - (2 * P + 5 * O) / (2 * P))).toBeLessThan(1e-3);
    expect(Math.abs(K2O_TO_K - (2 * K) / (2 * K + O))).toBeLessThan(1e-4);
    // The molar ratio is 1.20460; SPES-201 prints 1.2051 (≈ 1 / 0.8301 = 1.20467, rounded up) — within 0.05 %.
    expect(Math.abs(K_TO_K2O - (2 * K + O) / (2 * K))).toBeLessThan(6e-4);
  });
});

describe('limeAmount', () => {
  it('2 tons/acre on half an acre is 2,000 lb = 40 bags of 50 lb (US short ton = 2,000 lb, NIST Handbook 44)', () => {
    expect(limeAmount({ tonsPerAcre: 2, acres: 0.5 })).toEqual({ totalLb: 2000, bags: 40 });
    expect(limeAmount({ tonsPerAcre: 1.5, acres: 0.3, bagLb: 40 })).toEqual({ totalLb: 900, bags: 23 });
  });

  it('refuses bad input', () => {
    expect(() => limeAmount({ tonsPerAcre: 0, acres: 1 })).toThrow(/Lime rate/);
    expect(() => limeAmount({ tonsPerAcre: 1, acres: -2 })).toThrow(RangeError);
    expect(() => limeAmount({ tonsPerAcre: 1, acres: 1, bagLb: 0 })).toThrow(/bag/);
  });
});

describe('properties (fast-check)', () => {
  const acres = fc.double({ min: 0.01, max: 200, noNaN: true });
  const pairOfAcres = fc.tuple(acres, acres).map(([a, b]): [number, number] => (a <= b ? [a, b] : [b, a]));

  it('seed, spray, fertilizer and lime amounts never fall as the plot grows', () => {
    fc.assert(
      fc.property(
        pairOfAcres,
        fc.double({ min: 0.5, max: 200, noNaN: true }),
        fc.integer({ min: 1, max: 60 }),
        fc.double({ min: 5, max: 40, noNaN: true }),
        fc.integer({ min: 1, max: 300 }),
        ([small, large], ratePerAcreLb, bagLb, carrierGalPerAcre, tankGal) => {
          const seedSmall = seedAmount({ ratePerAcreLb, acres: small, bagLb });
          const seedLarge = seedAmount({ ratePerAcreLb, acres: large, bagLb });
          expect(seedLarge.pounds).toBeGreaterThanOrEqual(seedSmall.pounds);
          expect(seedLarge.bags!).toBeGreaterThanOrEqual(seedSmall.bags!);

          const product = { percentSolution: 2 };
          const spraySmall = sprayMix({ acres: small, carrierGalPerAcre, tankGal, product });
          const sprayLarge = sprayMix({ acres: large, carrierGalPerAcre, tankGal, product });
          expect(sprayLarge.productFlOz).toBeGreaterThanOrEqual(spraySmall.productFlOz);
          expect(sprayLarge.waterGal).toBeGreaterThanOrEqual(spraySmall.waterGal);
          expect(sprayLarge.tankLoads).toBeGreaterThanOrEqual(spraySmall.tankLoads);

          const fertSmall = fertilizerAmount({ grade: [13, 13, 13], target: { n: 40 }, acres: small });
          const fertLarge = fertilizerAmount({ grade: [13, 13, 13], target: { n: 40 }, acres: large });
          expect(fertLarge.totalLb).toBeGreaterThanOrEqual(fertSmall.totalLb);
          expect(fertLarge.bags).toBeGreaterThanOrEqual(fertSmall.bags);

          const limeSmall = limeAmount({ tonsPerAcre: 1, acres: small });
          const limeLarge = limeAmount({ tonsPerAcre: 1, acres: large });
          expect(limeLarge.totalLb).toBeGreaterThanOrEqual(limeSmall.totalLb);
          expect(limeLarge.bags).toBeGreaterThanOrEqual(limeSmall.bags);
        },
      ),
    );
  });

  it('tank loads always hold the whole spray volume, and never one load more than needed', () => {
    fc.assert(
      fc.property(
        acres,
        fc.double({ min: 1, max: 40, noNaN: true }),
        fc.double({ min: 0.5, max: 500, noNaN: true }),
        (plotAcres, carrierGalPerAcre, tankGal) => {
          const mix = sprayMix({ acres: plotAcres, carrierGalPerAcre, tankGal, product: { flOzPerAcre: 20 } });
          const totalGal = plotAcres * carrierGalPerAcre;
          expect(mix.tankLoads * tankGal).toBeGreaterThanOrEqual(totalGal * (1 - 1e-9));
          expect((mix.tankLoads - 1) * tankGal).toBeLessThan(totalGal);
          expect(mix.waterGal + mix.productFlOz / 128).toBeCloseTo(totalGal, 6);
        },
      ),
    );
  });

  it('the fertilizer rate supplies at least every target', () => {
    const pct = fc.integer({ min: 0, max: 33 });
    const target = fc.option(fc.double({ min: 1, max: 200, noNaN: true }), { nil: undefined });
    fc.assert(
      fc.property(fc.tuple(pct, pct, pct), target, target, target, acres, (grade, n, p2o5, k2o, plotAcres) => {
        const wanted = { n, p2o5, k2o };
        const needsMissing = (['n', 'p2o5', 'k2o'] as const).some((key, i) => wanted[key] !== undefined && grade[i] === 0);
        const none = n === undefined && p2o5 === undefined && k2o === undefined;
        if (needsMissing || none) {
          expect(() => fertilizerAmount({ grade, target: wanted, acres: plotAcres })).toThrow(RangeError);
          return;
        }
        const result = fertilizerAmount({ grade, target: wanted, acres: plotAcres });
        for (const key of ['n', 'p2o5', 'k2o'] as const) {
          const goal = wanted[key];
          if (goal !== undefined) expect(result.supplied[key]).toBeGreaterThanOrEqual(goal * (1 - 1e-12));
        }
        expect(result.bags * 50).toBeGreaterThanOrEqual(result.totalLb * (1 - 1e-9));
      }),
    );
  });
});
