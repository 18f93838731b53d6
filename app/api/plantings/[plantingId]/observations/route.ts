import { now } from '@/lib/clock';
import { createObservation, deleteObservation, getObservation, listObservations, PhotoLinkError } from '@/lib/data/observations';
import { getStepRows, plantingPlace } from '@/lib/data/plantings';
import { HttpError, json, notFound, parseBody, route } from '@/lib/http';
import { completeStep, StepDateError } from '@/lib/planning/complete-step';
import { requirePlantingRole } from '@/lib/planning/planting-access';
import { proposeReseed, standOf } from '@/lib/planning/stand-check';
import { localDateOf } from '@/lib/schedule/local-dates';
import { roleAtLeast } from '@/lib/validations/membership';
import { observationSchema } from '@/lib/validations/observation';

type Context = { params: Promise<{ plantingId: string }> };

/** The planting's germination checks, newest first, with their photos. Everyone who may see the plot. */
export const GET = route(async (_request, { params }: Context) => {
  const { plantingId } = await params;
  await requirePlantingRole(plantingId, 'viewer');
  return json({ observations: await listObservations(plantingId) });
});

/**
 * Saves a germination check: the count becomes plants per ft², judged against the stand the blend's rate
 * should give. With a step id, the check-germination step is marked done on the check's date and the plan
 * re-placed from it. A poor stand comes back with the reseeding the engine proposes. Members and up.
 */
export const POST = route(async (request, { params }: Context) => {
  const { plantingId } = await params;
  const { planting, user, role } = await requirePlantingRole(plantingId, 'member');
  const body = await parseBody(request, observationSchema);
  const place = await plantingPlace(plantingId);
  if (!place) throw notFound();
  const at = now();
  const today = localDateOf(at, place.property.time_zone);
  const observedOn = body.observedOn ?? today;
  if (observedOn > today) {
    throw new HttpError(400, `The date of the check cannot be after today (${today})`, { observedOn: `The date cannot be after today (${today})` });
  }
  let step = null;
  if (body.stepId) {
    step = (await getStepRows(plantingId)).find((s) => s.id === body.stepId) ?? null;
    if (!step || step.kind !== 'check-germination') {
      throw new HttpError(400, 'The step is not this planting’s germination check', { stepId: 'The step is not this planting’s germination check' });
    }
  }
  let stand;
  try {
    stand = standOf(planting, body.frameCounts, body.frameSqFt);
  } catch (error) {
    if (error instanceof RangeError) throw new HttpError(400, error.message, { frameCounts: error.message });
    throw error;
  }

  let observationId: string;
  try {
    observationId = await createObservation({
      plantingId,
      plotId: planting.plot_id,
      stepId: step?.id ?? null,
      observedOn,
      observedAt: at,
      observerId: user.id,
      standRating: body.standRating,
      frameCounts: body.frameCounts,
      frameSqFt: body.frameSqFt,
      plantsPerSqFt: stand.plantsPerSqFt,
      expectedPerSqFt: stand.expected.midPerSqFt,
      expectedSource: stand.expected.source,
      weedPressure: body.weedPressure,
      verdict: stand.verdict,
      notes: body.notes ?? null,
      photoIds: body.photoIds ?? [],
    });
  } catch (error) {
    if (error instanceof PhotoLinkError) throw new HttpError(400, error.message, { photoIds: error.message });
    throw error;
  }

  let moved: unknown[] = [];
  if (step && step.status === 'planned') {
    try {
      const result = await completeStep({ stepId: step.id, plantingId, status: 'done', date: observedOn, userId: user.id, now: at });
      moved = result.changes;
    } catch (error) {
      // The check and the step go together: without the step marked, the check is not kept either.
      await deleteObservation(observationId);
      if (error instanceof StepDateError) throw new HttpError(400, error.message, { observedOn: error.message });
      if (error instanceof RangeError) throw new HttpError(400, error.message);
      throw error;
    }
  }

  const observation = await getObservation(observationId);
  let reseed = null;
  if (stand.verdict === 'poor') {
    try {
      reseed = await proposeReseed({ planting, plot: place.plot, property: place.property, missingShare: stand.missingShare, now: at });
    } catch (error) {
      // The check is saved either way; a plan the engine cannot make is said, not hidden.
      if (!(error instanceof RangeError)) throw error;
      reseed = { error: error.message };
    }
  }
  return json({ observation, stand, reseed, canAcceptReseed: roleAtLeast(role, 'manager'), moved }, 201);
});
