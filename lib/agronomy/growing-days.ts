// Growing days before a killing freeze: how many days of growth a young stand of each species needs between
// seeding and the freeze that kills it or ends its fall growth. Frost-tender species die at the first 32 °F
// freeze; hardy and half-hardy ones shrug off a light freeze, so what ends their fall is a hard freeze (28 °F),
// which comes days to weeks after the first frost. "From memory" and "common practice" mean what they say in
// species.ts: general extension guidance recalled, not checked against a publication.
import { SPECIES, getSpecies, type BlendPart, type Sourced } from './species';

/** The National Weather Service's freeze words: a freeze is 32 °F or colder, a hard freeze 28 °F or colder. */
export type KillingFreeze = 'freeze' | 'hard-freeze';

export const FREEZE_THRESHOLDS_F = { frost: 36, freeze: 32, hardFreeze: 28 } as const;

export const FREEZE_THRESHOLD_SOURCES: Record<keyof typeof FREEZE_THRESHOLDS_F, string> = {
  frost:
    'National Weather Service (Jackson MS and Tallahassee offices, first frost/freeze/hard freeze dates from NCDC 1981–2010 normals): ' +
    'a frost is counted at 36 °F, because frost forms at ground level while the air at 2 m is a few degrees above freezing',
  freeze: 'National Weather Service, same pages: a freeze is the first occurrence of 32 °F or colder; tender plants are killed',
  hardFreeze:
    'National Weather Service (Jackson MS office): a hard freeze is the first occurrence of 28 °F or colder (local criteria vary: ' +
    'the Tallahassee office warns at 25 °F); a moderate freeze of 25–28 °F is widely destructive to vegetation, a light freeze ' +
    'of 29–32 °F kills tender plants with little effect on others (the usual NOAA freeze classes, as the almanac tables repeat them; secondary)',
};

export interface GrowingDaysNeed {
  /** Days from seeding to the killing freeze that a young stand needs to establish (or make its crop). */
  growingDays: Sourced<number>;
  killedBy: Sourced<KillingFreeze>;
}

const MEMORY = 'from memory (general extension guidance, not checked against a publication)';
const COMMON = 'common practice, no source';
const MSU_UGA_CRIMSON =
  'Michigan State University Extension / University of Georgia: sow crimson clover 6–8 weeks before the average first frost (secondary); ' +
  'the low end, since a hardy clover is counted to the hard freeze that ends its fall';
const NDSU_UMN_ALFALFA = 'NDSU Extension / University of Minnesota Extension: alfalfa needs about 8 weeks of growth before a killing frost (secondary)';
const PERENNIAL_LIKE_ALFALFA = `${MEMORY}: a perennial seedling needs a crown and roots before winter; taken equal to alfalfa (${NDSU_UMN_ALFALFA})`;
const ANNUAL_CLOVER_LIKE_CRIMSON = `${MEMORY}: annual clovers taken equal to crimson (${MSU_UGA_CRIMSON})`;
const PENROSE_BRASSICAS =
  'Ohio State University Extension, Penrose (2003), Brassicas: maximum quality in as little as 60 days, maximum yield in 70–90; ' +
  'tops tolerate 15–20 °F, so a hard freeze, not the first frost, ends their fall';
const CORNELL_BUCKWHEAT = 'derived from Cornell University (Björkman): as a cover crop buckwheat is in the ground 35–40 days; rounded up to 6 weeks';
const HARDY = 'catalog frost tolerance (lib/agronomy/species.ts): survives light freezes, so its fall ends at a hard freeze';
const HALF_HARDY = 'catalog frost tolerance (lib/agronomy/species.ts): survives a light frost, killed by a hard freeze';
const TENDER = 'catalog frost tolerance (lib/agronomy/species.ts): frost-tender, killed by the first 32 °F freeze';

function need(growingDays: number, daysSource: string, killedBy: KillingFreeze, killedBySource: string): GrowingDaysNeed {
  return { growingDays: { value: growingDays, source: daysSource }, killedBy: { value: killedBy, source: killedBySource } };
}

