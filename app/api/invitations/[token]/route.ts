import { findInvitationByToken } from '@/lib/data/invitations';
import { json, notFound, route } from '@/lib/http';

type Context = { params: Promise<{ token: string }> };

/** What the invitation offers. Holding the secret token is what lets one see it. */
export const GET = route(async (_request, { params }: Context) => {
  const { token } = await params;
  const invitation = await findInvitationByToken(token);
  if (!invitation) throw notFound();
  return json({
    invitation: {
      propertyName: invitation.propertyName,
      role: invitation.role,
      email: invitation.email,
      inviter: invitation.inviter,
      expiresAt: invitation.expiresAt,
      state: invitation.state,
    },
  });
});
