import { requireUser } from '@/lib/auth/session';
import { insertNotifications } from '@/lib/data/notifications';
import { createEmailVerification, EMAIL_VERIFICATION_HOURS } from '@/lib/data/users';
import { HttpError, json, route } from '@/lib/http';
import { appBaseUrl, verificationLink } from '@/lib/links';
import { verifyEmail } from '@/lib/notify/account-messages';

/** Sends a fresh confirmation link to the signed-in person's address; one per ten minutes. */
export const POST = route(async () => {
  const user = await requireUser();
  if (user.emailVerified) throw new HttpError(409, 'Your e-mail is already confirmed');
  const token = await createEmailVerification(user.id);
  const tenMinutes = Math.floor(Date.now() / 600_000);
  const queued = await insertNotifications([
    {
      dedupeKey: `email-verification:${user.id}:resend:${tenMinutes}`,
      userId: user.id,
      propertyId: null,
      stepId: null,
      kind: 'email-verification',
      channel: 'email',
      message: verifyEmail({ baseUrl: appBaseUrl(), name: user.name, link: verificationLink(token), validHours: EMAIL_VERIFICATION_HOURS }),
      sendAfter: new Date(),
    },
  ]);
  return json({ sent: queued > 0 }, 202);
});