/** Keyed by species id (lib/agronomy/species.ts); a test holds every catalog species to an entry. */
export const GROWING_DAYS_BEFORE_KILLING_FREEZE: Readonly<Record<string, GrowingDaysNeed>> = Object.freeze({
  'white-clover': need(56, PERENNIAL_LIKE_ALFALFA, 'hard-freeze', HARDY),
  'red-clover': need(56, PERENNIAL_LIKE_ALFALFA, 'hard-freeze', HARDY),
  'crimson-clover': need(42, MSU_UGA_CRIMSON, 'hard-freeze', HARDY),
  'arrowleaf-clover': need(42, ANNUAL_CLOVER_LIKE_CRIMSON, 'hard-freeze', HARDY),
  'berseem-clover': need(42, ANNUAL_CLOVER_LIKE_CRIMSON, 'hard-freeze', HALF_HARDY),
  alfalfa: need(56, NDSU_UMN_ALFALFA, 'hard-freeze', `${NDSU_UMN_ALFALFA}; NDSU: seedlings past two trifoliates die at 26 °F for 4 hours`),
  chicory: need(56, `${PERENNIAL_LIKE_ALFALFA}; Penn State warns late-summer seedings may not establish before winter`, 'hard-freeze', HARDY),
  'forage-rape': need(60, PENROSE_BRASSICAS, 'hard-freeze', PENROSE_BRASSICAS),
  turnip: need(60, PENROSE_BRASSICAS, 'hard-freeze', PENROSE_BRASSICAS),
  'forage-radish': need(42, `${MEMORY}: radish makes its root in about 6 weeks of fall growth`, 'hard-freeze', HALF_HARDY),
  'cereal-rye': need(14, `${COMMON}: rye still establishes when sown close to frost`, 'hard-freeze', HARDY),
  'winter-wheat': need(28, MEMORY, 'hard-freeze', HARDY),
  oats: need(42, MEMORY, 'hard-freeze', `${HALF_HARDY}; oats winter-kill in hard freezes (${MEMORY})`),
  'austrian-winter-peas': need(42, MEMORY, 'hard-freeze', HARDY),
  soybeans: need(70, `${MEMORY}: forage soybeans need about 10 weeks of summer growth to make a stand worth browsing`, 'freeze', TENDER),
  cowpeas: need(70, `${MEMORY}: about 10 weeks, like forage soybeans`, 'freeze', TENDER),
  corn: need(100, `${MEMORY}: grain needs about 100–120 days`, 'freeze', TENDER),
  'grain-sorghum': need(98, `${MEMORY}: grain needs about 14 weeks`, 'freeze', TENDER),
  buckwheat: need(42, CORNELL_BUCKWHEAT, 'freeze', TENDER),
});

export function growingDaysNeed(speciesId: string): GrowingDaysNeed {
  const found = GROWING_DAYS_BEFORE_KILLING_FREEZE[speciesId];
  if (!found) {
    throw new Error(`No growing days before a killing freeze are recorded for "${speciesId}". Known species: ${SPECIES.map((x) => x.id).join(', ')}.`);
  }
  return found;
}

export interface SpeciesFreezeNeed {
  speciesId: string;
  /** The catalog name in running text, without its type note: "crimson clover", "soybeans". */
  name: string;
  /** "soybeans need", "turnip needs". */
  needs: string;
  growingDays: number;
  killedBy: KillingFreeze;
}

/** Each species of a blend with the growing days it needs and the freeze that ends its fall. */
export function blendFreezeNeeds(parts: Pick<BlendPart, 'speciesId'>[]): SpeciesFreezeNeed[] {
  return parts.map(({ speciesId }) => {
    const species = getSpecies(speciesId);
    const { growingDays, killedBy } = growingDaysNeed(species.id);
    const name = species.name.replace(/\s*\(.*\)$/, '').toLowerCase();
    return { speciesId: species.id, name, needs: name.endsWith('s') ? 'need' : 'needs', growingDays: growingDays.value, killedBy: killedBy.value };
  });
}
