// The germination check's arithmetic: plants counted in a frame at a few spots → plants per ft², the stand
// the blend should give from its seeding rate, a verdict, and the share of the stand that is missing (what a
// reseeding has to make up). Pure: plain numbers in, numbers and readable reasons out.
import { BROADCAST_ESTABLISHMENT_FRACTION, blendProfile, getSpecies, type BlendPart, type Sourced } from './species';
import type { PlantingMethod } from './quantities';
import { seedingRate } from './seeding-rate';
import { SQ_FT_PER_ACRE } from './units';

export type StandVerdict = 'good' | 'fair' | 'poor';

export interface StandThresholds {
  /** A stand at or above this share of the low end of the expected range is good. */
  goodShareOfExpectedLow: number;
  /** At or above this share of the low end it is fair; below it, poor. */
  fairShareOfExpectedLow: number;
}

export const STAND_THRESHOLDS: StandThresholds = { goodShareOfExpectedLow: 1, fairShareOfExpectedLow: 0.5 };

export const STAND_SOURCES: Record<keyof StandThresholds, string> & {
  expected: string;
  establishment: string;
  frostSeeding: string;
  reseedShare: string;
} = {
  expected:
    'seeds per ft² = Σ share × broadcast rate (lb/acre, midpoint of the catalog range) × seeds per lb ÷ 43,560 ft² per acre ' +
    '(lib/agronomy/species.ts gives each rate and seed count with its source; 43,560 ft² per acre is the exact definition, NIST Handbook 44 App. C)',
  establishment: BROADCAST_ESTABLISHMENT_FRACTION.source,
  frostSeeding:
    'frost seeding sows the published frost-seeding rate (lib/agronomy/seeding-rate.ts), so the stand expected is what that seed gives. ' +
    'Spray-and-seed sows more than a prepared seedbed to make up for seed that never meets soil, so it expects the same stand as the broadcast midpoint.',
  goodShareOfExpectedLow:
    "Sowcast's rule, no source: a count at or above the low end of the expected range (30 % of seed making a plant) is a good stand",
  fairShareOfExpectedLow:
    'from memory (forage extension guides, e.g. alfalfa seeding-year stand counts: about 25 plants/ft² or more is a full new stand, ' +
    'and reseeding is advised below roughly 12–15 — about half; not checked against a publication): below half of the low end is poor',
  reseedShare:
    "Sowcast's rule, no source: reseed the missing share of the expected midpoint, at that share of each species' rate, rounded up to 5 %",
};

export interface ExpectedStand {
  /** Plants per ft² the blend should give: [low, high] from the establishment range, and the midpoint. */
  lowPerSqFt: number;
  highPerSqFt: number;
  midPerSqFt: number;
  /** Seeds per ft² the rate puts down. */
  seedsPerSqFt: number;
  /** One line per species, so a person can redo the sum. */
  species: { speciesId: string; name: string; ratePerAcreLb: number; seedsPerLb: number; seedsPerSqFt: number; source: string }[];
  source: string;
}

const midpoint = ([low, high]: [number, number]) => (low + high) / 2;

/**
 * The stand a blend should give from its seeding rate: seeds per lb × lb per acre ÷ 43,560 ft² × the share
 * of seed that establishes. A full seeding counts the broadcast midpoint (more seed sown into standing cover
 * makes up for losses); frost seeding counts its published frost-seeding rate.
 */
export function expectedStand(parts: BlendPart[], method: PlantingMethod, establishment: Sourced<[number, number]> = BROADCAST_ESTABLISHMENT_FRACTION): ExpectedStand {
  blendProfile(parts); // the same refusals as every other use of a blend (unknown species, bad share)
  const frost = method === 'frost-seeding' ? new Map(seedingRate(parts, method).parts.map((p) => [p.speciesId, p])) : null;
  const species = parts.map((part) => {
    const s = getSpecies(part.speciesId);
    const frostPart = frost?.get(s.id);
    const ratePerAcreLb = frostPart ? frostPart.ratePerAcreLb : part.share * midpoint(s.broadcastRateLbPerAcre.value);
    const seedsPerSqFt = (ratePerAcreLb * s.seedsPerLb.value) / SQ_FT_PER_ACRE;
    return {
      speciesId: s.id,
      name: s.name,
      ratePerAcreLb,
      seedsPerLb: s.seedsPerLb.value,
      seedsPerSqFt,
      source: `rate: ${frostPart ? frostPart.source : s.broadcastRateLbPerAcre.source}; seeds per lb: ${s.seedsPerLb.source}`,
    };
  });
  const seedsPerSqFt = species.reduce((sum, s) => sum + s.seedsPerSqFt, 0);
  const [low, high] = establishment.value;
  const notes = [STAND_SOURCES.expected, `establishment ${low * 100}–${high * 100} % (${establishment.source})`];
  if (method === 'frost-seeding') notes.push(STAND_SOURCES.frostSeeding);
  return {
    lowPerSqFt: seedsPerSqFt * low,
    highPerSqFt: seedsPerSqFt * high,
    midPerSqFt: seedsPerSqFt * ((low + high) / 2),
    seedsPerSqFt,
    species,
    source: notes.join('; '),
  };
}

