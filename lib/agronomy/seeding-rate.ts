// How many pounds of seed an acre gets, by how the seed goes in. With the bag's own label rate (what the bag
// says it covers) the trade works from that; without one Sowcast stays inside the published broadcast range
// of each species and never doubles past it. Frost seeding thickens a stand at the published frost rates.
import type { PlantingMethod } from './quantities';
import { plainName } from './seed-cover';
import { blendProfile, getSpecies, type BlendPart, type Species } from './species';

/** What the seed bag's label says it covers: `lb` of this seed plants `acres`. */
export interface SeedBagLabel {
  lb: number;
  acres: number;
}

export interface SeedingRateParams {
  /** Spray-and-seed into standing, dying cover: multiple of the bag's label rate. */
  sprayAndSeedBagMultiplier: number;
  /** Broadcast onto a prepared seedbed: multiple of the bag's label rate. */
  preparedSeedbedBagMultiplier: number;
  /** Without a bag: where in the published broadcast range (0 = low end, 1 = top) each method sows. */
  sprayAndSeedRangePosition: number;
  preparedSeedbedRangePosition: number;
  /** Frost seeding a species with no published frost rate: position in its drilled range. */
  frostFallbackDrilledPosition: number;
}

export const SEEDING_RATE_DEFAULTS: SeedingRateParams = {
  sprayAndSeedBagMultiplier: 2,
  preparedSeedbedBagMultiplier: 1.1,
  sprayAndSeedRangePosition: 1,
  preparedSeedbedRangePosition: 0.5,
  frostFallbackDrilledPosition: 0,
};

export const SEEDING_RATE_SOURCES: Record<keyof SeedingRateParams, string> = {
  sprayAndSeedBagMultiplier:
    'common practice, no source: seed broadcast into standing, dying cover without soil work loses seed to poor soil contact, ' +
    "drying and birds, so the trade sows twice the bag's label rate (the label rate is for a prepared seedbed)",
  preparedSeedbedBagMultiplier:
    "Sowcast's rule, no source: broadcast by hand or spinner on a prepared seedbed lies less evenly than a drill, so a little over " +
    'the label rate (×1.1). Published broadcast ranges run well above drilled ones (white clover 4–8 against 3–4, wheat 90–120 ' +
    'against 50–80: Alabama DCNR citing Ball et al.; MSU Extension M1591), so 10 % over a label rate stays modest',
  sprayAndSeedRangePosition:
    'without a bag rate: the top of the published broadcast range, never more — the guides give broadcast rates for a ' +
    "worked seedbed, and doubling them (the bag-rate habit) runs past every published range (Sowcast's rule)",
  preparedSeedbedRangePosition: "without a bag rate: the middle of the published broadcast range (Sowcast's rule)",
  frostFallbackDrilledPosition:
    "Sowcast's rule, no source: a species with no published frost-seeding rate gets the low end of its drilled range, the least " +
    'a planting guide sows; frost seeding is for clovers (University of Kentucky and University of Missouri Extension)',
};

export type SeedingRateBasis = 'bag' | 'published-broadcast' | 'published-frost' | 'drilled-fallback';

export interface SpeciesSeedingRate {
  speciesId: string;
  name: string;
  share: number;
  ratePerAcreLb: number;
  basis: SeedingRateBasis;
  source: string;
}

export interface SeedingRate {
  ratePerAcreLb: number;
  basis: SeedingRateBasis;
  /** How the rate was chosen, in the words the seed step's carry line uses. */
  how: string;
  parts: SpeciesSeedingRate[];
  /** Things a person should know about this rate (a bag rate past the published range, a species that does not frost-seed). */
  notes: string[];
}

const at = ([low, high]: [number, number], position: number) => low + (high - low) * position;
const lb = (x: number) => (Math.round(x * 10) / 10).toLocaleString('en-US');
const range = ([low, high]: [number, number]) => (low === high ? `${lb(low)}` : `${lb(low)}–${lb(high)}`);

export function seedBagRatePerAcreLb(bag: SeedBagLabel): number {
  for (const [value, what] of [
    [bag?.lb, "Seed on the bag's label (lb)"],
    [bag?.acres, "Acres the bag's label covers"],
  ] as const) {
    if (typeof value !== 'number' || !Number.isFinite(value) || value <= 0) {
      throw new RangeError(`${what} must be a number greater than 0 (got ${value}).`);
    }
  }
  return bag.lb / bag.acres;
}

function frostRate(species: Species, p: SeedingRateParams): { ratePerAcreLb: number; basis: SeedingRateBasis; source: string } {
  if (species.frostSeedingRateLbPerAcre) {
    const [low, high] = species.frostSeedingRateLbPerAcre.value;
    return { ratePerAcreLb: (low + high) / 2, basis: 'published-frost', source: species.frostSeedingRateLbPerAcre.source };
  }
  return {
    ratePerAcreLb: at(species.drilledRateLbPerAcre.value, p.frostFallbackDrilledPosition),
    basis: 'drilled-fallback',
    source: `${SEEDING_RATE_SOURCES.frostFallbackDrilledPosition}; drilled rate: ${species.drilledRateLbPerAcre.source}`,
  };
}

