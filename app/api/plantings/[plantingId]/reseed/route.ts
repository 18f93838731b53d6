import { now } from '@/lib/clock';
import { lockObservation, setReseedPlanting } from '@/lib/data/observations';
import { createPlanting, getStepRows, toStepDto, withPlantingLock } from '@/lib/data/plantings';
import { toPlantingDto } from '@/lib/data/steps';
import { HttpError, json, parseBody, route } from '@/lib/http';
import { requirePlantingRole } from '@/lib/planning/planting-access';
import { reseedProposalFor } from '@/lib/planning/stand-check';
import { reseedSchema } from '@/lib/validations/observation';

type Context = { params: Promise<{ plantingId: string }> };

/**
 * Accepts the reseeding a check proposed, in one step: the engine plans it again (the forecast may have moved
 * on since the preview) and it is saved as a new planting of the plot. Once per check — a second request
 * answers 409 with the planting the first one made. Managers and owners.
 */
export const POST = route(async (request, { params }: Context) => {
  const { plantingId } = await params;
  const { planting, user } = await requirePlantingRole(plantingId, 'manager');
  const body = await parseBody(request, reseedSchema);
  const { observation, reseed } = await reseedProposalFor(planting, body.observationId, now());
  // Under the original planting's lock, so two acceptances of one check cannot both make a planting.
  const created = await withPlantingLock(plantingId, async (trx) => {
    const locked = await lockObservation(trx, observation.id);
    if (locked?.reseed_planting_id) return { existing: locked.reseed_planting_id };
    const made = await createPlanting({ plotId: planting.plot_id, form: reseed.form, plan: reseed.plan, createdBy: user.id });
    await setReseedPlanting(trx, observation.id, made.id);
    return { made };
  });
  if ('existing' in created) {
    throw new HttpError(409, 'The reseeding of this check was already accepted', { observationId: created.existing as string });
  }
  const steps = (await getStepRows(created.made.id)).map(toStepDto);
  return json({ planting: toPlantingDto(created.made), steps, warnings: reseed.plan.warnings, reseed }, 201);
});
