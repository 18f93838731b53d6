// Seed depth, cover and inoculant. Depths from UF/IFAS Extension (Taylor County food plot table: oats, wheat and
// rye 1–2 in; white clover 0–¼ in) and Penn State Extension (white clover: no deeper than ¼ in; cultipack before
// and after seeding); inoculant from UF/IFAS Extension SS-AGR-28 ("inoculation of legumes is very important …
// many clovers and alfalfas come pre-inoculated") and MSU Extension M1591 (inoculant group per legume).
import { describe, expect, it } from 'vitest';
import {
  cultipackAdvice,
  inoculantReminders,
  isLargeSeed,
  largeSeedIn,
  needsInoculant,
  SEED_COVER_SOURCES,
  uncoveredLargeSeedWarning,
} from '@/lib/agronomy/seed-cover';
import { getSpecies, SPECIES } from '@/lib/agronomy/species';
import { coversSeed } from '@/lib/schedule/methods';
import { planPlanting } from '@/lib/schedule/plan';
import { localNoon } from '../schedule/forecast-fixture';
import { planting, step } from '../schedule/plantings';

const pure = (speciesId: string) => [{ speciesId, share: 1 }];
const NOW = localNoon('2027-08-01');

describe('large seed', () => {
  it('oats, wheat, rye (1–2 in, UF/IFAS), peas, soybeans, cowpeas and corn are large seed; clovers, brassicas, chicory and alfalfa are not', () => {
    for (const id of ['oats', 'winter-wheat', 'cereal-rye', 'austrian-winter-peas', 'soybeans', 'cowpeas', 'corn']) {
      expect(isLargeSeed(getSpecies(id)), id).toBe(true);
    }
    for (const id of ['white-clover', 'red-clover', 'crimson-clover', 'turnip', 'forage-rape', 'chicory', 'alfalfa']) {
      expect(isLargeSeed(getSpecies(id)), id).toBe(false);
    }
    // Large seed is also few seeds per pound: every large-seeded species has under 20,000 seeds/lb, every small one
    // over 30,000 (the catalog's counts, e.g. red clover 272,200 and crimson clover 149,700, OSU ANR-0132/0129).
    for (const s of SPECIES) expect(isLargeSeed(s) ? s.seedsPerLb.value < 20_000 : s.seedsPerLb.value > 30_000, s.id).toBe(true);
    expect(SEED_COVER_SOURCES.largeSeedMinDepthIn).toMatch(/UF\/IFAS/);
  });

  it('large seed broadcast with nothing to cover it is warned about, in plain words', () => {
    const warning = uncoveredLargeSeedWarning(pure('oats'), false);
    expect(warning).toMatch(/^Oats is large seed that belongs under the soil \(oats 1–2 in\)/);
    expect(warning).toMatch(/light disk, a drag or a cultipacker/);
    expect(uncoveredLargeSeedWarning(pure('oats'), true)).toBeNull();
    expect(uncoveredLargeSeedWarning(pure('white-clover'), false)).toBeNull();
  });

  it('spray-and-seed with large seed gets the cover step; refusing it leaves the warning on the seed step', () => {
    const oats = planting({ method: 'spray-and-seed', cover: 'grass-weeds', blend: pure('oats'), coverSeed: undefined });
    expect(coversSeed(oats)).toBe(true);
    const plan = planPlanting(oats, null, NOW);
    expect(plan.steps.map((s) => s.key)).toContain('cover-seed');
    expect(step(plan, 'seed').warnings.join(' ')).not.toMatch(/large seed/);
    expect(step(plan, 'cover-seed').reason).toMatch(/to bury the oats — large seed belongs under the soil; a drag or a light disk/);
    // Clover alone into standing cover needs no cover step (frost, rain and the dying cover settle small seed).
    expect(coversSeed(planting({ method: 'spray-and-seed', cover: 'grass-weeds', coverSeed: undefined }))).toBe(false);
    const refused = planPlanting({ ...oats, coverSeed: false }, null, NOW);
    expect(refused.steps.map((s) => s.key)).not.toContain('cover-seed');
    expect(step(refused, 'seed').warnings.join(' ')).toMatch(/Oats is large seed/);
  });

  it('names every large-seeded species of a blend', () => {
    const blend = [
      { speciesId: 'white-clover', share: 0.3 },
      { speciesId: 'oats', share: 0.5 },
      { speciesId: 'austrian-winter-peas', share: 0.3 },
    ];
    expect(largeSeedIn(blend).map((s) => s.id)).toEqual(['oats', 'austrian-winter-peas']);
    expect(uncoveredLargeSeedWarning(blend, false)).toMatch(/^Oats and austrian winter peas are large seed/);
  });
});

describe('small seed on a prepared seedbed', () => {
  it('cultipack before and after, no deeper than ¼ in (Penn State Extension, White Clover Establishment)', () => {
    expect(SEED_COVER_SOURCES.smallSeed).toMatch(/Penn State/);
    expect(cultipackAdvice(pure('white-clover'))).toBe(
      'White clover is small seed: cultipack before seeding for a firm seedbed and again after to press the seed in; it belongs no deeper than about ¼ in, so do not disk it under.',
    );
    expect(cultipackAdvice(pure('oats'))).toBeNull();
    const seed = step(planPlanting(planting(), null, NOW), 'seed');
    expect(seed.quantities.find((q) => q.item === 'cultipacker')?.detail).toMatch(/cultipack before seeding/);
    // Not on a spray-and-seed plot: there is no seedbed to firm.
    const sprayed = step(planPlanting(planting({ method: 'spray-and-seed', cover: 'grass-weeds' }), null, NOW), 'seed');
    expect(sprayed.quantities.some((q) => q.item === 'cultipacker')).toBe(false);
  });
});

describe('inoculant', () => {
  it('every clover and legume of the catalog gets the reminder; brassicas, grains and chicory do not (UF/IFAS SS-AGR-28)', () => {
    for (const s of SPECIES) expect(needsInoculant(s), s.id).toBe(s.kind === 'clover' || s.kind === 'legume');
    expect(SEED_COVER_SOURCES.inoculant).toMatch(/pre-inoculated/);
  });

  it('says which legume, how much seed, and that pre-inoculated seed needs none', () => {
    const lines = inoculantReminders(
      [
        { speciesId: 'white-clover', share: 0.5 },
        { speciesId: 'cereal-rye', share: 0.5 },
      ],
      new Map([
        ['white-clover', 2],
        ['cereal-rye', 40],
      ]),
    );
    expect(lines).toHaveLength(1);
    expect(lines[0].detail).toBe(
      'Inoculant made for white clover, enough for 2 lb of seed — unless the bag says pre-inoculated (legumes fix nitrogen only with their own rhizobia)',
    );
    const alfalfa = step(planPlanting(planting({ blend: pure('alfalfa') }), null, NOW), 'seed');
    expect(alfalfa.quantities.find((q) => q.item === 'inoculant')?.detail).toMatch(/^Inoculant made for alfalfa/);
  });
});
