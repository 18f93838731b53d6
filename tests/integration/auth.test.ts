// Sign-up and sign-in through next-auth's real credentials flow over HTTP.
import { randomUUID } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import bcrypt from 'bcryptjs';
import type { Kysely } from 'kysely';
import type { Database } from '@/db/database';
import { BAD_CREDENTIALS, SIGN_IN_LIMIT, TOO_MANY_ATTEMPTS } from '@/lib/auth/options';
import { Client, createUser, parseSetCookie, privateAddress, SESSION_COOKIE, signedInUser, uniqueEmail } from '../support/http';
import { testDb } from '../support/db';

let db: Kysely<Database>;

beforeAll(() => {
  db = testDb();
});

afterAll(async () => {
  await db?.destroy();
});

const sessionCookieOf = (setCookies: string[]) =>
  setCookies.map(parseSetCookie).find((c) => c.name === SESSION_COOKIE);

describe('sign-up and sign-in', () => {
  it('a new account can sign in, and the session names that user', async () => {
    const user = await createUser('auth-ok');
    const client = new Client('auth-ok');
    const result = await client.signIn(user.email, user.password);
    expect(result.ok, JSON.stringify(result)).toBe(true);
    expect(result.error).toBeNull();
    const session = await client.get('/api/auth/session');
    expect(session.body.user).toMatchObject({ email: user.email, name: user.name, id: user.id });
    expect((await client.get('/api/properties')).status).toBe(200);
  });

  it('the e-mail is matched whatever its letter case', async () => {
    const user = await createUser('auth-case');
    const result = await new Client().signIn(user.email.toUpperCase(), user.password);
    expect(result.ok).toBe(true);
  });

  it('a wrong password gets no session cookie and the generic message', async () => {
    const user = await createUser('auth-wrong');
    const client = new Client('auth-wrong');
    const result = await client.signIn(user.email, `${user.password}x`);
    expect(result.ok).toBe(false);
    expect(result.status).toBe(401);
    expect(result.error).toBe(BAD_CREDENTIALS);
    expect(sessionCookieOf(result.setCookies)).toBeUndefined();
    expect(client.signedIn).toBe(false);
    expect((await client.get('/api/properties')).status).toBe(401);
  });

  it('an unknown e-mail gets exactly the answer a wrong password gets (no account enumeration)', async () => {
    const user = await createUser('auth-enum');
    const wrong = await new Client().signIn(user.email, 'not-the-password-1');
    const unknown = await new Client().signIn(uniqueEmail('auth-nobody'), 'not-the-password-1');
    expect(unknown.status).toBe(wrong.status);
    expect(unknown.error).toBe(wrong.error);
    expect(unknown.error).toBe(BAD_CREDENTIALS);
    expect(sessionCookieOf(unknown.setCookies)).toBeUndefined();
  });

  it('a malformed e-mail or empty password is refused with the same message', async () => {
    for (const [email, password] of [['not-an-email', 'whatever-123'], [uniqueEmail('auth-empty'), '']]) {
      const result = await new Client().signIn(email, password);
      expect(result.ok).toBe(false);
      expect(result.error).toBe(BAD_CREDENTIALS);
    }
  });

  it(`after ${SIGN_IN_LIMIT.perEmail} failures for one e-mail within ${SIGN_IN_LIMIT.windowMinutes} minutes even the right password is refused`, async () => {
    const user = await createUser('auth-limit');
    const client = new Client('auth-limit');
    for (let i = 0; i < SIGN_IN_LIMIT.perEmail; i++) {
      const result = await client.signIn(user.email, `wrong-${i}-password`);
      expect(result.error, `attempt ${i + 1}`).toBe(BAD_CREDENTIALS);
    }
    const right = await client.signIn(user.email, user.password);
    expect(right.ok).toBe(false);
    expect(right.error).toBe(TOO_MANY_ATTEMPTS);
    expect(sessionCookieOf(right.setCookies)).toBeUndefined();
    // From another address too: the limit is on the account, not only on where the tries come from.
    const elsewhere = await new Client('elsewhere').signIn(user.email, user.password);
    expect(elsewhere.error).toBe(TOO_MANY_ATTEMPTS);
    // Another account is not affected.
    const other = await createUser('auth-limit-other');
    expect((await client.signIn(other.email, other.password)).ok).toBe(true);
  });

  it(`${SIGN_IN_LIMIT.perIp} failures from one address lock that address out, not others`, async () => {
    const address = privateAddress();
    const user = await createUser('auth-ip');
    const from = new Client('one address', address);
    for (let i = 0; i < SIGN_IN_LIMIT.perIp; i++) {
      const result = await from.signIn(uniqueEmail('auth-ip-guess'), 'guessing-password');
      expect(result.error, `attempt ${i + 1}`).toBe(BAD_CREDENTIALS);
    }
    const blocked = await new Client('same address', address).signIn(user.email, user.password);
    expect(blocked.error).toBe(TOO_MANY_ATTEMPTS);
    const fine = await new Client('other address').signIn(user.email, user.password);
    expect(fine.ok).toBe(true);
  });

  it('a sign-in without the CSRF token is refused (next-auth double-submit cookie check)', async () => {
    const user = await createUser('auth-csrf');
    const client = new Client('auth-csrf');
    const form = new URLSearchParams({ email: user.email, password: user.password, json: 'true' });
    const res = await client.request('POST', '/api/auth/callback/credentials', {
      raw: form.toString(),
      contentType: 'application/x-www-form-urlencoded',
    });
    expect(sessionCookieOf(res.setCookies)).toBeUndefined();
    expect(client.signedIn).toBe(false);
  });
});

