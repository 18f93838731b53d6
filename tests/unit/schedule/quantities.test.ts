// What to carry, in the plan. Half-acre spray-and-seed plot with a 4-gal backpack sprayer at 15 gal/acre:
// one fill covers 4/15 = 0.27 acre ("a little over a quarter acre"), so 0.5 acre × 15 = 7.5 gal needs two
// fills (derived). Seed into standing cover at twice the bag's label rate (common practice, no source; the
// issue) — or, with no bag rate, the top of the published broadcast range: white clover 4–8 lb/acre broadcast
// (Alabama DCNR citing Ball et al. 4–6; MSU Extension M1591 8). A 2 % solution is 0.02 × 128 = 2.56 fl oz per
// gallon (1 US gal = 128 US fl oz, NIST Handbook 44) → 10.24 fl oz per 4-gal fill.
// 20 lb N from 13-13-13 needs 20 / 0.13 = 153.8 lb/acre (Virginia Tech SPES-201 method).
import { describe, expect, it } from 'vitest';
import { planPlanting } from '@/lib/schedule/plan';
import { localNoon } from './forecast-fixture';
import { planting, step } from './plantings';

const NOW = localNoon('2027-08-01');
const halfAcre = planting({
  method: 'spray-and-seed',
  cover: 'grass-weeds',
  acres: 0.5,
  targetSeedDate: '2027-09-14',
  seedBagLb: 8.5,
  herbicide: { productName: 'Example burndown', rate: { percentSolution: 2 } },
  sprayer: { tankGal: 4, carrierGalPerAcre: 15 },
  fertilizer: { grade: [13, 13, 13], target: { n: 20 } },
  lime: { tonsPerAcre: 1 },
});

describe('quantities in the plan', () => {
  it('half an acre of an 8.5 lb-per-acre clover bag, sprayed and seeded into the dying sod, is one bag', () => {
    const bagged = { ...halfAcre, seedBag: { lb: 8.5, acres: 1 } };
    const sprayed = step(planPlanting(bagged, null, NOW), 'seed');
    // 2 × 8.5 lb/acre × 0.5 acre = 8.5 lb (common practice: twice the label rate into standing cover).
    expect(sprayed.quantities[0].amount).toBeCloseTo(8.5, 10);
    expect(sprayed.quantities[0].detail).toBe('8.5 lb of seed — 1 bag (2× the bag rate of 8.5 lb/acre — common practice for seed broadcast into dying cover)');
    // 17 lb/acre is past the published broadcast maximum for pure white clover (8, MSU M1591): the step says so.
    expect(sprayed.warnings.some((w) => /17 lb\/acre is more than the published broadcast rate/.test(w))).toBe(true);
    // On a prepared seedbed a little over the label rate (×1.1, Sowcast's rule): 8.5 × 1.1 × 0.5 = 4.675 lb.
    const worked = step(planPlanting({ ...bagged, method: 'prepared-seedbed' }, null, NOW), 'seed').quantities[0];
    expect(worked.amount).toBeCloseTo(8.5 * 1.1 * 0.5, 10);
    expect(worked.detail).toContain('1.1× the bag rate of 8.5 lb/acre');
  });

  it('without a bag rate stays inside the published broadcast range: top for spray-and-seed, middle on a prepared seedbed', () => {
    const sprayed = step(planPlanting(halfAcre, null, NOW), 'seed').quantities[0];
    const worked = step(planPlanting({ ...halfAcre, method: 'prepared-seedbed' }, null, NOW), 'seed').quantities[0];
    expect(sprayed.amount).toBeCloseTo(8 * 0.5, 10); // 8 lb/acre, the top of 4–8
    expect(worked.amount).toBeCloseTo(6 * 0.5, 10); // 6 lb/acre, the middle of 4–8
    expect(sprayed.detail).toBe(
      '4 lb of seed — 1 bag (8 lb/acre: the top of the published broadcast range (4–8 lb/acre) for seed broadcast into dying cover, never doubled past it)',
    );
  });

  it('needs two sprayer fills of 4 gal at 15 gal/acre for half an acre, 10.24 fl oz of product in each', () => {
    expect(4 / 15).toBeGreaterThan(0.25);
    const quantities = step(planPlanting(halfAcre, null, NOW), 'spray').quantities;
    const fills = quantities.find((q) => q.unit === 'fills')!;
    expect(fills.amount).toBe(2);
    // The line rounds for reading (10.24 → 10.2); the amount keeps the exact number.
    expect(fills.detail).toBe('2 sprayer fills of 4 gal, 10.2 fl oz of product in each (the last fill 3.5 gal, with proportionally less product)');
    const product = quantities.find((q) => q.item === 'Example burndown')!;
    expect(product.amount).toBeCloseTo(0.02 * 7.5 * 128, 10);
  });

  it('turns the fertilizer target into product and bags, and the lime into pounds and bags', () => {
    const plan = planPlanting(halfAcre, null, NOW);
    const fert = step(plan, 'fertilize').quantities[0];
    expect(fert.amount).toBeCloseTo((20 / 0.13) * 0.5, 6);
    expect(fert.detail.startsWith('76.9 lb of 13-13-13 — 2 bags')).toBe(true);
    const lime = step(plan, 'lime').quantities[0];
    // 1 short ton (2,000 lb) per acre on half an acre.
    expect(lime).toMatchObject({ amount: 1000, unit: 'lb', detail: '1,000 lb of lime — 20 bags' });
  });

  it('lists each species of a blend', () => {
    const plan = planPlanting({ ...halfAcre, blend: [{ speciesId: 'white-clover', share: 0.5 }, { speciesId: 'chicory', share: 0.5 }] }, null, NOW);
    const lines = step(plan, 'seed').quantities.map((q) => q.item);
    // The clover also gets its inoculant line (UF/IFAS SS-AGR-28: inoculate, or buy pre-inoculated seed).
    expect(lines).toEqual(['seed', 'White clover (ladino type)', expect.stringMatching(/chicory/i), 'inoculant']);
  });
});