/**
 * The seeding rate of a blend (lb/acre) and of each of its species. Each part sows its share of its own
 * pure-stand rate; with a bag rate the whole blend is the bag, split between the species in the blend's
 * proportions.
 */
export function seedingRate(
  parts: BlendPart[],
  method: PlantingMethod,
  seedBag?: SeedBagLabel | null,
  p: SeedingRateParams = SEEDING_RATE_DEFAULTS,
): SeedingRate {
  const profile = blendProfile(parts);
  const members = profile.parts.map((part) => ({ species: getSpecies(part.speciesId), share: part.share }));
  const notes: string[] = [];

  if (method === 'frost-seeding') {
    const rates = members.map(({ species, share }) => {
      const r = frostRate(species, p);
      if (r.basis === 'drilled-fallback') {
        notes.push(
          `${species.name} has no published frost-seeding rate${species.frostSeedable ? '' : ' and is not known to frost-seed well'}; ` +
            `Sowcast sows the low end of its drilled rate (${lb(r.ratePerAcreLb)} lb/acre).`,
        );
      }
      return { speciesId: species.id, name: species.name, share, ratePerAcreLb: share * r.ratePerAcreLb, basis: r.basis, source: r.source };
    });
    const total = rates.reduce((sum, r) => sum + r.ratePerAcreLb, 0);
    const published = members.filter(({ species }) => species.frostSeedingRateLbPerAcre);
    const how =
      published.length === members.length
        ? `${lb(total)} lb/acre: the published frost-seeding rate (${members
            .map(({ species }) => `${plainName(species)} ${range(species.frostSeedingRateLbPerAcre!.value)} lb/acre`)
            .join(', ')}), middle of the range`
        : `${lb(total)} lb/acre for frost seeding into the existing stand`;
    return { ratePerAcreLb: total, basis: rates.every((r) => r.basis === 'published-frost') ? 'published-frost' : 'drilled-fallback', how, parts: rates, notes };
  }

  const position = method === 'spray-and-seed' ? p.sprayAndSeedRangePosition : p.preparedSeedbedRangePosition;
  const published = members.map(({ species, share }) => ({
    species,
    share,
    ratePerAcreLb: share * at(species.broadcastRateLbPerAcre.value, position),
  }));
  const publishedTotal = published.reduce((sum, x) => sum + x.ratePerAcreLb, 0);
  const publishedMaxLb = members.reduce((sum, { species, share }) => sum + share * species.broadcastRateLbPerAcre.value[1], 0);

  if (seedBag) {
    const bagRate = seedBagRatePerAcreLb(seedBag);
    const multiplier = method === 'spray-and-seed' ? p.sprayAndSeedBagMultiplier : p.preparedSeedbedBagMultiplier;
    const total = bagRate * multiplier;
    const source = method === 'spray-and-seed' ? SEEDING_RATE_SOURCES.sprayAndSeedBagMultiplier : SEEDING_RATE_SOURCES.preparedSeedbedBagMultiplier;
    const how =
      method === 'spray-and-seed'
        ? `${multiplier}× the bag rate of ${lb(bagRate)} lb/acre — common practice for seed broadcast into dying cover`
        : `${multiplier}× the bag rate of ${lb(bagRate)} lb/acre — a little over it for seed broadcast on a prepared seedbed (Sowcast's rule, no source)`;
    if (total > publishedMaxLb * (1 + 1e-9)) {
      notes.push(
        `${lb(total)} lb/acre is more than the published broadcast rate of this blend as a pure stand (${lb(publishedMaxLb)} lb/acre at most); ` +
          'that is the usual result of sowing twice a label rate — check what the bag holds.',
      );
    }
    // The bag is the blend: its pounds split as the blend's shares of each species' broadcast midpoint.
    const weights = members.map(({ species, share }) => share * at(species.broadcastRateLbPerAcre.value, 0.5));
    const weightTotal = weights.reduce((sum, w) => sum + w, 0);
    return {
      ratePerAcreLb: total,
      basis: 'bag',
      how,
      parts: members.map(({ species, share }, i) => ({
        speciesId: species.id,
        name: species.name,
        share,
        ratePerAcreLb: (total * weights[i]) / weightTotal,
        basis: 'bag' as const,
        source: `${source}; split in the blend's proportions`,
      })),
      notes,
    };
  }

  const where = method === 'spray-and-seed' ? 'the top of' : 'the middle of';
  const why = method === 'spray-and-seed' ? ' for seed broadcast into dying cover, never doubled past it' : '';
  const rangeWords =
    members.length === 1
      ? `${range(members[0].species.broadcastRateLbPerAcre.value)} lb/acre`
      : members.map(({ species, share }) => `${plainName(species)} ${share} × ${range(species.broadcastRateLbPerAcre.value)}`).join(', ');
  return {
    ratePerAcreLb: publishedTotal,
    basis: 'published-broadcast',
    how: `${lb(publishedTotal)} lb/acre: ${where} the published broadcast range (${rangeWords})${why}`,
    parts: published.map(({ species, share, ratePerAcreLb }) => ({
      speciesId: species.id,
      name: species.name,
      share,
      ratePerAcreLb,
      basis: 'published-broadcast' as const,
      source: species.broadcastRateLbPerAcre.source,
    })),
    notes,
  };
}
