import bcrypt from 'bcryptjs';
import { createUser } from '@/lib/data/users';
import { HttpError, json, parseBody, route } from '@/lib/http';
import { signUpSchema } from '@/lib/validations/user';

/** Sign-up. The answer does not say whether an e-mail was already registered beyond the field message. */
export const POST = route(async (request) => {
  const input = await parseBody(request, signUpSchema);
  const passwordHash = await bcrypt.hash(input.password, 12);
  const user = await createUser({ email: input.email, name: input.name, passwordHash });
  if (!user) {
    throw new HttpError(409, 'An account with that e-mail already exists; sign in instead', {
      email: 'An account with that e-mail already exists',
    });
  }
  return json({ user: { id: user.id, email: user.email, name: user.name } }, 201);
});
