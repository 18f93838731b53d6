import { now } from '@/lib/clock';
import { HttpError, json, parseBody, route } from '@/lib/http';
import { requirePlantingRole } from '@/lib/planning/planting-access';
import { proposeReseed, reseedFor, standOf } from '@/lib/planning/stand-check';
import { roleAtLeast } from '@/lib/validations/membership';
import { reseedSchema } from '@/lib/validations/observation';

type Context = { params: Promise<{ plantingId: string }> };

/**
 * The reseeding a fair or poor stand calls for, planned by the engine; nothing is saved. Members see it;
 * only managers may accept it (POST …/reseed).
 */
export const POST = route(async (request, { params }: Context) => {
  const { plantingId } = await params;
  const { planting, role } = await requirePlantingRole(plantingId, 'member');
  const body = await parseBody(request, reseedSchema);
  const at = now();
  const { observation, place } = await reseedFor(plantingId, body.observationId);
  const stand = standOf(planting, observation.frameCounts, observation.frameSqFt);
  if (stand.verdict === 'good') {
    throw new HttpError(409, 'This check found a good stand; there is nothing to reseed', { observationId: 'The stand is good' });
  }
  try {
    const reseed = await proposeReseed({ planting, plot: place.plot, property: place.property, missingShare: stand.missingShare, now: at });
    return json({ reseed, stand, acceptedPlantingId: observation.reseedPlantingId, canAcceptReseed: roleAtLeast(role, 'manager') });
  } catch (error) {
    if (error instanceof RangeError) throw new HttpError(400, error.message);
    throw error;
  }
});
