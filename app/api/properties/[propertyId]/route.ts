import { requireRole } from '@/lib/auth/roles';
import { deleteProperty, getProperty, toPropertyDto, updateProperty } from '@/lib/data/properties';
import { json, notFound, parsePatch, route } from '@/lib/http';
import { propertyUpdateSchema } from '@/lib/validations/property';

type Context = { params: Promise<{ propertyId: string }> };

export const GET = route(async (_request, { params }: Context) => {
  const { propertyId } = await params;
  const { role } = await requireRole(propertyId, 'viewer');
  const property = await getProperty(propertyId);
  if (!property) throw notFound();
  return json({ property: toPropertyDto(property), role });
});

export const PATCH = route(async (request, { params }: Context) => {
  const { propertyId } = await params;
  await requireRole(propertyId, 'manager');
  const { data, keys } = await parsePatch(request, propertyUpdateSchema);
  const property = await updateProperty(propertyId, data, keys);
  if (!property) throw notFound();
  return json({ property });
});

export const DELETE = route(async (_request, { params }: Context) => {
  const { propertyId } = await params;
  await requireRole(propertyId, 'owner');
  await deleteProperty(propertyId);
  return new Response(null, { status: 204 });
});
