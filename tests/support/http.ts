// An HTTP client for the running Sowcast server that signs in the way a browser does: next-auth's real
// credentials flow (CSRF token, form post, cookies), then calls the JSON API with the session cookie.
import { randomBytes, randomUUID } from 'node:crypto';
import { sql } from 'kysely';
import { testDb } from './db';

export const SESSION_COOKIE = 'next-auth.session-token';

export function baseUrl(): string {
  const url = process.env.SOWCAST_BASE_URL;
  if (!url) throw new Error('SOWCAST_BASE_URL is not set: run integration tests through `npm test`');
  return url.replace(/\/$/, '');
}

/**
 * A made-up client address from the private 10.0.0.0/8 range (RFC 1918). The server counts failed
 * sign-ins per address; every test client comes from loopback, so without its own address one file's
 * deliberate failures would count against every other file's sign-ins.
 */
export function privateAddress(): string {
  const [a, b, c] = randomBytes(3);
  return `10.${a}.${b}.${c}`;
}

export interface ApiResponse<T = any> {
  status: number;
  headers: Headers;
  /** Parsed JSON when the answer is JSON, else the text ('' for an empty body). */
  body: T;
  text: string;
  setCookies: string[];
}

export interface RequestOptions {
  /** Sent as JSON. */
  json?: unknown;
  /** Sent as is (for non-JSON bodies). */
  raw?: string;
  /** Sent as these exact bytes (binary uploads, which a string would re-encode). */
  bytes?: Uint8Array;
  contentType?: string;
  headers?: Record<string, string>;
}

export interface SignInResult {
  ok: boolean;
  status: number;
  /** The `error=` parameter of the URL next-auth answers with, decoded. */
  error: string | null;
  url: string | null;
  setCookies: string[];
}

/** One parsed Set-Cookie header (RFC 6265 §5.2): the pair and its attributes, names lower-cased. */
export interface ParsedCookie {
  name: string;
  value: string;
  attributes: Record<string, string | true>;
}

export function parseSetCookie(header: string): ParsedCookie {
  const [pair, ...rest] = header.split(';');
  const eq = pair.indexOf('=');
  const attributes: Record<string, string | true> = {};
  for (const part of rest) {
    const trimmed = part.trim();
    if (!trimmed) continue;
    const i = trimmed.indexOf('=');
    if (i === -1) attributes[trimmed.toLowerCase()] = true;
    else attributes[trimmed.slice(0, i).trim().toLowerCase()] = trimmed.slice(i + 1).trim();
  }
  return { name: pair.slice(0, eq).trim(), value: pair.slice(eq + 1).trim(), attributes };
}

export class Client {
  private readonly jar = new Map<string, string>();
  /** Sent as X-Forwarded-For; null sends none (the server then sees only the loopback peer). */
  readonly address: string | null;

  constructor(readonly label = 'signed out', address: string | null = privateAddress()) {
    this.address = address;
  }

  private keep(response: Response): string[] {
    const headers = response.headers.getSetCookie();
    for (const header of headers) {
      const cookie = parseSetCookie(header);
      const expires = typeof cookie.attributes.expires === 'string' ? Date.parse(cookie.attributes.expires) : NaN;
      const maxAge = typeof cookie.attributes['max-age'] === 'string' ? Number(cookie.attributes['max-age']) : NaN;
      if (cookie.value === '' || maxAge <= 0 || expires < Date.now()) this.jar.delete(cookie.name);
      else this.jar.set(cookie.name, cookie.value);
    }
    return headers;
  }

  cookie(name: string): string | undefined {
    return this.jar.get(name);
  }

  get signedIn(): boolean {
    return this.jar.has(SESSION_COOKIE);
  }

  forgetCookies() {
    this.jar.clear();
  }

