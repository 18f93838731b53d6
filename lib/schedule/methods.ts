// How each planting method orders its steps, and the lead times between them.
//   spray-and-seed:   clear → spray → seed into the dying cover (same day or within two days) → cover seed →
//                     check germination → fertilize once the stand is up
//   prepared seedbed: clear → spray → kill wait → burn → fertilize → rake/till (the final pass works the
//                     fertilizer and lime in) → seed → cover seed → check germination
//   frost seeding:    late-winter broadcast onto frozen ground of an existing stand → check germination
// A soil test comes ahead of all of them, because lime and fertilizer rates come from it. Lime goes on months
// ahead of the seeding (rules/lime-timing.ts), on its own date, not with the seeding; a rate above about
// 2 t/acre goes on in two halves ('lime' and 'lime-second').
import { largeSeedIn } from '@/lib/agronomy/seed-cover';
import type { PlantingInput, StepKind } from './types';

export interface SequenceParams {
  /** Cutting woody brush with a saw, then spraying what stands: the days between. */
  clearBeforeSprayDays: number;
  /** Mowing herbaceous cover before a burndown: the days its regrowth needs to reach the label's stage. */
  mowRegrowthDays: number;
  /** spray-and-seed: planned days from spraying to seeding, and the most allowed. */
  sprayToSeedDays: number;
  maxSprayToSeedDays: number;
  burnBeforeSeedDays: number;
  soilTestLeadDays: number;
  /** How far the weather may move a step from its planned date. */
  sprayMoveEarlierDays: number;
  sprayMoveLaterDays: number;
  seedMoveEarlierDays: number;
  seedMoveLaterDays: number;
  burnMoveLaterDays: number;
  frostSeedMoveDays: number;
}

export const SEQUENCE_DEFAULTS: SequenceParams = {
  clearBeforeSprayDays: 1,
  mowRegrowthDays: 21,
  sprayToSeedDays: 1,
  maxSprayToSeedDays: 2,
  burnBeforeSeedDays: 1,
  soilTestLeadDays: 90,
  sprayMoveEarlierDays: 3,
  sprayMoveLaterDays: 7,
  seedMoveEarlierDays: 7,
  seedMoveLaterDays: 14,
  burnMoveLaterDays: 7,
  frostSeedMoveDays: 14,
};

export const SEQUENCE_SOURCES: Record<keyof SequenceParams, string> = {
  clearBeforeSprayDays:
    'common practice, no source: cutting woody stems with a saw takes none of the leaves the burndown must wet, so spraying can follow the next day',
  mowRegrowthDays:
    'glyphosate labels: weeds that were mowed or cut must regrow to the labeled stage before treatment (' +
    'from memory: for perennial grasses about 8–12 in of new growth, some three weeks in the growing season); ' +
    'Purdue on the clethodim (SelectMax) label: do not mow the target grass two weeks before application',
  sprayToSeedDays:
    'common practice, no source: in spray-and-seed the seed goes into the dying cover the same day or within two days; a day after spraying by default',
  maxSprayToSeedDays: 'common practice, no source: within two days, while the cover still stands to shade and mulch the seed',
  burnBeforeSeedDays: 'common practice, no source: burn, let it go out cold, then rake or till and seed',
  soilTestLeadDays:
    'common practice (extension guidance says to lime months ahead because lime works slowly; from memory): test about three months before seeding',
  sprayMoveEarlierDays: "Sowcast's default: the weather may bring spraying up to 3 days earlier than planned",
  sprayMoveLaterDays: "Sowcast's default: or put it off up to a week",
  seedMoveEarlierDays: "Sowcast's default: seeding may move up to a week earlier to catch a rain",
  seedMoveLaterDays: "Sowcast's default: or up to two weeks later (never past the fall frost deadline)",
  burnMoveLaterDays: "Sowcast's default: a burn waits up to a week for its humidity and wind",
  frostSeedMoveDays: "Sowcast's default: frost seeding may move up to two weeks either way for a freeze-thaw morning",
};

export interface StepTemplate {
  key: string;
  kind: StepKind;
  after: string[];
}

/** Brush is cut with a saw; any other cover that is "cleared" is mowed, and mowed weeds must regrow before a burndown. */
export function clearingBy(input: PlantingInput): 'chainsaw' | 'mowing' {
  return input.cover === 'brush' ? 'chainsaw' : 'mowing';
}

export function clearsBrush(input: PlantingInput): boolean {
  return input.method !== 'frost-seeding' && (input.clearBrush ?? input.cover === 'brush');
}

/** A burndown is needed wherever something stands on the plot. */
export function needsBurndown(input: PlantingInput): boolean {
  return input.method !== 'frost-seeding' && input.cover !== 'bare-soil' && input.cover !== 'tilled';
}

