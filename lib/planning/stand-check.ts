// A germination check of a planting, worked out: the count as plants per ft², the stand its blend should
// give, the verdict — and, for a thin stand, the reseeding the engine proposes: the missing share of the
// blend's rate, seeded on the day the rules pick ahead of a soaking rain, with no new burndown (the young
// plants that did come up stay; the ground was cleared for the first seeding).
import type { Selectable } from 'kysely';
import type { PlantingsTable, Plot, Property } from '@/db/database';
import { expectedStand, judgeStand, plantsPerSqFt, reseedParts, STAND_SOURCES, STAND_THRESHOLDS } from '@/lib/agronomy/stand';
import { latestForecast } from '@/lib/data/forecasts';
import { getObservation } from '@/lib/data/observations';
import { plantingPlace } from '@/lib/data/plantings';
import { HttpError, notFound } from '@/lib/http';
import { localDateOf } from '@/lib/schedule/local-dates';
import { planPlanting, replan } from '@/lib/schedule/plan';
import type { Forecast, Plan, PlanStep } from '@/lib/schedule/types';
import { plantingSchema, type PlantingFormInput } from '@/lib/validations/planting';
import { gridCellKey } from '@/lib/weather/grid';
import { buildPlantingInput } from './input';

export interface StandResult {
  plantsPerSqFt: number;
  expected: { lowPerSqFt: number; highPerSqFt: number; midPerSqFt: number; seedsPerSqFt: number; source: string };
  verdict: 'good' | 'fair' | 'poor';
  shareOfExpected: number;
  missingShare: number;
  reason: string;
  thresholds: { goodAtPerSqFt: number; fairAtPerSqFt: number; source: string };
}

export function standOf(planting: Pick<Selectable<PlantingsTable>, 'input' | 'method'>, frameCounts: number[], frameSqFt: number): StandResult {
  const form = plantingSchema.parse(planting.input);
  const observed = plantsPerSqFt(frameCounts, frameSqFt);
  const expected = expectedStand(form.blend, planting.method);
  const judged = judgeStand(observed, expected);
  return {
    plantsPerSqFt: observed,
    expected: {
      lowPerSqFt: expected.lowPerSqFt,
      highPerSqFt: expected.highPerSqFt,
      midPerSqFt: expected.midPerSqFt,
      seedsPerSqFt: expected.seedsPerSqFt,
      source: expected.source,
    },
    ...judged,
    thresholds: {
      goodAtPerSqFt: expected.lowPerSqFt * STAND_THRESHOLDS.goodShareOfExpectedLow,
      fairAtPerSqFt: expected.lowPerSqFt * STAND_THRESHOLDS.fairShareOfExpectedLow,
      source: `good: ${STAND_SOURCES.goodShareOfExpectedLow}; poor: ${STAND_SOURCES.fairShareOfExpectedLow}`,
    },
  };
}

/** Steps a reseeding leaves out: the ground work and inputs went in with the first seeding. */
const LEFT_OUT = new Set(['soil-test', 'clear-brush', 'spray', 'kill-wait', 'burn', 'rake-till', 'lime']);

export interface ReseedProposal {
  /** Share of the blend's full rate sown again (the missing share, rounded up to 5 %). */
  rateShare: number;
  form: PlantingFormInput;
  plan: Plan;
  seedDate: string;
  /** Why the engine put the seeding on that day. */
  reason: string;
  source: string;
}

/**
 * The reseeding for a thin stand, planned by the engine against the property's stored forecast. Kept as a
 * planting like any other, with the burndown steps recorded as skipped so later replans leave them out too.
 */
export async function proposeReseed(o: {
  planting: Selectable<PlantingsTable>;
  plot: Plot;
  property: Property;
  missingShare: number;
  now: Date;
}): Promise<ReseedProposal> {
  const original = plantingSchema.parse(o.planting.input);
  const today = localDateOf(o.now, o.property.time_zone);
  const blend = reseedParts(original.blend, o.missingShare);
  const rateShare = Math.min(1, Math.ceil(Math.min(1, o.missingShare) * 20 - 1e-9) / 20);
  // Frost seeding waits for a frozen morning; a reseeding after a failed one goes in now, on the surface.
  const method = original.method === 'frost-seeding' ? 'prepared-seedbed' : original.method;
  const form = plantingSchema.parse({
    season: original.method === 'frost-seeding' ? 'spring' : original.season,
    method,
    blend,
    targetSeedDate: today,
    readyBy: original.readyBy && original.readyBy >= today ? original.readyBy : undefined,
    clearBrush: false,
    burn: null,
    // No tilling: it would tear out the seedlings that did come up.
    rakeOrTill: false,
    // Drag or cultipack after broadcasting, so the new seed meets soil among the young plants.
    coverSeed: true,
    herbicide: null,
    sprayer: null,
    fertilizer: null,
    lime: null,
    seedBagLb: original.seedBagLb,
    soilTexture: original.soilTexture,
    upkeep: false,
  });
  const input = buildPlantingInput(o.property, o.plot, form);
  const stored = await latestForecast(gridCellKey(o.property.latitude, o.property.longitude));
  const forecast: Forecast = stored
    ? { timeZone: o.property.time_zone, fetchedAt: stored.fetchedAt, hours: stored.hours }
    : { timeZone: o.property.time_zone, fetchedAt: o.now.toISOString(), hours: [] };
  const first = planPlanting(input, forecast, o.now);
  const skipped = first.steps.map(
    (s): PlanStep =>
      LEFT_OUT.has(s.key)
        ? { ...s, status: 'skipped', quantities: [], cautions: [], rules: [], warnings: [], reason: 'left out of a reseeding: the first seeding already had it' }
        : s,
  );
  // Replanned with those steps skipped, so the seeding is free of the kill wait and placed by the rules alone.
  const { plan } = replan(input, { ...first, steps: skipped }, forecast, o.now);
  const seed = plan.steps.find((s) => s.key === 'seed');
  if (!seed) throw new RangeError('The engine planned no seeding for this reseeding.');
  return {
    rateShare,
    form,
    plan,
    seedDate: seed.date,
    reason: seed.reason,
    source: STAND_SOURCES.reseedShare,
  };
}

/** A check of this planting and the plot and property it belongs to; 400 for a check of another planting. */
export async function reseedFor(plantingId: string, observationId: string) {
  const observation = await getObservation(observationId);
  if (!observation || observation.plantingId !== plantingId) {
    throw new HttpError(400, 'The check is not one of this planting', { observationId: 'The check is not one of this planting' });
  }
  const place = await plantingPlace(plantingId);
  if (!place) throw notFound();
  return { observation, place };
}

/**
 * The reseeding a check calls for, as both the preview and the acceptance need it: the check must belong to the
 * planting and have found a fair or poor stand; the engine then plans the reseed against today's forecast.
 */
export async function reseedProposalFor(planting: Selectable<PlantingsTable>, observationId: string, now: Date) {
  const { observation, place } = await reseedFor(planting.id, observationId);
  const stand = standOf(planting, observation.frameCounts, observation.frameSqFt);
  if (stand.verdict === 'good') {
    throw new HttpError(409, 'This check found a good stand; there is nothing to reseed', { observationId: 'The stand is good' });
  }
  try {
    const reseed = await proposeReseed({ planting, plot: place.plot, property: place.property, missingShare: stand.missingShare, now });
    return { observation, stand, reseed };
  } catch (error) {
    if (error instanceof RangeError) throw new HttpError(400, error.message);
    throw error;
  }
}
