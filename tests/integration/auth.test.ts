// Sign-up and sign-in through next-auth's real credentials flow over HTTP.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Kysely } from 'kysely';
import type { Database } from '@/db/database';
import { delayAfterFailures, SIGN_IN_DELAY_DEFAULTS } from '@/lib/auth/limits';
import { BAD_CREDENTIALS, isSignInMessage } from '@/lib/auth/options';
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

  it(`after ${SIGN_IN_DELAY_DEFAULTS.pairFreeFailures} failures for one account from one address, that pair waits ${SIGN_IN_DELAY_DEFAULTS.firstDelaySeconds} s; the right password from elsewhere is not refused`, async () => {
    const user = await createUser('auth-limit');
    const address = privateAddress();
    for (let i = 0; i < SIGN_IN_DELAY_DEFAULTS.pairFreeFailures; i++) {
      const result = await new Client('guesser', address).signIn(user.email, `wrong-${i}-password`);
      expect(result.error, `attempt ${i + 1}`).toBe(BAD_CREDENTIALS);
    }
    const right = await new Client('guesser', address).signIn(user.email, user.password);
    expect(right.ok).toBe(false);
    expect(right.error).toMatch(/^Too many failed sign-ins for this account from here\. Wait [12] seconds? and try again\.$/);
    expect(isSignInMessage(right.error!)).toBe(true);
    expect(sessionCookieOf(right.setCookies)).toBeUndefined();
    // Not a lock: the owner, from their own address, signs in at once.
    expect((await new Client('owner').signIn(user.email, user.password)).ok).toBe(true);
    // And once the delay has passed, the right password from the guessed-at address works too.
    await new Promise((r) => setTimeout(r, (SIGN_IN_DELAY_DEFAULTS.firstDelaySeconds + 0.5) * 1000));
    expect((await new Client('guesser', address).signIn(user.email, user.password)).ok).toBe(true);
  });

  it('the delay doubles with each further failure (2 s, 4 s, 8 s … at most 15 minutes)', () => {
    const free = SIGN_IN_DELAY_DEFAULTS.pairFreeFailures;
    expect([free - 1, free, free + 1, free + 2].map((n) => delayAfterFailures(n, free))).toEqual([0, 2, 4, 8]);
    expect(delayAfterFailures(free + 20, free)).toBe(SIGN_IN_DELAY_DEFAULTS.maxDelaySeconds);
  });

  it(`${SIGN_IN_DELAY_DEFAULTS.addressFreeFailures} failures from one address slow new accounts there, not one that signed in from there before, nor other addresses`, async () => {
    const address = privateAddress();
    const regular = await createUser('auth-ip-regular');
    expect((await new Client('club member', address).signIn(regular.email, regular.password)).ok).toBe(true);
    const newcomer = await createUser('auth-ip-new');
    for (let i = 0; i < SIGN_IN_DELAY_DEFAULTS.addressFreeFailures; i++) {
      const result = await new Client('guesser', address).signIn(uniqueEmail('auth-ip-guess'), 'guessing-password');
      expect(result.error, `attempt ${i + 1}`).toBe(BAD_CREDENTIALS);
    }
    const waiting = await new Client('newcomer', address).signIn(newcomer.email, newcomer.password);
    expect(waiting.error).toMatch(/^Too many failed sign-ins/);
    expect((await new Client('club member', address).signIn(regular.email, regular.password)).ok).toBe(true);
    expect((await new Client('newcomer elsewhere').signIn(newcomer.email, newcomer.password)).ok).toBe(true);
  });

  it('entries a client writes into X-Forwarded-For itself do not make it a new address (only the trusted hop counts)', async () => {
    // The test server trusts one proxy hop (TRUSTED_PROXY_HOPS=1): the last entry a client sends stands for what
    // that proxy appended. A client rotating made-up entries in front of it is still the same address.
    const user = await createUser('auth-spoof');
    const realAddress = privateAddress();
    for (let i = 0; i < SIGN_IN_DELAY_DEFAULTS.pairFreeFailures; i++) {
      const spoofing = new Client('spoofer', `${privateAddress()}, ${privateAddress()}, ${realAddress}`);
      expect((await spoofing.signIn(user.email, `wrong-${i}-password`)).error).toBe(BAD_CREDENTIALS);
    }
    const again = await new Client('spoofer', `${privateAddress()}, ${realAddress}`).signIn(user.email, user.password);
    expect(again.error).toMatch(/^Too many failed sign-ins/);
  });

  it('an unknown e-mail costs what a wrong password for a real account costs (medians of 7 tries within 35 %)', async () => {
    const user = await createUser('auth-timing');
    const timed = async (email: string) => {
      const client = new Client('timing');
      const csrf = await client.get('/api/auth/csrf');
      const form = new URLSearchParams({ csrfToken: csrf.body.csrfToken, email, password: 'not-the-password-1', callbackUrl: '/', json: 'true' });
      const started = performance.now();
      const res = await client.request('POST', '/api/auth/callback/credentials', { raw: form.toString(), contentType: 'application/x-www-form-urlencoded' });
      const ms = performance.now() - started;
      return { ms, status: res.status, body: res.text };
    };
    await timed(user.email);
    await timed(uniqueEmail('auth-timing-warm'));
    const real: number[] = [];
    const unknown: number[] = [];
    for (let i = 0; i < 7; i++) {
      const a = await timed(user.email);
      const b = await timed(uniqueEmail('auth-timing-nobody'));
      expect(b.status).toBe(a.status);
      expect(b.body).toBe(a.body);
      real.push(a.ms);
      unknown.push(b.ms);
    }
    const median = (xs: number[]) => [...xs].sort((x, y) => x - y)[Math.floor(xs.length / 2)];
    const [r, u] = [median(real), median(unknown)];
    // Before the dummy hash matched the real cost, the gap was 299 ms against 82 ms (ratio 3.6).
    expect(Math.abs(r - u) / Math.max(r, u), `real ${r.toFixed(0)} ms, unknown ${u.toFixed(0)} ms`).toBeLessThan(0.35);
  }, 60_000);

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

// Passwords at rest (argon2id, the 72-byte case, legacy bcrypt hashes): tests/integration/account-security.test.ts.
