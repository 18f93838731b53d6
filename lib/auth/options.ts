import { randomUUID } from 'node:crypto';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { activeSessionUser, endSession, findUserByEmail, recordSignInAttempt, setPasswordHash } from '@/lib/data/users';
import { signInSchema } from '@/lib/validations/user';
import { addressKey, clientAddress, trustedProxyHops } from './client-address';
import { recordSignInFailure, recordSignInSuccess, signInWaitSeconds, waitWords } from './limits';
import { hashPassword, HashingBusyError, needsRehash, verifyPassword } from './passwords';

export const BAD_CREDENTIALS = 'That e-mail and password do not match an account.';
export const SIGN_IN_BUSY = 'Sowcast is busy checking passwords. Try again in a few seconds.';
/** Said instead of checking the password while this e-mail (or this address) must wait. */
export const tooManyAttempts = (seconds: number) =>
  `Too many failed sign-ins for this account from here. Wait ${waitWords(seconds)} and try again.`;

/** True for the messages authorize() itself throws (the sign-in page shows only those from its URL). */
export const isSignInMessage = (message: string) =>
  message === BAD_CREDENTIALS ||
  message === SIGN_IN_BUSY ||
  /^Too many failed sign-ins for this account from here\. Wait \d{1,4} (seconds?|minutes) and try again\.$/.test(message);

const SESSION_MAX_AGE_SECONDS = 30 * 24 * 60 * 60;
const secureCookies = (process.env.NEXTAUTH_URL ?? '').startsWith('https://');

function header(headers: unknown, name: string): string | null {
  if (!headers) return null;
  if (typeof (headers as Headers).get === 'function') return (headers as Headers).get(name);
  const value = (headers as Record<string, string | string[] | undefined>)[name];
  return Array.isArray(value) ? value.join(', ') : (value ?? null);
}

/** What the session token carries besides next-auth's own claims. */
interface SessionClaims {
  uid?: string;
  /** This session's id: signing out on one device ends this id only. */
  sid?: string;
  /** The account's session version when the token was issued. */
  sv?: number;
  verified?: boolean;
  /** Whether this very request read the account (false only when the database could not be reached). */
  checked?: boolean;
}

export const authOptions: NextAuthOptions = {
  secret: process.env.NEXTAUTH_SECRET,
  session: { strategy: 'jwt', maxAge: SESSION_MAX_AGE_SECONDS },
  pages: { signIn: '/sign-in' },
  // Secure when the configured address is https; otherwise left to next-auth, which then judges by the
  // address it is reached at, so an https deployment without NEXTAUTH_URL still gets Secure cookies.
  useSecureCookies: secureCookies || undefined,
  logger: {
    // An ended session is refused by throwing from the jwt callback (next-auth then clears the cookie); that is
    // expected, not an error worth a stack trace on every request.
    error(code, metadata) {
      if (code === 'JWT_SESSION_ERROR') return;
      console.error(JSON.stringify({ level: 'error', msg: `next-auth ${code}`, error: String((metadata as Error)?.message ?? metadata) }));
    },
    warn() {},
    debug() {},
  },
  providers: [
    CredentialsProvider({
      name: 'E-mail and password',
      credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
      async authorize(credentials, request) {
        const parsed = signInSchema.safeParse(credentials ?? {});
        if (!parsed.success) throw new Error(BAD_CREDENTIALS);
        const { email, password } = parsed.data;
        const address = clientAddress(header(request?.headers, 'x-forwarded-for'), trustedProxyHops());
        const key = addressKey(address);
        const wait = await signInWaitSeconds(email, key);
        if (wait > 0) throw new Error(tooManyAttempts(wait));
        const user = await findUserByEmail(email);
        let ok: boolean;
        try {
          // An unknown e-mail is checked against a dummy hash of the same cost: same time, same answer.
          ok = await verifyPassword(password, user?.password_hash);
        } catch (error) {
          if (error instanceof HashingBusyError) throw new Error(SIGN_IN_BUSY);
          throw error;
        }
        await recordSignInAttempt(email, address, Boolean(user && ok));
        if (!user || !ok) {
          await recordSignInFailure(email, key);
          throw new Error(BAD_CREDENTIALS);
        }
        await recordSignInSuccess(email, key);
        // Older hashes (bcrypt, earlier argon2 settings) become today's while the password is at hand.
        if (needsRehash(user.password_hash)) {
          await hashPassword(password).then((hash) => setPasswordHash(user.id, hash, false), () => undefined);
        }
        return { id: user.id, email: user.email, name: user.name, sessionVersion: user.session_version };
      },
    }),
  ],
  callbacks: {
    // Runs on every request that reads the session: a token whose session has ended stops here, so a copied
    // token is worth nothing after sign-out, sign-out everywhere, a password change or a role taken away.
    async jwt({ token, user }) {
      const claims = token as typeof token & SessionClaims;
      if (user) {
        claims.uid = user.id;
        claims.sid = randomUUID();
        claims.sv = (user as { sessionVersion?: number }).sessionVersion ?? 0;
      }
      if (!claims.uid || !claims.sid || typeof claims.sv !== 'number') throw new Error('session token without a session');
      let current: Awaited<ReturnType<typeof activeSessionUser>>;
      try {
        current = await activeSessionUser(claims.uid, claims.sid, claims.sv);
      } catch {
        // The database is out of reach: that is no sign-out. getCurrentUser asks again and answers 503.
        claims.checked = false;
        return claims;
      }
      if (!current) throw new Error('session ended');
      claims.checked = true;
      claims.name = current.name;
      claims.email = current.email;
      claims.verified = Boolean(current.email_verified_at);
      return claims;
    },
    async session({ session, token }) {
      const claims = token as typeof token & SessionClaims;
      if (session.user) {
        const user = session.user as { id?: string; emailVerified?: boolean; name?: string | null; email?: string | null };
        user.id = claims.uid;
        user.name = claims.name;
        user.email = claims.email;
        user.emailVerified = Boolean(claims.verified);
        Object.assign(user, { checked: claims.checked === true, sid: claims.sid, sv: claims.sv });
      }
      return session;
    },
  },
  events: {
    async signOut({ token }) {
      const claims = token as (typeof token & SessionClaims) | null;
      if (!claims?.sid || !claims.uid) return;
      const expires = typeof claims.exp === 'number' ? new Date(claims.exp * 1000) : new Date(Date.now() + SESSION_MAX_AGE_SECONDS * 1000);
      await endSession(claims.sid, claims.uid, expires);
    },
  },
};
