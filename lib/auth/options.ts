import bcrypt from 'bcryptjs';
import type { NextAuthOptions } from 'next-auth';
import CredentialsProvider from 'next-auth/providers/credentials';
import { findUserByEmail, recentFailures, recordSignInAttempt } from '@/lib/data/users';
import { signInSchema } from '@/lib/validations/user';

// Slow guessing: after this many failures in the window, refuse further tries for that e-mail or address.
export const SIGN_IN_LIMIT = { perEmail: 5, perIp: 30, windowMinutes: 15 };
export const BAD_CREDENTIALS = 'That e-mail and password do not match an account.';
export const TOO_MANY_ATTEMPTS = 'Too many failed sign-ins. Wait 15 minutes and try again.';

// A hash to compare against when the e-mail is unknown, so both cases take the same time.
const DUMMY_HASH = bcrypt.hashSync('sowcast-no-such-user', 10);

function clientIp(headers: Record<string, string | string[] | undefined> | undefined): string | null {
  const forwarded = headers?.['x-forwarded-for'];
  const value = Array.isArray(forwarded) ? forwarded[0] : forwarded;
  return value?.split(',')[0]?.trim() || null;
}

const secureCookies = (process.env.NEXTAUTH_URL ?? '').startsWith('https://');

export const authOptions: NextAuthOptions = {
  secret: process.env.NEXTAUTH_SECRET,
  session: { strategy: 'jwt', maxAge: 30 * 24 * 60 * 60 },
  pages: { signIn: '/sign-in' },
  // Secure when the configured address is https; otherwise left to next-auth, which then judges by the
  // address it is reached at, so an https deployment without NEXTAUTH_URL still gets Secure cookies.
  useSecureCookies: secureCookies || undefined,
  providers: [
    CredentialsProvider({
      name: 'E-mail and password',
      credentials: { email: { label: 'E-mail', type: 'email' }, password: { label: 'Password', type: 'password' } },
      async authorize(credentials, request) {
        const parsed = signInSchema.safeParse(credentials ?? {});
        if (!parsed.success) throw new Error(BAD_CREDENTIALS);
        const { email, password } = parsed.data;
        const ip = clientIp(request?.headers as Record<string, string> | undefined);
        const failures = await recentFailures(email, ip, SIGN_IN_LIMIT.windowMinutes);
        if (failures.byEmail >= SIGN_IN_LIMIT.perEmail || failures.byIp >= SIGN_IN_LIMIT.perIp) {
          throw new Error(TOO_MANY_ATTEMPTS);
        }
        const user = await findUserByEmail(email);
        const ok = await bcrypt.compare(password, user?.password_hash ?? DUMMY_HASH);
        await recordSignInAttempt(email, ip, Boolean(user && ok));
        if (!user || !ok) throw new Error(BAD_CREDENTIALS);
        return { id: user.id, email: user.email, name: user.name };
      },
    }),
  ],
  callbacks: {
    async jwt({ token, user }) {
      if (user) token.uid = user.id;
      return token;
    },
    async session({ session, token }) {
      if (session.user) (session.user as { id?: string }).id = token.uid as string;
      return session;
    },
  },
};
