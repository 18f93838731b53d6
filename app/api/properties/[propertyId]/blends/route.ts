import { requireRole } from '@/lib/auth/roles';
import { createBlend, DuplicateBlendName, listBlends } from '@/lib/data/blends';
import { HttpError, json, parseBody, route } from '@/lib/http';
import { savedBlendSchema } from '@/lib/validations/blend';

type Context = { params: Promise<{ propertyId: string }> };

/** The property's saved blends: anyone on the property may read them; managers save new ones. */
export const GET = route(async (_request, { params }: Context) => {
  const { propertyId } = await params;
  await requireRole(propertyId, 'viewer');
  return json({ blends: await listBlends(propertyId) });
});

export const POST = route(async (request, { params }: Context) => {
  const { propertyId } = await params;
  const { user } = await requireRole(propertyId, 'manager');
  const input = await parseBody(request, savedBlendSchema);
  try {
    return json({ blend: await createBlend(propertyId, input, user.id) }, 201);
  } catch (error) {
    if (error instanceof DuplicateBlendName) throw new HttpError(409, error.message, { name: error.message });
    throw error;
  }
});
