// Sessions and secret links. The real server runs on http, so the production (https) cookie behaviour is
// checked by running next-auth's own request handler in this process with lib/auth/options.ts loaded under an
// https NEXTAUTH_URL, and the http behaviour on the test server's real answers.
// Sign-in delays are covered in tests/integration/auth.test.ts; sessions ended by sign-out, sign-out everywhere,
// a password change or a role taken away in account-security.test.ts; invitation revocation and expiry in access.test.ts; feed revocation in
// ical-feed.test.ts. This file adds what those do not: every cookie's attributes, token entropy, and that no
// table anywhere holds a token.
import { createRequire } from 'node:module';
import path from 'node:path';
import { sql, type Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import type { Database } from '@/db/database';
import { Client, createProperty, createUser, invite, parseSetCookie, signedInUser, uniqueEmail, type ParsedCookie } from '../support/http';
import { testDb } from '../support/db';

const require = createRequire(import.meta.url);
/** The `cookie` package next-auth 4 depends on (it ships no types at this version). */
type CookiePackage = { serialize(name: string, value: string, options?: Record<string, unknown>): string };
const db: Kysely<Database> = testDb();

afterAll(async () => {
  await db.destroy();
});

/** RFC 6265bis §4.1.3: a __Secure- cookie must be Secure; a __Host- cookie also Path=/ and no Domain. */
function expectPrefixRules(cookie: ParsedCookie) {
  if (cookie.name.startsWith('__Secure-')) expect(cookie.attributes.secure, cookie.name).toBe(true);
  if (cookie.name.startsWith('__Host-')) {
    expect(cookie.attributes.secure, cookie.name).toBe(true);
    expect(cookie.attributes.path, cookie.name).toBe('/');
    expect(cookie.attributes.domain, cookie.name).toBeUndefined();
  }
}

describe('in production (NEXTAUTH_URL on https)', () => {
  type AuthCookie = { name: string; value: string; options: Record<string, unknown> };
  let csrfCookies: AuthCookie[];
  let signInCookies: AuthCookie[];
  let useSecureCookies: boolean | undefined;
  const saved = process.env.NEXTAUTH_URL;

  beforeAll(async () => {
    const user = await createUser('sessions-https');
    process.env.NEXTAUTH_URL = 'https://sowcast.example.test';
    vi.resetModules();
    const { authOptions } = await import('@/lib/auth/options');
    useSecureCookies = authOptions.useSecureCookies;
    // next-auth 4's core handler (what app/api/auth/[...nextauth] runs), loaded by file: the package does not
    // export it. Its answer lists the cookies to set with their options.
    const { AuthHandler } = require(path.resolve(__dirname, '../../node_modules/next-auth/core/index.js'));
    const headers = { host: 'sowcast.example.test', 'x-forwarded-proto': 'https' };
    const csrf = await AuthHandler({
      req: { action: 'csrf', method: 'GET', headers, cookies: {}, query: {}, body: {} },
      options: authOptions,
    });
    csrfCookies = csrf.cookies;
    const csrfCookie = csrfCookies.find((c) => c.name.endsWith('next-auth.csrf-token'))!;
    const signIn = await AuthHandler({
      req: {
        action: 'callback', providerId: 'credentials', method: 'POST', headers, query: {},
        cookies: { [csrfCookie.name]: csrfCookie.value },
        body: { csrfToken: csrf.body.csrfToken, email: user.email, password: user.password, callbackUrl: 'https://sowcast.example.test/', json: 'true' },
      },
      options: authOptions,
    });
    signInCookies = signIn.cookies ?? [];
  });

  afterAll(() => {
    if (saved === undefined) delete process.env.NEXTAUTH_URL;
    else process.env.NEXTAUTH_URL = saved;
    vi.resetModules();
  });

  it('lib/auth/options.ts asks for secure cookies', () => {
    expect(useSecureCookies).toBe(true);
  });

  it('the session cookie is __Secure-, Secure, HttpOnly, SameSite=Lax (RFC 6265bis §4.1.3.1, §5.6.7)', async () => {
    const { serialize } = require('cookie') as CookiePackage;
    const session = signInCookies.find((c) => c.name.endsWith('next-auth.session-token'));
    expect(session, JSON.stringify(signInCookies.map((c) => c.name))).toBeDefined();
    expect(session!.name).toBe('__Secure-next-auth.session-token');
    // Serialised the way next-auth's Next.js adapter writes Set-Cookie (the `cookie` package), then read back.
    const parsed = parseSetCookie(serialize(session!.name, session!.value, session!.options));
    expect(parsed.attributes.secure).toBe(true);
    expect(parsed.attributes.httponly).toBe(true);
    expect(String(parsed.attributes.samesite).toLowerCase()).toBe('lax');
    expectPrefixRules(parsed);
  });

  it('every other cookie it sets is Secure, HttpOnly and SameSite=Lax too; the CSRF cookie is __Host-', () => {
    const { serialize } = require('cookie') as CookiePackage;
    const all = [...csrfCookies, ...signInCookies];
    expect(all.length).toBeGreaterThanOrEqual(2);
    expect(all.map((c) => c.name)).toContain('__Host-next-auth.csrf-token');
    for (const c of all) {
      const parsed = parseSetCookie(serialize(c.name, c.value, c.options));
      expect(parsed.attributes.secure, c.name).toBe(true);
      expect(parsed.attributes.httponly, c.name).toBe(true);
      expect(String(parsed.attributes.samesite).toLowerCase(), c.name).toBe('lax');
      expect(c.name.startsWith('__Secure-') || c.name.startsWith('__Host-'), c.name).toBe(true);
      expectPrefixRules(parsed);
    }
  });
});

describe('on the http test server', () => {
  it('every cookie of the sign-in flow is HttpOnly and SameSite=Lax, none Secure and none with a __Secure-/__Host- prefix', async () => {
    const user = await createUser('sessions-http');
    const client = new Client('sessions-http');
    const csrf = await client.get('/api/auth/csrf');
    const result = await client.signIn(user.email, user.password);
    expect(result.ok).toBe(true);
    const cookies = [...csrf.setCookies, ...result.setCookies].map(parseSetCookie);
    expect(cookies.map((c) => c.name)).toEqual(expect.arrayContaining(['next-auth.csrf-token', 'next-auth.session-token']));
    for (const c of cookies) {
      expect(c.attributes.httponly, c.name).toBe(true);
      expect(String(c.attributes.samesite).toLowerCase(), c.name).toBe('lax');
      // A Secure cookie is never sent back over http (RFC 6265 §4.1.2.5), so it would sign nobody in.
      expect(c.attributes.secure, c.name).toBeUndefined();
      expect(c.name.startsWith('__'), c.name).toBe(false);
    }
  });

  it('the session answer never carries the password hash or the token', async () => {
    const { client, user } = await signedInUser('sessions-body');
    const session = await client.get('/api/auth/session');
    expect(session.body.user.email).toBe(user.email);
    expect(session.text).not.toMatch(/\$2[aby]\$/);
    expect(session.text).not.toContain(client.cookie('next-auth.session-token')!);
  });
});

// ---- secret links ---------------------------------------------------------------------------------------

/** Base64url (RFC 4648 §5) to bytes; refuses anything else. */
function decodeToken(token: string): Buffer {
  expect(token).toMatch(/^[A-Za-z0-9_-]+$/);
  return Buffer.from(token, 'base64url');
}

/**
 * NIST SP 800-22 rev. 1a §2.1, the frequency (monobit) test: P = erfc(|S_n| / sqrt(2n)). A P-value below
 * 0.0001 says the bits are not balanced; random bits fall that low once in 10,000 runs.
 */
function monobitP(bytes: Buffer): number {
  let ones = 0;
  for (const byte of bytes) for (let b = 0; b < 8; b++) ones += (byte >> b) & 1;
  const n = bytes.length * 8;
  const s = Math.abs(2 * ones - n) / Math.sqrt(n);
  return erfc(s / Math.SQRT2);
}

/** Complementary error function (Abramowitz & Stegun 7.1.26, |error| < 1.5e-7). */
function erfc(x: number): number {
  const t = 1 / (1 + 0.3275911 * x);
  const poly = t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429))));
  return poly * Math.exp(-x * x);
}

