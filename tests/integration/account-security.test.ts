// Sign-up, e-mail verification, passwords at rest, invitation limits and ended sessions, through the real server
// and the real database. E-mails are sent by the worker's own e-mail handler, run in this process against a
// fake mail relay of this file's own.
import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import { verify as argon2Verify } from '@node-rs/argon2';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Database } from '@/db/database';
import { startFakeMail, type FakeMail, type StoredMail } from '@/fakes/mail/server';
import { sendEmailNotification } from '@/jobs/handlers/email-send';
import type { JobContext } from '@/jobs/context';
import { invitationsPerPropertyPerHour, SIGN_UP_LIMIT_DEFAULTS } from '@/lib/auth/limits';
import { closeEmailTransport } from '@/lib/notify/email';
import {
  addMember, Client, createProperty, createUser, invite, privateAddress, signedInUser, tokenOf, uniqueEmail, verificationLinkFor, verifyEmailOf,
} from '../support/http';
import { testDb } from '../support/db';

let db: Kysely<Database>;
let mail: FakeMail;
const savedSmtp = process.env.SMTP_URL;

beforeAll(async () => {
  db = testDb();
  mail = await startFakeMail({ smtpPort: 0, inboxPort: 0 });
  process.env.SMTP_URL = mail.smtpUrl;
});

afterAll(async () => {
  closeEmailTransport();
  await mail?.close();
  if (savedSmtp === undefined) delete process.env.SMTP_URL;
  else process.env.SMTP_URL = savedSmtp;
  await db?.destroy();
});

const quietContext = { workerId: 'account-security-test', log: () => undefined, boss: null } as unknown as JobContext;

/** Claims one notification row the way the reminders run does, and runs the worker's e-mail handler on it. */
async function sendNow(notificationId: string) {
  const row = await db
    .updateTable('notifications')
    .set({ claimed_at: new Date(), claimed_by: quietContext.workerId, attempts: (eb) => eb('attempts', '+', 1) })
    .where('id', '=', notificationId)
    .returning('attempts')
    .executeTakeFirstOrThrow();
  return sendEmailNotification(quietContext, { id: randomUUID(), data: { notificationId, claimedBy: quietContext.workerId, attempt: row.attempts } });
}

async function inboxFor(address: string): Promise<StoredMail[]> {
  const all = (await (await fetch(`${mail.inboxUrl}/api/messages`)).json()) as StoredMail[];
  return all.filter((m) => JSON.stringify(m.to).toLowerCase().includes(address.toLowerCase()));
}

async function notificationsOf(email: string, kind: string) {
  return db
    .selectFrom('notifications')
    .innerJoin('users', 'users.id', 'notifications.user_id')
    .select(['notifications.id', 'notifications.kind'])
    .where('users.email', '=', email)
    .where('notifications.kind', '=', kind)
    .execute();
}

describe('sign-up answers the same for a new and a taken address (no enumeration)', () => {
  it('both get 202 and the same body; only the new address gets an account and a confirmation link', async () => {
    const taken = await createUser('acct-taken');
    const fresh = uniqueEmail('acct-fresh');
    const password = `pw-${randomUUID()}`;
    const again = await new Client().post('/api/users', { name: 'Someone', email: taken.email, password });
    const first = await new Client().post('/api/users', { name: 'Someone', email: fresh, password });
    expect(again.status).toBe(202);
    expect(first.status).toBe(202);
    expect(again.text).toBe(first.text);
    expect(first.body).toEqual({ message: 'Check your e-mail: we sent a link to confirm the address.' });
    // The taken address's owner is told someone tried; their password did not change.
    expect(await notificationsOf(taken.email, 'sign-up-again')).toHaveLength(1);
    expect((await new Client().signIn(taken.email, taken.password)).ok).toBe(true);
    expect(await verificationLinkFor(fresh)).toMatch(/\/verify-email\/[A-Za-z0-9_-]{43}$/);
  });

  it('the confirmation e-mail goes out through the worker and its link confirms the address once', async () => {
    const { user, client } = await signedInUser('acct-mail', { verified: false });
    const [row] = await notificationsOf(user.email, 'email-verification');
    expect(await sendNow(row.id)).toEqual({ outcome: 'sent' });
    const [message] = await inboxFor(user.email);
    expect(message.subject).toBe('Confirm your e-mail for Sowcast');
    const link = /https?:\/\/\S+\/verify-email\/[A-Za-z0-9_-]+/.exec(message.text ?? '')![0];
    // Opening the link's page changes nothing; the page's button posts the token.
    expect((await new Client().get(new URL(link).pathname)).status).toBe(200);
    expect((await client.get('/api/auth/session')).body.user.emailVerified).toBe(false);
    expect((await new Client().post('/api/users/verification', { token: tokenOf(link) })).status).toBe(200);
    expect((await client.get('/api/auth/session')).body.user.emailVerified).toBe(true);
    expect((await new Client().post('/api/users/verification', { token: tokenOf(link) })).status).toBe(410);
  });
});

