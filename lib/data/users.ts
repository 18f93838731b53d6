import { createHash, randomBytes } from 'node:crypto';
import { sql, type Kysely, type Transaction } from 'kysely';
import { getDb } from '@/db';
import type { Database } from '@/db/database';

export async function findUserByEmail(email: string) {
  return getDb().selectFrom('users').selectAll().where('email', '=', email.toLowerCase()).executeTakeFirst();
}

/** Creates a user; returns null when the e-mail is taken (the unique index decides, not a prior read). */
export async function createUser(input: { email: string; name: string; passwordHash: string; verified?: boolean }) {
  const row = await getDb()
    .insertInto('users')
    .values({
      email: input.email.toLowerCase(),
      name: input.name,
      password_hash: input.passwordHash,
      email_verified_at: input.verified ? new Date() : null,
    })
    .onConflict((oc) => oc.column('email').doNothing())
    .returning(['id', 'email', 'name'])
    .executeTakeFirst();
  return row ?? null;
}

export async function recordSignInAttempt(email: string, ip: string | null, succeeded: boolean) {
  await getDb().insertInto('sign_in_attempts').values({ email: email.toLowerCase(), ip, succeeded }).execute();
}

/** Replaces a password hash. `endSessions` also bumps the session version (a password change, not a rehash). */
export async function setPasswordHash(userId: string, passwordHash: string, endSessions: boolean) {
  await getDb()
    .updateTable('users')
    .set({ password_hash: passwordHash, ...(endSessions ? { session_version: sql<number>`session_version + 1` } : {}) })
    .where('id', '=', userId)
    .execute();
}

// ---- sessions ----------------------------------------------------------------------------------------------

/**
 * The account behind a session token, or undefined when the session has ended: the account is gone, its
 * session version moved on (signed out everywhere, password changed, a role taken away), or this session
 * was signed out on its own.
 */
export async function activeSessionUser(userId: string, sessionId: string, sessionVersion: number) {
  return getDb()
    .selectFrom('users')
    .select(['id', 'email', 'name', 'email_verified_at'])
    .where('id', '=', userId)
    .where('session_version', '=', sessionVersion)
    .where(({ not, exists, selectFrom }) =>
      not(exists(selectFrom('signed_out_sessions').select('session_id').where('session_id', '=', sessionId))),
    )
    .executeTakeFirst();
}

/** Ends one session: its token is refused from now until it would have expired anyway. */
export async function endSession(sessionId: string, userId: string, expiresAt: Date) {
  const db = getDb();
  await db
    .insertInto('signed_out_sessions')
    .values({ session_id: sessionId, user_id: userId, expires_at: expiresAt })
    .onConflict((oc) => oc.column('session_id').doNothing())
    .execute();
  // Rows past their token's expiry refuse nothing any more.
  await db.deleteFrom('signed_out_sessions').where('expires_at', '<', new Date()).execute();
}

/** Ends every session of the account (each token carries the version it was issued under). */
export async function bumpSessionVersion(userId: string, db: Kysely<Database> | Transaction<Database> = getDb()) {
  await db.updateTable('users').set({ session_version: sql<number>`session_version + 1` }).where('id', '=', userId).execute();
}

// ---- e-mail verification -----------------------------------------------------------------------------------

export const EMAIL_VERIFICATION_HOURS = 48;
const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

/** A new verification token for the account (256 random bits); only its hash is stored. */
export async function createEmailVerification(userId: string) {
  const token = randomBytes(32).toString('base64url');
  await getDb()
    .insertInto('email_verifications')
    .values({ user_id: userId, token_hash: hashToken(token), expires_at: new Date(Date.now() + EMAIL_VERIFICATION_HOURS * 3_600_000) })
    .execute();
  return token;
}

/** Marks the account of an unused, unexpired token verified; false for any other token. Once only. */
export async function consumeEmailVerification(token: string): Promise<boolean> {
  if (!/^[A-Za-z0-9_-]{20,100}$/.test(token)) return false;
  return getDb().transaction().execute(async (trx) => {
    const used = await trx
      .updateTable('email_verifications')
      .set({ used_at: new Date() })
      .where('token_hash', '=', hashToken(token))
      .where('used_at', 'is', null)
      .where('expires_at', '>', new Date())
      .returning('user_id')
      .executeTakeFirst();
    if (!used) return false;
    await trx
      .updateTable('users')
      .set({ email_verified_at: new Date() })
      .where('id', '=', used.user_id)
      .where('email_verified_at', 'is', null)
      .execute();
    return true;
  });
}

/** Whether the account has confirmed its e-mail. */
export async function isEmailVerified(userId: string): Promise<boolean> {
  const row = await getDb().selectFrom('users').select('email_verified_at').where('id', '=', userId).executeTakeFirst();
  return Boolean(row?.email_verified_at);
}
