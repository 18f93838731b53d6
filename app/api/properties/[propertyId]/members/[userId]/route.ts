import { requireRole } from '@/lib/auth/roles';
import { changeRole, LastOwnerError, removeMember } from '@/lib/data/memberships';
import { HttpError, json, notFound, parseBody, route } from '@/lib/http';
import { roleChangeSchema } from '@/lib/validations/membership';

type Context = { params: Promise<{ propertyId: string; userId: string }> };

function lastOwner(error: unknown): never {
  if (error instanceof LastOwnerError) throw new HttpError(409, error.message);
  throw error;
}

export const PATCH = route(async (request, { params }: Context) => {
  const { propertyId, userId } = await params;
  const { user } = await requireRole(propertyId, 'owner');
  const { role } = await parseBody(request, roleChangeSchema);
  const changed = await changeRole(propertyId, userId, role, user.id !== userId).catch(lastOwner);
  if (!changed) throw notFound();
  return json({ member: changed });
});

/** An owner removes anyone; any member may leave by removing themself. */
export const DELETE = route(async (_request, { params }: Context) => {
  const { propertyId, userId } = await params;
  const access = await requireRole(propertyId, 'viewer');
  if (access.user.id !== userId) await requireRole(propertyId, 'owner');
  const removed = await removeMember(propertyId, userId, access.user.id !== userId).catch(lastOwner);
  if (!removed) throw notFound();
  return new Response(null, { status: 204 });
});