  async request<T = any>(method: string, path: string, options: RequestOptions = {}): Promise<ApiResponse<T>> {
    // A browser names the page's origin on every state-changing request (Fetch Standard, "origin header");
    // the server refuses other sites' pages, so this client says it is on Sowcast's own, as the app's pages are.
    const headers: Record<string, string> = {
      ...(this.address ? { 'x-forwarded-for': this.address } : {}),
      ...(['GET', 'HEAD'].includes(method.toUpperCase()) ? {} : { origin: baseUrl() }),
      ...options.headers,
    };
    if (this.jar.size) headers.cookie = [...this.jar].map(([k, v]) => `${k}=${v}`).join('; ');
    let body: string | Uint8Array<ArrayBuffer> | undefined;
    if (options.json !== undefined) {
      body = JSON.stringify(options.json);
      headers['content-type'] = 'application/json';
    } else if (options.raw !== undefined) {
      body = options.raw;
      headers['content-type'] = options.contentType ?? 'text/plain';
    } else if (options.bytes !== undefined) {
      body = new Uint8Array(options.bytes);
      headers['content-type'] = options.contentType ?? 'application/octet-stream';
    }
    const response = await fetch(`${baseUrl()}${path}`, { method, headers, body, redirect: 'manual' });
    const setCookies = this.keep(response);
    const text = await response.text();
    let parsed: unknown = text;
    if ((response.headers.get('content-type') ?? '').includes('application/json') && text) parsed = JSON.parse(text);
    return { status: response.status, headers: response.headers, body: parsed as T, text, setCookies };
  }

  get = <T = any>(path: string, options?: RequestOptions) => this.request<T>('GET', path, options);
  post = <T = any>(path: string, json?: unknown, options?: RequestOptions) =>
    this.request<T>('POST', path, { json, ...options });
  patch = <T = any>(path: string, json?: unknown, options?: RequestOptions) =>
    this.request<T>('PATCH', path, { json, ...options });
  delete = <T = any>(path: string, options?: RequestOptions) => this.request<T>('DELETE', path, options);

  /** next-auth's credentials flow: GET /api/auth/csrf, then the form post with json=true. */
  async signIn(email: string, password: string): Promise<SignInResult> {
    const csrf = await this.request<{ csrfToken: string }>('GET', '/api/auth/csrf');
    if (csrf.status !== 200 || !csrf.body?.csrfToken) {
      throw new Error(`GET /api/auth/csrf answered ${csrf.status}: ${csrf.text.slice(0, 200)}`);
    }
    const form = new URLSearchParams({
      csrfToken: csrf.body.csrfToken,
      email,
      password,
      callbackUrl: `${baseUrl()}/`,
      json: 'true',
    });
    const answer = await this.request<{ url?: string }>('POST', '/api/auth/callback/credentials', {
      raw: form.toString(),
      contentType: 'application/x-www-form-urlencoded',
    });
    const url = typeof answer.body === 'object' && answer.body?.url ? answer.body.url : null;
    const error = url ? new URL(url, baseUrl()).searchParams.get('error') : null;
    return {
      ok: answer.status === 200 && !error && answer.setCookies.some((c) => c.startsWith(`${SESSION_COOKIE}=`)),
      status: answer.status,
      error,
      url,
      setCookies: answer.setCookies,
    };
  }
}

export interface TestUser {
  id: string;
  email: string;
  name: string;
  password: string;
}

/** A unique address per call, so tests never collide on the shared database. */
export const uniqueEmail = (prefix: string) => `${prefix}-${randomUUID()}@example.test`;

/**
 * The confirmation link queued for an address by sign-up (the e-mail's text in the outbox row, which the worker
 * would send to the fake inbox), or null when none is waiting.
 */
export async function verificationLinkFor(email: string): Promise<string | null> {
  const db = testDb();
  try {
    const row = await db
      .selectFrom('notifications')
      .innerJoin('users', 'users.id', 'notifications.user_id')
      .select(sql<string>`notifications.message->>'text'`.as('text'))
      .where('users.email', '=', email.toLowerCase())
      .where('notifications.kind', '=', 'email-verification')
      .orderBy('notifications.created_at', 'desc')
      .executeTakeFirst();
    return row ? (/https?:\/\/\S+\/verify-email\/[A-Za-z0-9_-]+/.exec(row.text)?.[0] ?? null) : null;
  } finally {
    await db.destroy();
  }
}

