// Seed depth and what it asks of the person seeding: large seed must be covered (a light disk or a drag),
// small seed wants a firm seedbed and pressing in (cultipack before and after), and legume seed needs the
// rhizobia made for it (pre-inoculated seed, or the right inoculant). Pure: species in, plain words out.
import { getSpecies, type BlendPart, type Species } from './species';

export interface SeedCoverParams {
  /** Seed whose published seeding depth starts at this depth or deeper is "large seed" that must be covered. */
  largeSeedMinDepthIn: number;
}

export const SEED_COVER_DEFAULTS: SeedCoverParams = { largeSeedMinDepthIn: 0.5 };

export const SEED_COVER_SOURCES: Record<keyof SeedCoverParams, string> & { smallSeed: string; inoculant: string } = {
  largeSeedMinDepthIn:
    "Sowcast's rule from the catalog's published depths: seed that belongs ½ in deep or deeper (oats, wheat and rye 1–2 in, " +
    'UF/IFAS Extension Taylor County food plot table; peas, soybeans, cowpeas, corn) does not get there by lying on the surface, ' +
    'so broadcast it only where it will be covered; clovers, brassicas, chicory and alfalfa go ¼–½ in or shallower',
  smallSeed:
    'Penn State Extension (Forages), White Clover Establishment: plant no deeper than ¼ in; a firm seedbed by cultipacking before ' +
    'seeding, and cultipacking after it, improves seed–soil contact and the stand',
  inoculant:
    'UF/IFAS Extension SS-AGR-28, A Walk on the Wild Side (cool-season wildlife food plots): inoculation of legumes is very important; ' +
    'many clovers and alfalfas come pre-inoculated, otherwise use the inoculant specific to the legume. UF/IFAS Taylor County: ' +
    '"always inoculate clover or purchase pre-inoculated varieties"; MSU Extension M1591 lists the inoculant group per legume',
};

const blendSpecies = (parts: BlendPart[]) => parts.map((p) => getSpecies(p.speciesId));

const depthWords = ([low, high]: [number, number]) => {
  const inches = (x: number) => (x === 0.125 ? '⅛' : x === 0.25 ? '¼' : x === 0.5 ? '½' : x === 0.75 ? '¾' : String(x));
  return `${inches(low)}–${inches(high)} in`;
};

/** "White clover (ladino type)" → "white clover", for use inside a sentence. */
export const plainName = (species: Species) => species.name.replace(/ \(.*\)$/, '').toLowerCase();

const nameList = (species: Species[]) => {
  const names = species.map(plainName);
  return names.length <= 1 ? names.join('') : `${names.slice(0, -1).join(', ')} and ${names[names.length - 1]}`;
};

const capitalised = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

export function isLargeSeed(species: Species, p: SeedCoverParams = SEED_COVER_DEFAULTS): boolean {
  return species.seedDepthIn.value[0] >= p.largeSeedMinDepthIn;
}

export function largeSeedIn(parts: BlendPart[], p: SeedCoverParams = SEED_COVER_DEFAULTS): Species[] {
  return blendSpecies(parts).filter((s) => isLargeSeed(s, p));
}

export function smallSeedIn(parts: BlendPart[], p: SeedCoverParams = SEED_COVER_DEFAULTS): Species[] {
  return blendSpecies(parts).filter((s) => !isLargeSeed(s, p));
}

/** Legumes fix nitrogen only with their own rhizobia. */
export function needsInoculant(species: Species): boolean {
  return species.kind === 'clover' || species.kind === 'legume';
}

/** The warning for large seed broadcast with nothing planned to cover it; null when there is none. */
export function uncoveredLargeSeedWarning(parts: BlendPart[], covered: boolean, p: SeedCoverParams = SEED_COVER_DEFAULTS): string | null {
  if (covered) return null;
  const large = largeSeedIn(parts, p);
  if (!large.length) return null;
  const depths = large.map((s) => `${plainName(s)} ${depthWords(s.seedDepthIn.value)}`).join(', ');
  return (
    `${capitalised(nameList(large))} ${large.length === 1 ? 'is' : 'are'} large seed that belongs under the soil (${depths}); ` +
    'broadcast and left on the surface, much of it dries out or feeds birds. Cover it right after broadcasting — a light disk, a drag or a cultipacker — or add the cover step.'
  );
}

/** Why the cover step is there, in the words of its reason: large seed is buried, small seed pressed in. */
export function coverPurpose(parts: BlendPart[], p: SeedCoverParams = SEED_COVER_DEFAULTS): string {
  const large = largeSeedIn(parts, p);
  if (!large.length) return 'for seed-to-soil contact';
  return `to bury the ${nameList(large)} — large seed belongs under the soil; a drag or a light disk, not a cultipacker alone`;
}

/** Prepared seedbed with small seed: firm it, then press the seed in. Null when the blend has no small seed. */
export function cultipackAdvice(parts: BlendPart[], p: SeedCoverParams = SEED_COVER_DEFAULTS): string | null {
  const small = smallSeedIn(parts, p);
  if (!small.length) return null;
  return (
    `${capitalised(nameList(small))} ${small.length === 1 ? 'is' : 'are'} small seed: cultipack before seeding for a firm seedbed and again after ` +
    'to press the seed in; it belongs no deeper than about ¼ in, so do not disk it under.'
  );
}

/** One line per legume of the blend, for the seed step's list of what to carry. */
export function inoculantReminders(parts: BlendPart[], poundsBySpecies: Map<string, number>): { speciesId: string; lb: number; detail: string }[] {
  return blendSpecies(parts)
    .filter(needsInoculant)
    .map((s) => {
      const lb = poundsBySpecies.get(s.id) ?? 0;
      const name = plainName(s);
      return {
        speciesId: s.id,
        lb,
        detail: `Inoculant made for ${name}, enough for ${(Math.round(lb * 10) / 10).toLocaleString('en-US')} lb of seed — unless the bag says pre-inoculated (legumes fix nitrogen only with their own rhizobia)`,
      };
    });
}
