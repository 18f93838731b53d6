import { getServerSession } from 'next-auth';
import { HttpError } from '@/lib/http';
import { findUserById } from '@/lib/data/users';
import { authOptions } from './options';

export interface CurrentUser {
  id: string;
  email: string;
  name: string;
}

/** The signed-in user, or null. The single way to ask "who is this?". */
export async function getCurrentUser(): Promise<CurrentUser | null> {
  const session = await getServerSession(authOptions);
  const id = (session?.user as { id?: string } | undefined)?.id;
  if (!id) return null;
  // The account may have been removed since the token was issued.
  const user = await findUserById(id);
  return user ?? null;
}

export async function requireUser(): Promise<CurrentUser> {
  const user = await getCurrentUser();
  if (!user) throw new HttpError(401, 'Sign in first');
  return user;
}