describe('an unconfirmed account', () => {
  it('can sign in and plan one property, but not a second one nor join one, until it confirms', async () => {
    const { user, client } = await signedInUser('acct-unverified', { verified: false });
    await createProperty(client);
    const second = await client.post('/api/properties', { name: 'Second ground', latitude: 36.4, longitude: -90.1, timeZone: 'America/Chicago', elevationM: 100, tenure: 'owned' });
    expect(second.status).toBe(403);
    expect(second.body.error).toMatch(/Confirm your e-mail/);
    const owner = await signedInUser('acct-unverified-owner');
    const propertyId = (await createProperty(owner.client)).id;
    const { token } = await invite(owner.client, propertyId, user.email, 'member');
    const refused = await client.post(`/api/invitations/${token}/accept`);
    expect(refused.status).toBe(403);
    expect((await client.get(`/api/properties/${propertyId}`)).status).toBe(404);

    await verifyEmailOf(user.email);
    expect((await client.post(`/api/invitations/${token}/accept`)).status).toBe(200);
    expect((await client.post('/api/properties', { name: 'Second ground', latitude: 36.4, longitude: -90.1, timeZone: 'America/Chicago', elevationM: 100, tenure: 'owned' })).status).toBe(201);
  });
});

describe('sign-up limits', () => {
  it(`a ${SIGN_UP_LIMIT_DEFAULTS.perAddressPerHour + 1}th sign-up from one address within the hour is refused with 429 and Retry-After; another address goes on`, async () => {
    const address = privateAddress();
    for (let i = 0; i < SIGN_UP_LIMIT_DEFAULTS.perAddressPerHour; i++) {
      const res = await new Client('one address', address).post('/api/users', { name: 'Flood', email: uniqueEmail('acct-flood'), password: `pw-${randomUUID()}` });
      expect(res.status, `sign-up ${i + 1}: ${res.text}`).toBe(202);
    }
    const refused = await new Client('one address', address).post('/api/users', { name: 'Flood', email: uniqueEmail('acct-flood'), password: `pw-${randomUUID()}` });
    expect(refused.status).toBe(429);
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0);
    const elsewhere = await new Client().post('/api/users', { name: 'Other', email: uniqueEmail('acct-flood-other'), password: `pw-${randomUUID()}` });
    expect(elsewhere.status).toBe(202);
  });

  it('everyone together is limited too: past the hourly total a fresh address is refused (limit lowered in this process)', async () => {
    const saved = process.env.SIGN_UP_GLOBAL_PER_HOUR;
    process.env.SIGN_UP_GLOBAL_PER_HOUR = '1';
    vi.resetModules();
    try {
      const { takeSignUp } = await import('@/lib/auth/limits');
      // The shared count already holds this suite's sign-ups, so an allowance of one is spent.
      await takeSignUp(`10.250.${Math.floor(Math.random() * 250)}.1`);
      expect(await takeSignUp(`10.251.${Math.floor(Math.random() * 250)}.2`)).toBeGreaterThan(0);
    } finally {
      if (saved === undefined) delete process.env.SIGN_UP_GLOBAL_PER_HOUR;
      else process.env.SIGN_UP_GLOBAL_PER_HOUR = saved;
      vi.resetModules();
    }
  });
});

