import { now } from '@/lib/clock';
import { json, parseBody, route } from '@/lib/http';
import { requirePlantingRole } from '@/lib/planning/planting-access';
import { reseedProposalFor } from '@/lib/planning/stand-check';
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
  const { observation, stand, reseed } = await reseedProposalFor(planting, body.observationId, now());
  return json({ reseed, stand, acceptedPlantingId: observation.reseedPlantingId, canAcceptReseed: roleAtLeast(role, 'manager') });
});
