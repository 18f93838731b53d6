import { requireRole } from '@/lib/auth/roles';
import { revokeInvitation } from '@/lib/data/invitations';
import { notFound, route } from '@/lib/http';
import { uuid } from '@/lib/validations/common';

type Context = { params: Promise<{ propertyId: string; invitationId: string }> };

export const DELETE = route(async (_request, { params }: Context) => {
  const { propertyId, invitationId } = await params;
  await requireRole(propertyId, 'owner');
  if (!uuid.safeParse(invitationId).success || !(await revokeInvitation(propertyId, invitationId))) throw notFound();
  return new Response(null, { status: 204 });
});