describe('passwords', () => {
  it('are stored as argon2id (RFC 9106) with OWASP\'s minimum parameters m=19456, t=2, p=1', async () => {
    const user = await createUser('acct-hash');
    const row = await db.selectFrom('users').select('password_hash').where('email', '=', user.email).executeTakeFirstOrThrow();
    expect(row.password_hash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$[A-Za-z0-9+/]{22}\$[A-Za-z0-9+/]{43}$/);
    expect(await argon2Verify(row.password_hash, user.password)).toBe(true);
  });

  it('longer than bcrypt\'s 72 bytes: a password that shares the first 72 bytes but differs after is refused', async () => {
    const prefix = 'clover-rye-oats-'.repeat(5).slice(0, 72);
    expect(Buffer.byteLength(prefix)).toBe(72);
    const email = uniqueEmail('acct-long');
    const password = `${prefix}-winter-wheat-${randomUUID()}`;
    expect((await new Client().post('/api/users', { name: 'Long', email, password })).status).toBe(202);
    // bcrypt would hash only these 72 bytes, so both would match (bcrypt(3) of OpenBSD: "only the first 72 bytes").
    expect(await bcrypt.compare(`${prefix}-something-else`, await bcrypt.hash(password, 4))).toBe(true);
    expect((await new Client().signIn(email, `${prefix}-something-else`)).ok).toBe(false);
    expect((await new Client().signIn(email, password)).ok).toBe(true);
  });

  it('an account with an older bcrypt hash still signs in, and its hash becomes argon2id', async () => {
    const email = uniqueEmail('acct-legacy');
    const password = `pw-${randomUUID()}`;
    await db.insertInto('users').values({ email, name: 'Legacy', password_hash: await bcrypt.hash(password, 10), email_verified_at: new Date() }).execute();
    expect((await new Client().signIn(email, password)).ok).toBe(true);
    const row = await db.selectFrom('users').select('password_hash').where('email', '=', email).executeTakeFirstOrThrow();
    expect(row.password_hash.startsWith('$argon2id$')).toBe(true);
    expect((await new Client().signIn(email, password)).ok).toBe(true);
  });

  it('too easy to guess, or the e-mail itself, is refused naming the password field (NIST SP 800-63B §5.1.1.2)', async () => {
    const email = uniqueEmail('acct-weak');
    for (const password of ['password1234', 'qwertyuiop12', email]) {
      const res = await new Client().post('/api/users', { name: 'Weak', email, password });
      expect(res.status, password).toBe(400);
      expect(res.body.fields.password, password).toBeTruthy();
    }
    expect(await verificationLinkFor(email)).toBeNull();
  });
});

describe('invitations', () => {
  // The test server's allowance comes from INVITATIONS_PER_PROPERTY_PER_HOUR (scripts/lib/services.mjs), which the
  // harness also hands to this process; production's default is INVITATION_LIMIT_DEFAULTS.perPropertyPerHour (20).
  it(`a property sends at most ${invitationsPerPropertyPerHour()} an hour; the next is 429 with Retry-After`, async () => {
    const owner = await signedInUser('acct-invite-limit');
    const propertyId = (await createProperty(owner.client)).id;
    for (let i = 0; i < invitationsPerPropertyPerHour(); i++) await invite(owner.client, propertyId, uniqueEmail('acct-inv'), 'viewer');
    const refused = await owner.client.post(`/api/properties/${propertyId}/invitations`, { email: uniqueEmail('acct-inv'), role: 'viewer' });
    expect(refused.status).toBe(429);
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0);
    // Another property of the same owner has its own allowance.
    const other = (await createProperty(owner.client)).id;
    await invite(owner.client, other, uniqueEmail('acct-inv'), 'viewer');
  });

  it('a revoked invitation is never sent: the sender re-checks it and drops the e-mail', async () => {
    const owner = await signedInUser('acct-invite-revoke');
    const propertyId = (await createProperty(owner.client)).id;
    const invitee = uniqueEmail('acct-revoked');
    const { id } = await invite(owner.client, propertyId, invitee, 'member');
    expect((await owner.client.delete(`/api/properties/${propertyId}/invitations/${id}`)).status).toBe(204);
    const row = await db.selectFrom('notifications').select('id').where('invitation_id', '=', id).executeTakeFirstOrThrow();
    expect(await sendNow(row.id)).toEqual({ outcome: 'dropped' });
    expect(await inboxFor(invitee)).toHaveLength(0);
    const after = await db.selectFrom('notifications').select(['failed_at', 'last_error', 'message']).where('id', '=', row.id).executeTakeFirstOrThrow();
    expect(after.failed_at).not.toBeNull();
    expect(JSON.stringify(after.message)).not.toContain('/invitations/');

    // A live one is sent.
    const live = await invite(owner.client, propertyId, uniqueEmail('acct-live'), 'member');
    const liveRow = await db.selectFrom('notifications').select('id').where('invitation_id', '=', live.id).executeTakeFirstOrThrow();
    expect(await sendNow(liveRow.id)).toEqual({ outcome: 'sent' });
  });
});