/** Every table whose rows' text contains `needle` (PostgreSQL's record output of each row). */
async function tablesHolding(needle: string): Promise<string[]> {
  const { rows: tables } = await sql<{ schema: string; name: string }>`
    select n.nspname as schema, c.relname as name from pg_class c join pg_namespace n on n.oid = c.relnamespace
    where c.relkind in ('r', 'p') and not c.relispartition
      and n.nspname not in ('pg_catalog', 'information_schema') and n.nspname not like 'pg_toast%'`.execute(db);
  const holding: string[] = [];
  for (const t of tables) {
    const { rows } = await sql<{ n: number }>`
      select count(*)::int as n from ${sql.table(`${t.schema}.${t.name}`)} as r where strpos(r::text, ${needle}) > 0`.execute(db);
    if (rows[0].n > 0) holding.push(`${t.schema}.${t.name}`);
  }
  return holding;
}

describe('secret links: invitation and calendar-feed tokens', () => {
  const COUNT = 40;
  let invitationTokens: string[];
  let feedTokens: string[];
  let owner: { client: Client; user: { id: string } };
  let propertyId: string;

  beforeAll(async () => {
    owner = await signedInUser('sessions-tokens');
    propertyId = (await createProperty(owner.client)).id;
    invitationTokens = [];
    // Spread over three properties: one property sends at most INVITATION_LIMIT_DEFAULTS.perPropertyPerHour.
    const properties = [propertyId, (await createProperty(owner.client)).id, (await createProperty(owner.client)).id];
    for (let i = 0; i < COUNT; i++) invitationTokens.push((await invite(owner.client, properties[i % 3], uniqueEmail('tok'), 'viewer')).token);
    feedTokens = [];
    for (let i = 0; i < COUNT; i++) {
      const res = await owner.client.post('/api/settings/calendar-feeds', { label: `Feed ${i}` });
      expect(res.status, res.text).toBe(201);
      feedTokens.push(new URL(res.body.url).pathname.split('/').at(-1)!);
    }
  }, 60_000);

  for (const kind of ['invitation', 'feed'] as const) {
    it(`${kind} tokens carry at least 128 random bits: base64url of ≥ 16 bytes, all different, balanced bits (SP 800-22 §2.1)`, () => {
      const tokens = kind === 'invitation' ? invitationTokens : feedTokens;
      const decoded = tokens.map(decodeToken);
      // OWASP Session Management cheat sheet asks for at least 64 bits of entropy; the brief asks 128.
      for (const bytes of decoded) expect(bytes.length).toBeGreaterThanOrEqual(16);
      expect(new Set(tokens).size).toBe(tokens.length);
      // No shared prefix or suffix beyond chance: a counter or a timestamp inside the token would show here.
      const first = decoded.map((b) => b.subarray(0, 4).toString('hex'));
      const last = decoded.map((b) => b.subarray(-4).toString('hex'));
      expect(new Set(first).size).toBe(tokens.length);
      expect(new Set(last).size).toBe(tokens.length);
      expect(monobitP(Buffer.concat(decoded))).toBeGreaterThan(0.0001);
    });

    it(`no table holds a ${kind} token as it is (only hashes are stored), but the invitation e-mail in the outbox`, async () => {
      const tokens = kind === 'invitation' ? invitationTokens : feedTokens;
      for (const token of tokens.slice(0, 3)) {
        const holding = await tablesHolding(token);
        if (kind === 'feed') {
          expect(holding).toEqual([]);
          continue;
        }
        // The queued e-mail carries the acceptance link to the invitee (that is its purpose); no other row does.
        expect(holding).toEqual(['public.notifications']);
        const rows = await sql<{ kind: string; channel: string }>`
          select kind, channel from notifications as r where strpos(r::text, ${token}) > 0`.execute(db);
        expect(rows.rows).toEqual([{ kind: 'invitation', channel: 'email' }]);
      }
    }, 60_000);
  }

  it('a revoked feed stops answering at once, and its siblings keep working', async () => {
    const list = await owner.client.get('/api/settings/calendar-feeds');
    const feeds: { id: string; label: string }[] = list.body.feeds;
    const target = feeds.find((f) => f.label === 'Feed 0')!;
    const sibling = feedTokens[1];
    expect((await new Client().get(`/api/calendar-feed/${feedTokens[0]}`)).status).toBe(200);
    expect((await owner.client.delete(`/api/settings/calendar-feeds/${target.id}`)).status).toBe(204);
    expect((await new Client().get(`/api/calendar-feed/${feedTokens[0]}`)).status).toBe(404);
    expect((await new Client().get(`/api/calendar-feed/${sibling}`)).status).toBe(200);
  });

  it('a revoked invitation cannot be accepted, and the person gains nothing', async () => {
    const invitee = await signedInUser('sessions-invitee');
    const { token, id } = await invite(owner.client, propertyId, invitee.user.email, 'manager');
    expect((await owner.client.delete(`/api/properties/${propertyId}/invitations/${id}`)).status).toBe(204);
    expect((await invitee.client.post(`/api/invitations/${token}/accept`)).status).toBe(410);
    expect((await invitee.client.get(`/api/properties/${propertyId}`)).status).toBe(404);
  });
});