/** Follows the confirmation link the way the page does: POST /api/users/verification with its token. */
export async function verifyEmailOf(email: string): Promise<void> {
  const link = await verificationLinkFor(email);
  if (!link) throw new Error(`no confirmation e-mail is queued for ${email}`);
  const answer = await new Client().post('/api/users/verification', { token: tokenOf(link) });
  if (answer.status !== 200) throw new Error(`confirming ${email} answered ${answer.status}: ${answer.text}`);
}

async function userIdOf(email: string): Promise<string> {
  const db = testDb();
  try {
    return (await db.selectFrom('users').select('id').where('email', '=', email.toLowerCase()).executeTakeFirstOrThrow()).id;
  } finally {
    await db.destroy();
  }
}

/**
 * Signs up a fresh user through POST /api/users and, unless `verified: false`, confirms the address through
 * the link the sign-up queued. The sign-up answer names no account, so the id is read from the database.
 */
export async function createUser(prefix: string, name = `Test ${prefix}`, options: { verified?: boolean } = {}): Promise<TestUser> {
  const email = uniqueEmail(prefix);
  const password = `pw-${randomUUID()}`;
  const answer = await new Client().post('/api/users', { name, email, password });
  if (answer.status !== 202) throw new Error(`sign-up for ${email} answered ${answer.status}: ${answer.text}`);
  if (options.verified !== false) await verifyEmailOf(email);
  return { id: await userIdOf(email), email, name, password };
}

/** A fresh user and a client signed in as them. */
export async function signedInUser(prefix: string, options: { verified?: boolean } = {}): Promise<{ user: TestUser; client: Client }> {
  const user = await createUser(prefix, undefined, options);
  const client = new Client(prefix);
  const result = await client.signIn(user.email, user.password);
  if (!result.ok) throw new Error(`sign-in for ${user.email} failed: ${result.status} ${result.error}`);
  return { user, client };
}

/** A property body that passes validation; `overrides` replace or add fields. */
export function propertyBody(overrides: Record<string, unknown> = {}) {
  return {
    name: `Test ground ${randomUUID().slice(0, 8)}`,
    latitude: 36.41,
    longitude: -90.12,
    timeZone: 'America/Chicago',
    elevationM: 105,
    tenure: 'owned',
    ...overrides,
  };
}

export function plotBody(overrides: Record<string, unknown> = {}) {
  return {
    name: `Plot ${randomUUID().slice(0, 8)}`,
    acres: 0.75,
    cover: 'grass-weeds',
    sun: 'full',
    ...overrides,
  };
}

export async function createProperty(owner: Client, overrides: Record<string, unknown> = {}) {
  const answer = await owner.post('/api/properties', propertyBody(overrides));
  if (answer.status !== 201) throw new Error(`creating a property answered ${answer.status}: ${answer.text}`);
  return answer.body.property as { id: string; name: string; timeZone: string };
}

export async function createPlot(client: Client, propertyId: string, overrides: Record<string, unknown> = {}) {
  const answer = await client.post(`/api/properties/${propertyId}/plots`, plotBody(overrides));
  if (answer.status !== 201) throw new Error(`creating a plot answered ${answer.status}: ${answer.text}`);
  return answer.body.plot as { id: string; name: string; propertyId: string };
}

/** The token is the last path segment of the invitation link. */
export const tokenOf = (link: string) => new URL(link).pathname.split('/').filter(Boolean).at(-1)!;

export async function invite(owner: Client, propertyId: string, email: string, role: string) {
  const answer = await owner.post(`/api/properties/${propertyId}/invitations`, { email, role });
  if (answer.status !== 201) throw new Error(`inviting ${email} answered ${answer.status}: ${answer.text}`);
  return { id: answer.body.invitation.id as string, link: answer.body.link as string, token: tokenOf(answer.body.link) };
}

/** Owner invites, the invitee accepts: the same path people take. */
export async function addMember(owner: Client, propertyId: string, member: { client: Client; user: TestUser }, role: string) {
  const { token } = await invite(owner, propertyId, member.user.email, role);
  const answer = await member.client.post(`/api/invitations/${token}/accept`);
  if (answer.status !== 200) throw new Error(`accepting as ${member.user.email} answered ${answer.status}: ${answer.text}`);
}
