// Seeding rates by how the seed goes in. Checks against published ranges, each named beside its check:
// Alabama DCNR deer management manual, forage appendix (citing Ball et al.); Mississippi State University
// Extension M1591, Deer Food Plot Planting Guide for the Southeast (drill and broadcast rates); SARE, Managing
// Cover Crops Profitably; frost-seeding rates from University of Kentucky and University of Missouri Extension
// (secondary: extension columns quoting the specialists; WVU Extension, Rayburn 1995, sows less red clover when
// over-seeding every year or two). The bag-rate rules
// are trade practice and marked so.
import { describe, expect, it } from 'vitest';
import { seedAmount } from '@/lib/agronomy/quantities';
import { SEEDING_RATE_DEFAULTS, SEEDING_RATE_SOURCES, seedBagRatePerAcreLb, seedingRate } from '@/lib/agronomy/seeding-rate';
import { SPECIES, getSpecies } from '@/lib/agronomy/species';

const pure = (speciesId: string) => [{ speciesId, share: 1 }];

describe('without a bag rate: inside the published broadcast range', () => {
  it('every catalog species: spray-and-seed sows the top of its broadcast range, never above it; a prepared seedbed the middle', () => {
    for (const species of SPECIES) {
      const [low, high] = species.broadcastRateLbPerAcre.value;
      const sprayed = seedingRate(pure(species.id), 'spray-and-seed');
      const worked = seedingRate(pure(species.id), 'prepared-seedbed');
      expect(sprayed.ratePerAcreLb, species.id).toBeCloseTo(high, 9);
      expect(sprayed.ratePerAcreLb, species.id).toBeLessThanOrEqual(high);
      expect(worked.ratePerAcreLb, species.id).toBeCloseTo((low + high) / 2, 9);
      expect(worked.ratePerAcreLb, species.id).toBeGreaterThanOrEqual(low);
      expect(sprayed.basis).toBe('published-broadcast');
      expect(species.broadcastRateLbPerAcre.source.length, species.id).toBeGreaterThan(10);
    }
  });

  it('the cases the review measured: cereal rye and crimson clover are no longer doubled past the published range', () => {
    // Cereal rye broadcast 90–160 lb/acre (SARE): at most 160, not 250.
    expect(seedingRate(pure('cereal-rye'), 'spray-and-seed').ratePerAcreLb).toBe(160);
    // Crimson clover broadcast 22–30 lb/acre (Michigan State University Extension / University of Georgia): 30, not 52.
    expect(seedingRate(pure('crimson-clover'), 'spray-and-seed').ratePerAcreLb).toBe(30);
    // White clover 4–8 broadcast (Alabama DCNR/Ball 4–6; MSU M1591 8).
    const clover = seedingRate(pure('white-clover'), 'spray-and-seed');
    expect(clover.ratePerAcreLb).toBe(8);
    expect(clover.how).toBe('8 lb/acre: the top of the published broadcast range (4–8 lb/acre) for seed broadcast into dying cover, never doubled past it');
  });

  it('oats follow the wildlife food plot guides: 80–150 broadcast (Alabama/Ball 80–100 … MSU M1591 120–150), 90–100 drilled (M1591)', () => {
    expect(seedingRate(pure('oats'), 'spray-and-seed').ratePerAcreLb).toBe(150);
    expect(seedingRate(pure('oats'), 'prepared-seedbed').ratePerAcreLb).toBe(115);
    expect(getSpecies('oats').drilledRateLbPerAcre.value).toEqual([90, 100]);
  });

  it('a blend sows each part at its share of its own rate', () => {
    // ½ white clover (top 8) + ½ cereal rye (top 160, SARE) → 4 + 80 = 84 lb/acre into standing cover.
    const blend = [
      { speciesId: 'white-clover', share: 0.5 },
      { speciesId: 'cereal-rye', share: 0.5 },
    ];
    const rate = seedingRate(blend, 'spray-and-seed');
    expect(rate.ratePerAcreLb).toBeCloseTo(84, 9);
    expect(rate.parts.map((p) => [p.speciesId, p.ratePerAcreLb])).toEqual([
      ['white-clover', 4],
      ['cereal-rye', 80],
    ]);
    // Prepared seedbed: ½ × 6 + ½ × 125 = 65.5.
    expect(seedingRate(blend, 'prepared-seedbed').ratePerAcreLb).toBeCloseTo(65.5, 9);
  });
});