describe('ended sessions: a copied session cookie stops working', () => {
  const copyOf = (client: Client) => {
    const copy = new Client('copy');
    return { copy, cookie: `next-auth.session-token=${client.cookie('next-auth.session-token')}` };
  };

  it('after signing out on that device; another device of the same person stays signed in', async () => {
    const { user, client } = await signedInUser('acct-signout');
    const phone = new Client('phone');
    expect((await phone.signIn(user.email, user.password)).ok).toBe(true);
    const { copy, cookie } = copyOf(client);
    expect((await copy.get('/api/properties', { headers: { cookie } })).status).toBe(200);
    const csrf = await client.get('/api/auth/csrf');
    await client.request('POST', '/api/auth/signout', {
      raw: new URLSearchParams({ csrfToken: csrf.body.csrfToken, json: 'true' }).toString(),
      contentType: 'application/x-www-form-urlencoded',
    });
    expect((await copy.get('/api/properties', { headers: { cookie } })).status).toBe(401);
    expect((await phone.get('/api/properties')).status).toBe(200);
  });

  it('after "sign out everywhere", on every device', async () => {
    const { user, client } = await signedInUser('acct-everywhere');
    const phone = new Client('phone');
    expect((await phone.signIn(user.email, user.password)).ok).toBe(true);
    const { copy, cookie } = copyOf(client);
    expect((await client.delete('/api/settings/sessions')).status).toBe(204);
    expect((await copy.get('/api/properties', { headers: { cookie } })).status).toBe(401);
    expect((await phone.get('/api/properties')).status).toBe(401);
    expect((await new Client().signIn(user.email, user.password)).ok).toBe(true);
  });

  it('after a password change; the new password works and the old one does not', async () => {
    const { user, client } = await signedInUser('acct-password');
    const phone = new Client('phone');
    expect((await phone.signIn(user.email, user.password)).ok).toBe(true);
    const wrong = await client.post('/api/settings/password', { currentPassword: 'not-it-at-all', newPassword: `new-${randomUUID()}` });
    expect(wrong.status).toBe(400);
    expect(wrong.body.fields.currentPassword).toBeTruthy();
    const weak = await client.post('/api/settings/password', { currentPassword: user.password, newPassword: 'password1234' });
    expect(weak.status).toBe(400);
    expect(weak.body.fields.newPassword).toBeTruthy();
    const newPassword = `new-${randomUUID()}`;
    expect((await client.post('/api/settings/password', { currentPassword: user.password, newPassword })).status).toBe(200);
    expect((await phone.get('/api/properties')).status).toBe(401);
    expect((await client.get('/api/properties')).status).toBe(401);
    expect((await new Client().signIn(user.email, user.password)).ok).toBe(false);
    expect((await new Client().signIn(user.email, newPassword)).ok).toBe(true);
  });

  it('after the person is removed from a property or their role is lowered', async () => {
    const owner = await signedInUser('acct-role-owner');
    const propertyId = (await createProperty(owner.client)).id;
    const member = await signedInUser('acct-role-member');
    await addMember(owner.client, propertyId, member, 'manager');
    const { copy, cookie } = copyOf(member.client);
    expect((await owner.client.patch(`/api/properties/${propertyId}/members/${member.user.id}`, { role: 'viewer' })).status).toBe(200);
    expect((await copy.get('/api/properties', { headers: { cookie } })).status).toBe(401);
    expect((await member.client.signIn(member.user.email, member.user.password)).ok).toBe(true);
    const second = copyOf(member.client);
    expect((await owner.client.delete(`/api/properties/${propertyId}/members/${member.user.id}`)).status).toBe(204);
    expect((await second.copy.get('/api/properties', { headers: { cookie: second.cookie } })).status).toBe(401);
    // The owner's own session is untouched.
    expect((await owner.client.get(`/api/properties/${propertyId}`)).status).toBe(200);
  });
});
