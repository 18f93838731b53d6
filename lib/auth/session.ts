import { getServerSession } from 'next-auth';
import { activeSessionUser } from '@/lib/data/users';
import { HttpError } from '@/lib/http';
import { authOptions } from './options';

export interface CurrentUser {
  id: string;
  email: string;
  name: string;
  /** Has followed the link in the verification e-mail. */
  emailVerified: boolean;
}

/**
 * The signed-in user, or null. The single way to ask "who is this?". The session callbacks in options.ts
 * have already read the account and refused a session that has ended (account gone, signed out, version moved).
 */
export async function getCurrentUser(): Promise<CurrentUser | null> {
  const session = await getServerSession(authOptions);
  const user = session?.user as
    | { id?: string; email?: string | null; name?: string | null; emailVerified?: boolean; checked?: boolean; sid?: string; sv?: number }
    | undefined;
  if (!user?.id || !user.email) return null;
  if (!user.checked) {
    // The session callback could not reach the database: ask again, so an outage answers 503 (lib/http.ts)
    // rather than "sign in first", and an ended session is still refused.
    if (!user.sid || typeof user.sv !== 'number') return null;
    const current = await activeSessionUser(user.id, user.sid, user.sv);
    if (!current) return null;
    return { id: current.id, email: current.email, name: current.name, emailVerified: Boolean(current.email_verified_at) };
  }
  return { id: user.id, email: user.email, name: user.name ?? '', emailVerified: Boolean(user.emailVerified) };
}

export async function requireUser(): Promise<CurrentUser> {
  const user = await getCurrentUser();
  if (!user) throw new HttpError(401, 'Sign in first');
  return user;
}

/** For what an unconfirmed account may not do yet: 403 saying how to confirm. */
export function requireVerifiedEmail(user: CurrentUser, action: string): void {
  if (!user.emailVerified) {
    throw new HttpError(403, `Confirm your e-mail before you ${action}: follow the link Sowcast sent to ${user.email}.`);
  }
}