export function burns(input: PlantingInput): boolean {
  return input.method === 'prepared-seedbed' && needsBurndown(input) && !!input.burn?.planned && !!input.burn.permitInHand;
}

/** Covered by default on a prepared seedbed, and in spray-and-seed when the blend holds large seed (lib/agronomy/seed-cover.ts). */
export function coversSeed(input: PlantingInput): boolean {
  if (input.method === 'frost-seeding') return false;
  return input.coverSeed ?? (input.method === 'prepared-seedbed' || largeSeedIn(input.blend).length > 0);
}

export function rakesOrTills(input: PlantingInput): boolean {
  return input.method === 'prepared-seedbed' && (input.rakeOrTill ?? true);
}

/** A lime rate large enough to go on in two halves. */
export function splitsLime(input: PlantingInput, splitAboveTonsPerAcre: number): boolean {
  return !!input.lime && input.lime.tonsPerAcre > splitAboveTonsPerAcre;
}

export function testsSoil(input: PlantingInput): boolean {
  return input.method !== 'frost-seeding' || !!input.lime || !!input.fertilizer;
}

/** The steps of a planting in order, each with the keys it follows. Notes explain steps left out. */
export function methodSteps(input: PlantingInput, splitAboveTonsPerAcre: number): { steps: StepTemplate[]; notes: string[] } {
  const steps: StepTemplate[] = [];
  const notes: string[] = [];
  const has = (key: string) => steps.some((s) => s.key === key);
  const add = (key: string, kind: StepKind, after: (string | false | null | undefined)[]) => {
    steps.push({ key, kind, after: after.filter((k): k is string => !!k && has(k)) });
  };
  const last = (...keys: string[]) => keys.find((k) => has(k)) ?? null;

  const addLime = (afterLime: (string | null)[], secondAfter: (string | null)[]) => {
    if (!input.lime) return;
    add('lime', 'lime', afterLime);
    if (splitsLime(input, splitAboveTonsPerAcre)) add('lime-second', 'lime', ['lime', ...secondAfter]);
  };

  if (testsSoil(input)) add('soil-test', 'soil-test', []);
  if (input.method === 'frost-seeding') {
    // Lime on the surface of the stand does not hold the frost seeding back.
    addLime(['soil-test'], []);
    add('frost-seed', 'frost-seed', []);
    add('check-germination', 'check-germination', ['frost-seed']);
    if (input.fertilizer) add('fertilize', 'fertilize', ['check-germination']);
    if (input.cover !== 'existing-stand') notes.push('Frost seeding thickens an existing stand; on other cover the seed has little to grow into.');
    return { steps, notes };
  }

  if (clearsBrush(input)) add('clear-brush', 'clear-brush', []);
  if (needsBurndown(input)) add('spray', 'spray', ['clear-brush']);
  if (input.method === 'spray-and-seed') {
    if (!needsBurndown(input)) notes.push('Spray-and-seed relies on standing cover to shelter the seed; this plot has none, so nothing is sprayed.');
    if (input.burn?.planned) notes.push('Spray-and-seed leaves the dying cover as mulch for the seed, so no burn is planned.');
    addLime(['soil-test', 'clear-brush'], []);
    add('seed', 'seed', ['spray', !has('spray') && 'clear-brush']);
    if (coversSeed(input)) add('cover-seed', 'cover-seed', ['seed']);
    add('check-germination', 'check-germination', [last('cover-seed', 'seed')]);
    if (input.fertilizer) add('fertilize', 'fertilize', ['check-germination']);
    return { steps, notes };
  }

  if (needsBurndown(input)) add('kill-wait', 'kill-wait', ['spray']);
  if (burns(input)) add('burn', 'burn', ['kill-wait']);
  else if (input.burn?.planned) {
    notes.push(
      needsBurndown(input)
        ? 'Burn left out: no burn permit or approval is recorded. Record it to have Sowcast place a burn day — and check local burn rules.'
        : 'Burn left out: there is no standing cover to burn.',
    );
  }
  const beforeGround = last('burn', 'kill-wait', 'clear-brush');
  // Lime, its second half and the fertilizer go down before the final seedbed pass, which works them in.
  addLime(['soil-test', 'clear-brush'], [beforeGround]);
  if (input.fertilizer) add('fertilize', 'fertilize', [beforeGround]);
  const groundIn = [beforeGround, 'lime', 'lime-second', 'fertilize'];
  if (rakesOrTills(input)) add('rake-till', 'rake-till', groundIn);
  add('seed', 'seed', has('rake-till') ? ['rake-till'] : groundIn);
  if (coversSeed(input)) add('cover-seed', 'cover-seed', ['seed']);
  add('check-germination', 'check-germination', [last('cover-seed', 'seed')]);
  return { steps, notes };
}
