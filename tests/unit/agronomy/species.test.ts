// Species catalog and blend profile, checked against the published numbers each value claims as its source.
import { describe, expect, it } from 'vitest';
import { blendProfile, getSpecies, SPECIES, type Sourced, type Species } from '@/lib/agronomy/species';

function sourcedFields(species: Species): [string, Sourced<unknown>][] {
  return Object.entries(species).filter(
    (entry): entry is [string, Sourced<unknown>] =>
      typeof entry[1] === 'object' && entry[1] !== null && 'value' in entry[1] && 'source' in entry[1],
  );
}

describe('catalog', () => {
  it('holds at least 14 species, including the ones food plots are built from', () => {
    expect(SPECIES.length).toBeGreaterThanOrEqual(14);
    for (const id of [
      'white-clover', 'red-clover', 'crimson-clover', 'alfalfa', 'chicory', 'forage-rape', 'turnip', 'forage-radish',
      'cereal-rye', 'winter-wheat', 'oats', 'soybeans', 'cowpeas', 'corn', 'buckwheat',
    ]) {
      expect(getSpecies(id).id).toBe(id);
    }
  });

  it('uses unique kebab-case ids and generic names (no trademark signs)', () => {
    const ids = SPECIES.map((s) => s.id);
    expect(new Set(ids).size).toBe(ids.length);
    for (const s of SPECIES) {
      expect(s.id).toMatch(/^[a-z]+(-[a-z]+)*$/);
      expect(s.name).not.toMatch(/[®™©]/);
    }
  });

  it('gives every value a non-empty source', () => {
    for (const species of SPECIES) {
      const fields = sourcedFields(species);
      expect(fields.length).toBeGreaterThanOrEqual(10);
      for (const [name, field] of fields) expect(field.source.trim().length, `${species.id}.${name}`).toBeGreaterThan(0);
    }
  });

  it('keeps ranges ordered and positive', () => {
    for (const species of SPECIES) {
      for (const [name, field] of sourcedFields(species)) {
        if (!Array.isArray(field.value)) continue;
        const [low, high] = field.value as [number, number];
        expect(low, `${species.id}.${name}`).toBeGreaterThan(0);
        expect(low, `${species.id}.${name}`).toBeLessThanOrEqual(high);
      }
      expect(species.optimumSoilTempF.value[0]).toBeGreaterThanOrEqual(species.minSoilTempF.value);
    }
  });

  it('seeding rates match the Alabama DCNR deer manual forage appendix (citing Ball et al.) and MSU Extension M1591', () => {
    // White clover: 4–6 broadcast, 3–4 drilled (Alabama, citing Ball et al.); 8 broadcast, 4 drilled (MSU M1591,
    // Deer Food Plot Planting Guide for the Southeast); 3–4 (UF/IFAS Taylor County table). The range spans the guides.
    expect(getSpecies('white-clover').broadcastRateLbPerAcre.value).toEqual([4, 8]);
    expect(getSpecies('white-clover').broadcastRateLbPerAcre.source).toMatch(/Alabama.*M1591/);
    expect(getSpecies('white-clover').drilledRateLbPerAcre.value).toEqual([3, 4]);
    expect(getSpecies('red-clover').broadcastRateLbPerAcre.value).toEqual([12, 15]);
    expect(getSpecies('red-clover').drilledRateLbPerAcre.value).toEqual([6, 8]);
    expect(getSpecies('winter-wheat').broadcastRateLbPerAcre.value).toEqual([90, 120]);
    expect(getSpecies('winter-wheat').drilledRateLbPerAcre.value).toEqual([50, 80]);
    // Oats: 80–100 broadcast (Alabama, citing Ball et al.), 96–128 (UF/IFAS Taylor County), 120–150 broadcast and
    // 90–100 drilled (MSU M1591): the broadcast range spans the guides.
    expect(getSpecies('oats').broadcastRateLbPerAcre.value).toEqual([80, 150]);
    expect(getSpecies('oats').drilledRateLbPerAcre.value).toEqual([90, 100]);
    expect(getSpecies('oats').seedDepthIn.value).toEqual([1, 2]); // UF/IFAS Taylor County: oats for forage 1–2 in
    expect(getSpecies('forage-rape').broadcastRateLbPerAcre.value).toEqual([10, 12]);
    expect(getSpecies('cowpeas').broadcastRateLbPerAcre.value).toEqual([40, 90]);
    expect(getSpecies('winter-wheat').broadcastRateLbPerAcre.source).toMatch(/Alabama/);
  });

  it('crimson clover: 22–30 broadcast, 15–18 drilled, 6–8 weeks before first frost (MSU Extension / UGA)', () => {
    const crimson = getSpecies('crimson-clover');
    expect(crimson.broadcastRateLbPerAcre.value).toEqual([22, 30]);
    expect(crimson.drilledRateLbPerAcre.value).toEqual([15, 18]);
    expect(crimson.fallWeeksBeforeFirstFrost.value).toBeGreaterThanOrEqual(6);
    expect(crimson.fallWeeksBeforeFirstFrost.value).toBeLessThanOrEqual(8);
  });

  it('cereal rye: germinates as low as 34 °F; 90–160 broadcast, 60–120 drilled (SARE, Managing Cover Crops Profitably)', () => {
    const rye = getSpecies('cereal-rye');
    expect(rye.minSoilTempF.value).toBe(34);
    expect(rye.minSoilTempF.source).toMatch(/SARE/);
    expect(rye.broadcastRateLbPerAcre.value).toEqual([90, 160]);
    expect(rye.drilledRateLbPerAcre.value).toEqual([60, 120]);
  });

  it('soil temperature minimums: NDSU (wheat 40, oats 45, corn and soybeans 50), Cornell buckwheat 65, SARE cowpeas 65', () => {
    expect(getSpecies('winter-wheat').minSoilTempF.value).toBe(40);
    expect(getSpecies('oats').minSoilTempF.value).toBe(45);
    expect(getSpecies('corn').minSoilTempF.value).toBe(50);
    expect(getSpecies('soybeans').minSoilTempF.value).toBe(50);
    expect(getSpecies('corn').minSoilTempF.source).toMatch(/NDSU/);
    expect(getSpecies('buckwheat').minSoilTempF.value).toBe(65);
    expect(getSpecies('buckwheat').minSoilTempF.source).toMatch(/Cornell/);
    expect(getSpecies('cowpeas').minSoilTempF.value).toBe(65);
  });

  it('NDSU: optimum soil temperature 5–10 °F above the minimum', () => {
    for (const id of ['winter-wheat', 'oats', 'corn', 'soybeans']) {
      const species = getSpecies(id);
      expect(species.optimumSoilTempF.value).toEqual([species.minSoilTempF.value + 5, species.minSoilTempF.value + 10]);
    }
  });

  it('alfalfa: germination begins near 40 °F, about 8 weeks before a killing frost (NDSU / University of Minnesota)', () => {
    expect(getSpecies('alfalfa').minSoilTempF.value).toBe(40);
    expect(getSpecies('alfalfa').fallWeeksBeforeFirstFrost.value).toBe(8);
  });

  it('Ohio State Extension fact sheets: turnip and radish 45 °F, red clover 41 °F, crimson 42 °F; turnip 1.5–2 lb/acre', () => {
    expect(getSpecies('turnip').minSoilTempF.value).toBe(45); // ANR-0124
    expect(getSpecies('forage-radish').minSoilTempF.value).toBe(45); // ANR-0125
    expect(getSpecies('red-clover').minSoilTempF.value).toBe(41); // ANR-0132
    expect(getSpecies('crimson-clover').minSoilTempF.value).toBe(42); // ANR-0129
    expect(getSpecies('turnip').drilledRateLbPerAcre.value).toEqual([1.5, 2]); // OSU Extension (Penrose)
    expect(getSpecies('red-clover').seedsPerLb.value).toBe(272_200); // ANR-0132
    expect(getSpecies('crimson-clover').seedsPerLb.value).toBe(149_700); // ANR-0129
    // ANR-0132: red clover "may also be frost-seeded"; ANR-0129: crimson "does not frost-seed well".
    expect(getSpecies('red-clover').frostSeedable).toBe(true);
    expect(getSpecies('crimson-clover').frostSeedable).toBe(false);
  });

  it('warm-season crops are frost-tender (common knowledge; sources marked in the catalog)', () => {
    for (const id of ['soybeans', 'cowpeas', 'corn', 'buckwheat']) {
      expect(getSpecies(id).season).toBe('warm');
      expect(getSpecies(id).frostTolerance.value).toBe('tender');
    }
  });

  it('expected stands follow from rate × seeds per lb ÷ 43,560 ft² × 30–60 % establishment (derived)', () => {
    // White clover: 6 lb (midpoint of 4–8) × 800,000 seeds ÷ 43,560 ft² = 110.2 seeds/ft²; × 0.3 = 33.1, × 0.6 = 66.1.
    expect(getSpecies('white-clover').expectedStandPlantsPerSqFt.value).toEqual([33.1, 66.1]);
    // Wheat: 105 lb × 15,000 ÷ 43,560 = 36.2 seeds/ft² → 10.8–21.7.
    expect(getSpecies('winter-wheat').expectedStandPlantsPerSqFt.value).toEqual([10.8, 21.7]);
    expect(getSpecies('white-clover').expectedStandPlantsPerSqFt.source).toMatch(/derived/);
  });

  it('getSpecies names the unknown id', () => {
    expect(() => getSpecies('kudzu')).toThrow(/Unknown species "kudzu"/);
  });
});

