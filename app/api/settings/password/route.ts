import { weakPasswordReason } from '@/lib/auth/password-strength';
import { hashPassword, HashingBusyError, verifyPassword } from '@/lib/auth/passwords';
import { retryLater } from '@/lib/auth/limits';
import { requireUser } from '@/lib/auth/session';
import { findUserByEmail, setPasswordHash } from '@/lib/data/users';
import { HttpError, json, parseBody, route } from '@/lib/http';
import { passwordChangeSchema } from '@/lib/validations/user';

/** Changes the password and ends every session of the account, this one included: sign in again after. */
export const POST = route(async (request) => {
  const user = await requireUser();
  const input = await parseBody(request, passwordChangeSchema);
  const account = await findUserByEmail(user.email);
  if (!account) throw new HttpError(401, 'Sign in first');
  try {
    if (!(await verifyPassword(input.currentPassword, account.password_hash))) {
      throw new HttpError(400, 'The current password is not right', { currentPassword: 'The current password is not right' });
    }
    const weak = weakPasswordReason(input.newPassword, user);
    if (weak) throw new HttpError(400, weak, { newPassword: weak });
    await setPasswordHash(user.id, await hashPassword(input.newPassword), true);
  } catch (error) {
    if (error instanceof HashingBusyError) return retryLater(503, error.message, error.retryAfterSeconds);
    throw error;
  }
  return json({ changed: true, signedOut: true });
});
