import { sql } from 'kysely';
import { getDb } from '@/db';

export async function findUserByEmail(email: string) {
  return getDb().selectFrom('users').selectAll().where('email', '=', email.toLowerCase()).executeTakeFirst();
}

export async function findUserById(id: string) {
  return getDb().selectFrom('users').select(['id', 'email', 'name']).where('id', '=', id).executeTakeFirst();
}

/** Creates a user; returns null when the e-mail is taken (the unique index decides, not a prior read). */
export async function createUser(input: { email: string; name: string; passwordHash: string }) {
  const row = await getDb()
    .insertInto('users')
    .values({ email: input.email.toLowerCase(), name: input.name, password_hash: input.passwordHash })
    .onConflict((oc) => oc.column('email').doNothing())
    .returning(['id', 'email', 'name'])
    .executeTakeFirst();
  return row ?? null;
}

export async function recordSignInAttempt(email: string, ip: string | null, succeeded: boolean) {
  await getDb().insertInto('sign_in_attempts').values({ email: email.toLowerCase(), ip, succeeded }).execute();
}

/** Failed attempts in the last `minutes`, for one e-mail and for one address. */
export async function recentFailures(email: string, ip: string | null, minutes: number) {
  const since = sql<Date>`now() - make_interval(mins => ${minutes})`;
  const db = getDb();
  const byEmail = await db
    .selectFrom('sign_in_attempts')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('email', '=', email.toLowerCase())
    .where('succeeded', '=', false)
    .where('attempted_at', '>', since)
    .executeTakeFirstOrThrow();
  const byIp = ip
    ? await db
        .selectFrom('sign_in_attempts')
        .select((eb) => eb.fn.countAll<number>().as('n'))
        .where('ip', '=', ip)
        .where('succeeded', '=', false)
        .where('attempted_at', '>', since)
        .executeTakeFirstOrThrow()
    : { n: 0 };
  return { byEmail: Number(byEmail.n), byIp: Number(byIp.n) };
}
