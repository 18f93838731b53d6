import { requireRole } from '@/lib/auth/roles';
import { listMembers } from '@/lib/data/memberships';
import { json, route } from '@/lib/http';

type Context = { params: Promise<{ propertyId: string }> };

export const GET = route(async (_request, { params }: Context) => {
  const { propertyId } = await params;
  const { role } = await requireRole(propertyId, 'viewer');
  const members = await listMembers(propertyId);
  // E-mail addresses are for the people who manage membership.
  const visible = role === 'owner' ? members : members.map((m) => ({ ...m, email: null }));
  return json({ members: visible });
});
