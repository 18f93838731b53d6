import { requireUser, requireVerifiedEmail } from '@/lib/auth/session';
import { acceptInvitation, findInvitationByToken } from '@/lib/data/invitations';
import { HttpError, json, notFound, route } from '@/lib/http';

type Context = { params: Promise<{ token: string }> };

const STATE_MESSAGES = {
  accepted: 'This invitation has already been used',
  revoked: 'This invitation was withdrawn by the property owner',
  expired: 'This invitation has expired; ask the owner for a new one',
} as const;

export const POST = route(async (_request, { params }: Context) => {
  const user = await requireUser();
  const { token } = await params;
  const invitation = await findInvitationByToken(token);
  if (!invitation) throw notFound();
  if (invitation.state !== 'open') throw new HttpError(410, STATE_MESSAGES[invitation.state]);
  if (invitation.email !== user.email) {
    throw new HttpError(
      403,
      `This invitation is for ${invitation.email}. Sign in with that address, or ask the owner to invite ${user.email}.`,
    );
  }
  requireVerifiedEmail(user, 'join a property');
  const accepted = await acceptInvitation(invitation.id, invitation.propertyId, user.id, invitation.role);
  if (!accepted) throw new HttpError(410, STATE_MESSAGES.accepted);
  return json({ propertyId: invitation.propertyId, role: invitation.role });
});