describe('with the bag label rate', () => {
  it('the worked case: a half-acre of an 8.5 lb-per-acre clover bag, sprayed and seeded into the dying sod, is about one bag', () => {
    const rate = seedingRate(pure('white-clover'), 'spray-and-seed', { lb: 8.5, acres: 1 });
    // Twice the label rate into standing cover: common practice, no source — the source string says so.
    expect(SEEDING_RATE_DEFAULTS.sprayAndSeedBagMultiplier).toBe(2);
    expect(SEEDING_RATE_SOURCES.sprayAndSeedBagMultiplier).toMatch(/^common practice, no source/);
    expect(rate.ratePerAcreLb).toBe(17);
    expect(rate.basis).toBe('bag');
    expect(rate.how).toBe('2× the bag rate of 8.5 lb/acre — common practice for seed broadcast into dying cover');
    const seed = seedAmount({ ratePerAcreLb: rate.ratePerAcreLb, acres: 0.5, bagLb: 8.5 });
    expect(seed.pounds).toBeCloseTo(8.5, 12);
    expect(seed.bags).toBe(1);
  });

  it('a prepared seedbed sows a little over the label rate (×1.1, Sowcast’s rule — marked as having no source)', () => {
    expect(SEEDING_RATE_SOURCES.preparedSeedbedBagMultiplier).toMatch(/no source/);
    const rate = seedingRate(pure('white-clover'), 'prepared-seedbed', { lb: 25, acres: 5 });
    expect(rate.ratePerAcreLb).toBeCloseTo(5 * 1.1, 12);
    expect(rate.notes).toEqual([]); // 5.5 lb/acre is inside 4–8
  });

  it('says so when twice the label rate runs past the published broadcast maximum', () => {
    // 17 lb/acre of white clover against a published broadcast top of 8 (MSU M1591).
    const rate = seedingRate(pure('white-clover'), 'spray-and-seed', { lb: 8.5, acres: 1 });
    expect(rate.notes.join(' ')).toMatch(/17 lb\/acre is more than the published broadcast rate .* \(8 lb\/acre at most\)/);
  });

  it('splits a bag blend between its species in the blend’s proportions', () => {
    const blend = [
      { speciesId: 'white-clover', share: 0.5 },
      { speciesId: 'chicory', share: 0.5 },
    ];
    const rate = seedingRate(blend, 'spray-and-seed', { lb: 10, acres: 1 });
    expect(rate.ratePerAcreLb).toBe(20);
    const sum = rate.parts.reduce((total, p) => total + p.ratePerAcreLb, 0);
    expect(sum).toBeCloseTo(20, 9);
    // Proportions from the broadcast midpoints at their shares: clover 0.5 × 6 = 3, chicory 0.5 × 4.5 = 2.25.
    expect(rate.parts[0].ratePerAcreLb / rate.parts[1].ratePerAcreLb).toBeCloseTo(3 / 2.25, 9);
  });

  it('refuses a label that covers nothing', () => {
    expect(() => seedBagRatePerAcreLb({ lb: 8.5, acres: 0 })).toThrow(/Acres the bag's label covers/);
    expect(() => seedBagRatePerAcreLb({ lb: Number.NaN, acres: 1 })).toThrow(/Seed on the bag's label/);
  });
});

describe('frost seeding', () => {
  it('white clover 1–2 lb/acre and red clover 6–8 lb/acre (University of Kentucky Extension column; University of Missouri Extension, Roberts: red clover 8)', () => {
    expect(getSpecies('white-clover').frostSeedingRateLbPerAcre?.value).toEqual([1, 2]);
    expect(getSpecies('red-clover').frostSeedingRateLbPerAcre?.value).toEqual([6, 8]);
    const white = seedingRate(pure('white-clover'), 'frost-seeding');
    expect(white.ratePerAcreLb).toBe(1.5);
    expect(white.ratePerAcreLb).toBeLessThanOrEqual(2); // never above the published 1–2 lb/acre
    expect(white.basis).toBe('published-frost');
    expect(seedingRate(pure('red-clover'), 'frost-seeding').ratePerAcreLb).toBe(7);
    // A bag rate does not change a frost seeding: the published frost rates hold.
    expect(seedingRate(pure('white-clover'), 'frost-seeding', { lb: 8.5, acres: 1 }).ratePerAcreLb).toBe(1.5);
  });

  it('every frost-seedable species with a published frost rate stays inside it; the others get the low drilled rate and a note', () => {
    for (const species of SPECIES) {
      const rate = seedingRate(pure(species.id), 'frost-seeding');
      if (species.frostSeedingRateLbPerAcre) {
        const [low, high] = species.frostSeedingRateLbPerAcre.value;
        expect(rate.ratePerAcreLb).toBeGreaterThanOrEqual(low);
        expect(rate.ratePerAcreLb).toBeLessThanOrEqual(high);
        expect(rate.notes).toEqual([]);
      } else {
        expect(rate.ratePerAcreLb).toBe(species.drilledRateLbPerAcre.value[0]);
        expect(rate.basis).toBe('drilled-fallback');
        expect(rate.notes.join(' ')).toMatch(/no published frost-seeding rate/);
      }
    }
    // Crimson clover "does not frost-seed well" (Ohio State University Extension ANR-0129): the note says so.
    expect(seedingRate(pure('crimson-clover'), 'frost-seeding').notes.join(' ')).toMatch(/not known to frost-seed well/);
  });
});
