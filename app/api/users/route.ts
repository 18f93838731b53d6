import { addressKey, clientAddress, trustedProxyHops } from '@/lib/auth/client-address';
import { retryLater, takeSignUp, waitWords } from '@/lib/auth/limits';
import { weakPasswordReason } from '@/lib/auth/password-strength';
import { hashPassword, HashingBusyError } from '@/lib/auth/passwords';
import { insertNotifications } from '@/lib/data/notifications';
import { createEmailVerification, createUser, EMAIL_VERIFICATION_HOURS, findUserByEmail } from '@/lib/data/users';
import { HttpError, json, parseBody, route } from '@/lib/http';
import { appBaseUrl, signInLink, verificationLink } from '@/lib/links';
import { signUpAgain, verifyEmail } from '@/lib/notify/account-messages';
import { signUpSchema } from '@/lib/validations/user';

export const CHECK_YOUR_EMAIL = 'Check your e-mail: we sent a link to confirm the address.';

/**
 * Sign-up. The answer is the same whether the e-mail was free or already had an account (no enumeration):
 * a new account gets a confirmation link; an existing one gets a note that someone tried, at most one an hour.
 * Both paths hash the password, so they also cost the same.
 */
export const POST = route(async (request) => {
  const input = await parseBody(request, signUpSchema);
  const address = addressKey(clientAddress(request.headers.get('x-forwarded-for'), trustedProxyHops()));
  const wait = await takeSignUp(address);
  if (wait > 0) return retryLater(429, `Too many sign-ups from here just now. Try again in ${waitWords(wait)}.`, wait);
  const weak = weakPasswordReason(input.password, input);
  if (weak) throw new HttpError(400, weak, { password: weak });
  let passwordHash: string;
  try {
    passwordHash = await hashPassword(input.password);
  } catch (error) {
    if (error instanceof HashingBusyError) return retryLater(503, error.message, error.retryAfterSeconds);
    throw error;
  }
  const created = await createUser({ email: input.email, name: input.name, passwordHash });
  const baseUrl = appBaseUrl();
  if (created) {
    const token = await createEmailVerification(created.id);
    await insertNotifications([
      {
        dedupeKey: `email-verification:${created.id}:${token.slice(0, 12)}`,
        userId: created.id,
        propertyId: null,
        stepId: null,
        kind: 'email-verification',
        channel: 'email',
        message: verifyEmail({ baseUrl, name: created.name, link: verificationLink(token), validHours: EMAIL_VERIFICATION_HOURS }),
        sendAfter: new Date(),
      },
    ]);
  } else {
    const existing = await findUserByEmail(input.email);
    if (existing) {
      const hour = new Date().toISOString().slice(0, 13);
      await insertNotifications([
        {
          dedupeKey: `sign-up-again:${existing.id}:${hour}`,
          userId: existing.id,
          propertyId: null,
          stepId: null,
          kind: 'sign-up-again',
          channel: 'email',
          message: signUpAgain({ baseUrl, name: existing.name, signInUrl: signInLink() }),
          sendAfter: new Date(),
        },
      ]);
    }
  }
  return json({ message: CHECK_YOUR_EMAIL }, 202);
});
