import { requireUser } from '@/lib/auth/session';
import { bumpSessionVersion } from '@/lib/data/users';
import { route } from '@/lib/http';

/** Signs the account out everywhere: every session token issued so far stops working, this one included. */
export const DELETE = route(async () => {
  const user = await requireUser();
  await bumpSessionVersion(user.id);
  return new Response(null, { status: 204 });
});
