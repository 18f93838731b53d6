import { requireRole } from '@/lib/auth/roles';
import { createInvitation, listInvitations } from '@/lib/data/invitations';
import { json, parseBody, route } from '@/lib/http';
import { invitationLink } from '@/lib/links';
import { invitationSchema } from '@/lib/validations/membership';

type Context = { params: Promise<{ propertyId: string }> };

export const GET = route(async (_request, { params }: Context) => {
  const { propertyId } = await params;
  await requireRole(propertyId, 'owner');
  return json({ invitations: await listInvitations(propertyId) });
});

export const POST = route(async (request, { params }: Context) => {
  const { propertyId } = await params;
  const { user } = await requireRole(propertyId, 'owner');
  const input = await parseBody(request, invitationSchema);
  const { token, invitation } = await createInvitation(propertyId, input.email, input.role, user.id);
  return json({ invitation, link: invitationLink(token) }, 201);
});
