// Nitrogen and legumes: a blend of nothing but legumes (clovers, alfalfa, peas, beans) makes its own
// nitrogen once its roots are nodulated, so nitrogen fertilizer on it is wasted at best and, at worst, feeds
// the grass and weeds that crowd the legumes out.
import { SPECIES, type BlendPart } from './species';

export const LEGUME_NITROGEN_SOURCE =
  'Penn State Extension, Forages — "Nitrogen Management for Legumes": properly inoculated, well-nodulated legumes have all the nitrogen they need; adding nitrogen will not increase yield and can greatly increase competition from grass and weeds, shortening the stand’s life';

const LEGUME_KINDS = new Set(['clover', 'legume']);

const LEGUME_IDS = new Set(SPECIES.filter((s) => LEGUME_KINDS.has(s.kind)).map((s) => s.id));

/** True when every species in the blend is a legume (by the catalog's kind); an unknown id is not one. */
export function legumeOnly(parts: readonly BlendPart[]): boolean {
  return parts.length > 0 && parts.every((part) => LEGUME_IDS.has(part.speciesId));
}

/** The words for a nitrogen target set on a legume-only blend. */
export function legumeNitrogenWarning(nLbPerAcre: number): string {
  return (
    `This blend is all legumes: inoculated legumes fix their own nitrogen, and the ${nLbPerAcre} lb/acre of N feeds the grass and weeds that crowd them. ` +
    'Leave the N out (use a fertilizer without it for the P and K) unless your soil test says otherwise.'
  );
}
