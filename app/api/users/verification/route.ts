import { consumeEmailVerification } from '@/lib/data/users';
import { HttpError, json, parseBody, route } from '@/lib/http';
import { emailVerificationSchema } from '@/lib/validations/user';

/** Confirms an e-mail address with the token from the link. Needs no session: the link is the proof. */
export const POST = route(async (request) => {
  const { token } = await parseBody(request, emailVerificationSchema);
  if (!(await consumeEmailVerification(token))) {
    throw new HttpError(410, 'This confirmation link has expired or was already used. Sign in and ask for a new one from Settings.');
  }
  return json({ verified: true });
});
