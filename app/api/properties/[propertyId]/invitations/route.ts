import { invitationsPerPropertyPerHour, retryLater, takeInvitation, waitWords } from '@/lib/auth/limits';
import { requireRole } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { createInvitation, listInvitations } from '@/lib/data/invitations';
import { insertNotifications } from '@/lib/data/notifications';
import { getProperty } from '@/lib/data/properties';
import { json, notFound, parseBody, route } from '@/lib/http';
import { appBaseUrl, invitationLink } from '@/lib/links';
import { invitation as invitationMessage } from '@/lib/notify/messages';
import { localDateOf } from '@/lib/schedule/local-dates';
import { invitationSchema } from '@/lib/validations/membership';

type Context = { params: Promise<{ propertyId: string }> };

export const GET = route(async (_request, { params }: Context) => {
  const { propertyId } = await params;
  await requireRole(propertyId, 'owner');
  return json({ invitations: await listInvitations(propertyId) });
});

/**
 * Creates the invitation and queues its e-mail: a notification row addressed to the invitee's address (they
 * may have no account yet), which the worker's sender delivers. The link is also returned, so the inviter
 * can pass it on by hand if the e-mail does not arrive.
 */
export const POST = route(async (request, { params }: Context) => {
  const { propertyId } = await params;
  const { user } = await requireRole(propertyId, 'owner');
  const input = await parseBody(request, invitationSchema);
  const wait = await takeInvitation(propertyId);
  if (wait > 0) {
    const limit = invitationsPerPropertyPerHour();
    return retryLater(429, `This property has sent its ${limit} invitations for this hour. Try again in ${waitWords(wait)}.`, wait);
  }
  const property = await getProperty(propertyId);
  if (!property) throw notFound();
  const { token, invitation } = await createInvitation(propertyId, input.email, input.role, user.id);
  const link = invitationLink(token);
  await insertNotifications([
    {
      dedupeKey: `invitation:${invitation.id}`,
      userId: null,
      emailTo: invitation.email,
      propertyId,
      stepId: null,
      kind: 'invitation',
      channel: 'email',
      message: invitationMessage({
        baseUrl: appBaseUrl(),
        propertyName: property.name,
        inviterName: user.name,
        role: invitation.role,
        link,
        expiresOn: localDateOf(new Date(invitation.expiresAt), property.time_zone),
      }),
      sendAfter: now(),
      invitationId: invitation.id,
    },
  ]);
  return json({ invitation, link }, 201);
});