/** Plants per ft²: the mean of the spots' counts ÷ the frame's area. */
export function plantsPerSqFt(counts: number[], frameSqFt: number): number {
  if (!Array.isArray(counts) || counts.length === 0) throw new RangeError('Count plants at one spot at least.');
  for (const c of counts) {
    if (!Number.isInteger(c) || c < 0) throw new RangeError(`A spot's count must be a whole number of plants, 0 or more (got ${c}).`);
  }
  if (!Number.isFinite(frameSqFt) || frameSqFt <= 0) throw new RangeError(`The frame's size must be more than 0 ft² (got ${frameSqFt}).`);
  const mean = counts.reduce((sum, c) => sum + c, 0) / counts.length;
  return mean / frameSqFt;
}

export interface StandJudgement {
  verdict: StandVerdict;
  /** Observed ÷ the expected midpoint. */
  shareOfExpected: number;
  /** The share of the expected midpoint that is missing, 0–1 (0 for a stand at or above it). */
  missingShare: number;
  reason: string;
}

const fmt = (x: number) => (x >= 10 ? x.toFixed(0) : x.toFixed(1));

export function judgeStand(observedPerSqFt: number, expected: Pick<ExpectedStand, 'lowPerSqFt' | 'highPerSqFt' | 'midPerSqFt'>, t: StandThresholds = STAND_THRESHOLDS): StandJudgement {
  if (!Number.isFinite(observedPerSqFt) || observedPerSqFt < 0) throw new RangeError(`Plants per ft² must be 0 or more (got ${observedPerSqFt}).`);
  const goodAt = expected.lowPerSqFt * t.goodShareOfExpectedLow;
  const fairAt = expected.lowPerSqFt * t.fairShareOfExpectedLow;
  const verdict: StandVerdict = observedPerSqFt >= goodAt ? 'good' : observedPerSqFt >= fairAt ? 'fair' : 'poor';
  const shareOfExpected = expected.midPerSqFt > 0 ? observedPerSqFt / expected.midPerSqFt : 1;
  const missingShare = Math.min(1, Math.max(0, 1 - shareOfExpected));
  const range = `${fmt(expected.lowPerSqFt)}–${fmt(expected.highPerSqFt)} plants per ft²`;
  const seen = `${fmt(observedPerSqFt)} plants per ft²`;
  const reason =
    verdict === 'good'
      ? `${seen}, within or above the ${range} the seeding rate should give`
      : verdict === 'fair'
        ? `${seen}, below the ${range} the seeding rate should give but at least half its low end (${fmt(fairAt)})`
        : `${seen}, less than half the low end (${fmt(fairAt)}) of the ${range} the seeding rate should give`;
  return { verdict, shareOfExpected, missingShare, reason };
}

/** The blend of a reseeding: each species at the missing share of its rate, rounded up to 5 %. */
export function reseedParts(parts: BlendPart[], missingShare: number): BlendPart[] {
  if (!(missingShare > 0)) throw new RangeError('Nothing is missing from the stand, so there is nothing to reseed.');
  const share = Math.min(1, Math.ceil(Math.min(1, missingShare) * 20 - 1e-9) / 20);
  return parts.map((p) => ({ speciesId: p.speciesId, share: Math.min(1, Math.round(p.share * share * 1000) / 1000 || 0.001) }));
}

/** Words for the 1–5 stand rating by eye. */
export const STAND_RATINGS: Record<1 | 2 | 3 | 4 | 5, { label: string; hint: string }> = {
  1: { label: 'Failed', hint: 'almost nothing came up' },
  2: { label: 'Thin', hint: 'patchy, wide bare gaps' },
  3: { label: 'Fair', hint: 'even but thin' },
  4: { label: 'Good', hint: 'even, a few gaps' },
  5: { label: 'Excellent', hint: 'thick and even' },
};