describe('the session cookie', () => {
  let setCookies: string[];
  let client: Client;

  beforeAll(async () => {
    const user = await createUser('auth-cookie');
    client = new Client('auth-cookie');
    const result = await client.signIn(user.email, user.password);
    expect(result.ok).toBe(true);
    setCookies = result.setCookies;
  });

  it('is HttpOnly and SameSite=Lax, for the whole site (RFC 6265 §4.1.2; SameSite per RFC 6265bis)', () => {
    const cookie = sessionCookieOf(setCookies);
    expect(cookie).toBeDefined();
    expect(cookie!.attributes.httponly).toBe(true);
    expect(String(cookie!.attributes.samesite).toLowerCase()).toBe('lax');
    expect(cookie!.attributes.path).toBe('/');
  });

  it('is not marked Secure on a plain-http address (a Secure cookie is never sent over http, RFC 6265 §4.1.2.5)', () => {
    const cookie = sessionCookieOf(setCookies)!;
    expect(new URL(process.env.SOWCAST_BASE_URL!).protocol).toBe('http:');
    expect(cookie.attributes.secure).toBeUndefined();
  });

  it('lasts about 30 days (the configured session age)', () => {
    const cookie = sessionCookieOf(setCookies)!;
    const expires = Date.parse(String(cookie.attributes.expires));
    const days = (expires - Date.now()) / 86_400_000;
    expect(days).toBeGreaterThan(29.9);
    expect(days).toBeLessThan(30.1);
  });

  it('is an encrypted token (JWE compact form, five dot-separated parts, RFC 7516 §7.1) that does not show the e-mail', async () => {
    const cookie = sessionCookieOf(setCookies)!;
    expect(cookie.value.split('.')).toHaveLength(5);
    const session = await client.get('/api/auth/session');
    const email: string = session.body.user.email;
    expect(cookie.value).not.toContain(Buffer.from(email).toString('base64url').slice(0, 12));
  });

  it('a tampered cookie is not a session', async () => {
    const cookie = sessionCookieOf(setCookies)!;
    const tampered = new Client('tampered');
    const parts = cookie.value.split('.');
    parts[3] = parts[3].slice(0, -2) + (parts[3].endsWith('AA') ? 'BB' : 'AA');
    const res = await tampered.request('GET', '/api/properties', { headers: { cookie: `${SESSION_COOKIE}=${parts.join('.')}` } });
    expect(res.status).toBe(401);
  });

  it('stops working once the account is gone', async () => {
    const { user, client: gone } = await signedInUser('auth-gone');
    expect((await gone.get('/api/properties')).status).toBe(200);
    await db.deleteFrom('users').where('id', '=', user.id).execute();
    expect((await gone.get('/api/properties')).status).toBe(401);
  });

  it('is cleared by signing out', async () => {
    const { client: leaving } = await signedInUser('auth-out');
    const csrf = await leaving.get('/api/auth/csrf');
    const res = await leaving.request('POST', '/api/auth/signout', {
      raw: new URLSearchParams({ csrfToken: csrf.body.csrfToken, json: 'true' }).toString(),
      contentType: 'application/x-www-form-urlencoded',
    });
    expect(res.status).toBe(200);
    expect(leaving.signedIn).toBe(false);
    expect((await leaving.get('/api/properties')).status).toBe(401);
  });
});

describe('passwords at rest', () => {
  it('are bcrypt hashes ($2a$/$2b$ modular-crypt prefix, OpenBSD bcrypt) that verify with bcryptjs', async () => {
    const password = `pw-${randomUUID()}`;
    const email = uniqueEmail('auth-hash');
    const res = await new Client().post('/api/users', { name: 'Hash', email, password });
    expect(res.status).toBe(201);
    expect(JSON.stringify(res.body)).not.toContain(password);
    const row = await db.selectFrom('users').select('password_hash').where('email', '=', email).executeTakeFirstOrThrow();
    expect(row.password_hash).toMatch(/^\$2[aby]\$\d{2}\$[./A-Za-z0-9]{53}$/);
    // Work factor: OWASP's password storage cheat sheet asks for at least 10.
    expect(Number(row.password_hash.slice(4, 6))).toBeGreaterThanOrEqual(10);
    expect(row.password_hash).not.toContain(password);
    expect(await bcrypt.compare(password, row.password_hash)).toBe(true);
    expect(await bcrypt.compare(`${password}!`, row.password_hash)).toBe(false);
  });

  it('the sign-up answer carries no hash', async () => {
    const res = await new Client().post('/api/users', { name: 'No hash', email: uniqueEmail('auth-nohash'), password: `pw-${randomUUID()}` });
    expect(Object.keys(res.body.user).sort()).toEqual(['email', 'id', 'name']);
  });
});
