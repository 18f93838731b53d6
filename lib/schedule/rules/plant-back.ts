// Plant-back: the days a burndown's actives need between spraying and sowing each kind of crop, so a
// soil-active herbicide (2,4-D, dicamba, triclopyr, imazethapyr…) does not kill the seedlings it was meant to
// make room for. The intervals are the catalog's typical label values (lib/agronomy/herbicides.ts); the label
// on the jug is the law. Also the stand check: a selective active over an existing stand must spare it.
import {
  activesHarmingStand,
  blendCropGroups,
  CROP_GROUP_WORDS,
  cropGroupOf,
  isNonSelective,
  getHerbicideActive,
  LABEL_IS_THE_LAW,
  longestPlantBack,
  mixKillWait,
  type MixPlantBack,
} from '@/lib/agronomy/herbicides';
import { getSpecies } from '@/lib/agronomy/species';
import { addDays, dayWithMonth } from '../local-dates';
import type { PlantingInput, RuleDecision } from '../types';

export type PlantBack = MixPlantBack;

/** The longest plant-back of the planting's actives for its blend; null without actives or when none holds seeding back. */
export function plantBackFor(input: PlantingInput): PlantBack | null {
  const ids = input.herbicide?.activeIngredients ?? [];
  if (!ids.length || input.method === 'frost-seeding') return null;
  return longestPlantBack(ids, blendCropGroups(input.blend));
}

export function plantBackEnd(sprayDate: string, pb: PlantBack): string {
  return addDays(sprayDate, pb.days);
}

/** "2,4-D ester typically needs 30 days between spraying and sowing clovers and other legumes" */
export function plantBackWords(pb: PlantBack): string {
  return `${pb.active.name} typically needs ${pb.days} days between spraying and sowing ${CROP_GROUP_WORDS[pb.group]} (${LABEL_IS_THE_LAW})`;
}

export function plantBackDecision(sprayDate: string, pb: PlantBack, date: string): RuleDecision {
  const end = plantBackEnd(sprayDate, pb);
  return date >= end
    ? { rule: 'plant-back', ok: true, reason: `after the plant-back, which ends ${dayWithMonth(end)}: ${plantBackWords(pb)}` }
    : {
        rule: 'plant-back',
        ok: false,
        reason: `before the plant-back ends on ${dayWithMonth(end)} (spraying ${dayWithMonth(sprayDate)}): ${plantBackWords(pb)}`,
      };
}

/** Spray-and-seed sows into the dying cover within days; a longer plant-back cannot be kept that way. */
export function sprayAndSeedConflict(pb: PlantBack, maxSprayToSeedDays: number): string {
  return (
    `Spray-and-seed sows within ${maxSprayToSeedDays} days of spraying, but ${plantBackWords(pb)}. ` +
    `Seeding waits until the plant-back is over, by when the sprayed cover is dead and gives less cover to the seed. ` +
    `To seed into the dying cover, spray ${pb.days} days or more ahead with this mix, or burn down with glyphosate alone (no plant-back).`
  );
}

/** The kill wait the actives ask for, when neither the planting nor its parameters give one. */
export function killWaitFromActives(input: PlantingInput): { days: number; note: string } | null {
  if (input.killWaitDays !== undefined || input.parameters?.killWait?.killWaitDays !== undefined) return null;
  const ids = input.herbicide?.activeIngredients ?? [];
  const wait = ids.length ? mixKillWait(ids) : null;
  if (!wait) return null;
  return { days: wait.days, note: `${wait.days} days is typical for ${wait.active.name} before working or burning the ground — ${LABEL_IS_THE_LAW}` };
}

/**
 * Over an existing stand that the blend keeps, a selective mix must spare every species of it: a grass
 * herbicide (clethodim, sethoxydim) cleans grass out of clover; a broadleaf one (2,4-D, dicamba, triclopyr)
 * kills the clover. A mix with a non-selective active is a renovation burndown instead: it kills everything
 * and the plant-back decides when the new seed goes in.
 */
export function standSafetyIssues(input: PlantingInput): string[] {
  const ids = input.herbicide?.activeIngredients ?? [];
  if (input.cover !== 'existing-stand' || !ids.length || input.method === 'frost-seeding') return [];
  if (ids.some((id) => isNonSelective(getHerbicideActive(id)))) return [];
  const species = input.blend.map((p) => getSpecies(p.speciesId));
  return activesHarmingStand(ids, blendCropGroups(input.blend)).map(({ active, group }) => {
    const hit = species.filter((s) => cropGroupOf(s) === group).map((s) => s.name.toLowerCase());
    return (
      `Herbicide actives: ${active.name} kills ${CROP_GROUP_WORDS[group]} (${active.safeOverSource}), so it cannot go over the existing ` +
      `stand of ${hit.join(' and ')}. To clean grass out of a clover stand use a grass-selective active (clethodim or sethoxydim); ` +
      `to start over, burn the stand down with a non-selective one (glyphosate).`
    );
  });
}
