import { requireRole } from '@/lib/auth/roles';
import { deleteBlend } from '@/lib/data/blends';
import { notFound, route } from '@/lib/http';
import { uuid } from '@/lib/validations/common';

type Context = { params: Promise<{ propertyId: string; blendId: string }> };

/** Removes a saved blend. Plantings made from it keep their own copy of the species and shares. */
export const DELETE = route(async (_request, { params }: Context) => {
  const { propertyId, blendId } = await params;
  await requireRole(propertyId, 'manager');
  if (!uuid.safeParse(blendId).success || !(await deleteBlend(propertyId, blendId))) throw notFound();
  return new Response(null, { status: 204 });
});