describe('blendProfile', () => {
  it('clover + chicory + brassica: the highest minimum soil temperature limits it, the rate is the weighted sum', () => {
    const profile = blendProfile([
      { speciesId: 'white-clover', share: 0.5 },
      { speciesId: 'chicory', share: 0.5 },
      { speciesId: 'turnip', share: 0.5 },
    ]);
    // Minimums: white clover 40 (from memory), chicory 40 (from memory), turnip 45 (OSU ANR-0124) → 45, turnip.
    expect(profile.minSoilTempF).toBe(45);
    expect(profile.limitingSpeciesId).toBe('turnip');
    // Broadcast midpoints: white clover 6 (4–8: Alabama DCNR/Ball, MSU M1591), chicory 4.5, turnip 3.5 (OSU ANR-0124 3–4).
    expect(profile.broadcastRateLbPerAcre).toBeCloseTo(0.5 * 6 + 0.5 * 4.5 + 0.5 * 3.5, 12);
    // Drilled midpoints: 3.5 (Alabama DCNR/Ball 3–4), 3.5, 1.75 (OSU 1.5–2).
    expect(profile.drilledRateLbPerAcre).toBeCloseTo(0.5 * 3.5 + 0.5 * 3.5 + 0.5 * 1.75, 12);
    expect(profile.season).toBe('cool');
    expect(profile.frostTender).toBe(false);
    expect(profile.fallWeeksBeforeFirstFrost).toBe(8);
  });

  it('agrees with the catalog for any blend: max minimum, weighted sums, slowest emergence, any tender', () => {
    const parts = [
      { speciesId: 'cereal-rye', share: 0.4 },
      { speciesId: 'crimson-clover', share: 0.3 },
      { speciesId: 'forage-radish', share: 0.2 },
      { speciesId: 'buckwheat', share: 0.25 },
    ];
    const profile = blendProfile(parts);
    const members = parts.map((p) => ({ s: getSpecies(p.speciesId), share: p.share }));
    const mid = ([a, b]: [number, number]) => (a + b) / 2;
    expect(profile.minSoilTempF).toBe(Math.max(...members.map((m) => m.s.minSoilTempF.value)));
    expect(profile.limitingSpeciesId).toBe('buckwheat'); // 65 °F, Cornell
    expect(profile.broadcastRateLbPerAcre).toBeCloseTo(
      members.reduce((sum, m) => sum + m.share * mid(m.s.broadcastRateLbPerAcre.value), 0),
      12,
    );
    expect(profile.daysToEmergence).toEqual([
      Math.max(...members.map((m) => m.s.daysToEmergence.value[0])),
      Math.max(...members.map((m) => m.s.daysToEmergence.value[1])),
    ]);
    expect(profile.fallWeeksBeforeFirstFrost).toBe(Math.max(...members.map((m) => m.s.fallWeeksBeforeFirstFrost.value)));
    expect(profile.frostTender).toBe(true);
    expect(profile.season).toBe('mixed');
    expect(profile.expectedStandPlantsPerSqFt[0]).toBeCloseTo(
      members.reduce((sum, m) => sum + m.share * m.s.expectedStandPlantsPerSqFt.value[0], 0),
      12,
    );
  });

  it('optimum band is where every species is at its optimum, or collapses to the highest low', () => {
    // Turnip 60–105 (Harrington) and radish 45–90 (Harrington) overlap at 60–90.
    expect(blendProfile([{ speciesId: 'turnip', share: 1 }, { speciesId: 'forage-radish', share: 1 }]).optimumSoilTempF).toEqual([
      60, 90,
    ]);
    // Wheat 45–50 (NDSU rule) and turnip 60–105 do not overlap → [60, 60].
    expect(blendProfile([{ speciesId: 'winter-wheat', share: 1 }, { speciesId: 'turnip', share: 1 }]).optimumSoilTempF).toEqual([
      60, 60,
    ]);
  });

  it('refuses empty blends, unknown species and shares outside (0, 1]', () => {
    expect(() => blendProfile([])).toThrow(/at least one species/);
    expect(() => blendProfile([{ speciesId: 'kudzu', share: 0.5 }])).toThrow(/Unknown species/);
    expect(() => blendProfile([{ speciesId: 'oats', share: 0 }])).toThrow(/more than 0 and at most 1/);
    expect(() => blendProfile([{ speciesId: 'oats', share: -0.2 }])).toThrow(/Oats/);
    expect(() => blendProfile([{ speciesId: 'oats', share: 1.5 }])).toThrow(/got 1.5/);
    expect(() => blendProfile([{ speciesId: 'oats', share: Number.NaN }])).toThrow(Error);
    expect(() =>
      blendProfile([
        { speciesId: 'oats', share: 0.5 },
        { speciesId: 'oats', share: 0.5 },
      ]),
    ).toThrow(/twice/);
  });
});
