// PostgreSQL restarted under light traffic. This file runs its own cluster (restarting the suite's shared one
// would break every other file), a second `next start` from the already built app (NEXT_DIST_DIR) against it,
// and one worker. While the server is down every request must be answered quickly with 503 and Retry-After —
// never hang — and once it is back the web server and the worker carry on without being restarted.
// Outside references:
// - RFC 9110 §15.6.4: 503 Service Unavailable is "temporarily unable to handle the request"; §10.2.3:
//   Retry-After tells the client when to try again.
// - PostgreSQL manual, "pg_ctl" (-m fast: clients are disconnected), and error code 57P01 admin_shutdown
//   (Appendix A) is what a connection sees when the server shuts down under it.
// - "A few seconds" for an answer while the database is down: the pool's connectionTimeoutMillis is 5 s
//   (db/index.ts); a refused connection fails at once. Common practice, no source, for the 8 s bound below.
import { spawn, type ChildProcess } from 'node:child_process';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import type { Kysely } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Database } from '@/db/database';
import { ClockFile, startFakes, startWorker, waitFor, type Fakes, type WorkerProcess } from '../support/worker';

const ROOT = path.resolve(__dirname, '../..');
const DOWN_ANSWER_BOUND_MS = 8_000;

interface Cluster {
  port: number;
  start(): void;
  stop(): void;
  ensureDatabase(name: string): void;
  isRunning(): boolean;
}

let dir: string;
let pg: Cluster;
let databaseUrl: string;
let db: Kysely<Database>;
let web: ChildProcess | null = null;
let webUrl: string;
let webOutput = '';
let fakes: Fakes;
let clock: ClockFile;
let worker: WorkerProcess;

interface Answer {
  path: string;
  status: number; // 0: no answer (the request itself failed or timed out)
  ms: number;
  retryAfter: string | null;
  at: number;
}
const answers: Answer[] = [];

async function ask(method: 'GET' | 'POST', pathName: string, body?: unknown, cookie?: string): Promise<Answer> {
  const started = Date.now();
  let answer: Answer;
  try {
    const res = await fetch(`${webUrl}${pathName}`, {
      method,
      headers: { 'x-forwarded-for': `10.${randomBytes(3).join('.')}`, ...(cookie ? { cookie } : {}), ...(body ? { 'content-type': 'application/json' } : {}) },
      body: body ? JSON.stringify(body) : undefined,
      signal: AbortSignal.timeout(30_000),
    });
    await res.text();
    answer = { path: pathName, status: res.status, ms: Date.now() - started, retryAfter: res.headers.get('retry-after'), at: started };
  } catch {
    answer = { path: pathName, status: 0, ms: Date.now() - started, retryAfter: null, at: started };
  }
  answers.push(answer);
  return answer;
}

/** Sign-up goes through route() (lib/http.ts) and the data layer: a write that needs the database. */
const signUp = () =>
  ask('POST', '/api/users', { email: `restart-${randomBytes(6).toString('hex')}@example.test`, name: 'Restart Test', password: 'a long enough passphrase 42' });

/** A signed-in person's cookie header, taken through next-auth's credentials flow on this file's server. */
let sessionCookie = '';
async function signInHere(email: string, password: string): Promise<string> {
  const pairs = (res: Response) => res.headers.getSetCookie().map((c) => c.split(';')[0]);
  const csrf = await fetch(`${webUrl}/api/auth/csrf`);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const answer = await fetch(`${webUrl}/api/auth/callback/credentials`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: pairs(csrf).join('; ') },
    body: new URLSearchParams({ csrfToken, email, password, callbackUrl: `${webUrl}/`, json: 'true' }).toString(),
  });
  const session = pairs(answer).find((c) => c.startsWith('next-auth.session-token='));
  if (!session) throw new Error(`signing in on the restart server answered ${answer.status}: ${await answer.text()}`);
  return session;
}

/** Light traffic: one health check, one sign-up and one signed-in read at a time, until stopped. */
function traffic() {
  let running = true;
  const loop = (async () => {
    while (running) {
      await Promise.all([ask('GET', '/api/health'), signUp(), ask('GET', '/api/properties', undefined, sessionCookie)]);
      await new Promise((r) => setTimeout(r, 150));
    }
  })();
  return async () => {
    running = false;
    await loop;
  };
}

beforeAll(async () => {
  const nextDist = process.env.NEXT_DIST_DIR;
  if (!nextDist) throw new Error('NEXT_DIST_DIR is not set: run integration tests through `npm test`, which builds the app');
  const { cluster } = await import(pathToFileURL(path.join(ROOT, 'scripts/lib/postgres.mjs')).href);
  const { freePort } = await import(pathToFileURL(path.join(ROOT, 'scripts/lib/common.mjs')).href);
  dir = mkdtempSync(path.join(os.tmpdir(), 'sowcast-restart-'));
  chmodSync(dir, 0o755); // the server runs as `postgres` when the tests run as root
  pg = cluster({ dir: path.join(dir, 'pg'), port: await freePort(), fast: true }) as Cluster;
  pg.start();
  pg.ensureDatabase('sowcast_restart');
  databaseUrl = `postgres://postgres@127.0.0.1:${pg.port}/sowcast_restart`;
  const { createDb, createPool } = await import('@/db');
  const pool = createPool(databaseUrl);
  pool.on('error', () => {}); // idle connections are cut by the restart; the pool drops them
  db = createDb(pool);
  const { migrateToLatest } = await import('@/db/migrate');
  await migrateToLatest(db);

  fakes = await startFakes();
  clock = new ClockFile(path.join(fakes.dir, 'clock'));
  clock.set('2027-09-01T12:00:00Z');

  const webPort = await freePort();
  webUrl = `http://127.0.0.1:${webPort}`;
  web = spawn(process.execPath, ['scripts/web-server.mjs', '-H', '127.0.0.1', '-p', String(webPort)], {
    cwd: ROOT,
    env: {
      ...process.env,
      ...fakes.env,
      DATABASE_URL: databaseUrl,
      NEXT_DIST_DIR: nextDist,
      // Each sign-up below says its own made-up client address, as one trusted proxy would (the per-address
      // sign-up limit would otherwise stop the traffic after ten).
      TRUSTED_PROXY_HOPS: '1',
      NEXTAUTH_URL: webUrl,
      APP_BASE_URL: webUrl,
      SOWCAST_BASE_URL: webUrl,
      NEXTAUTH_SECRET: randomBytes(32).toString('base64url'),
      NODE_ENV: 'production',
    },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  web.stdout!.on('data', (c: Buffer) => (webOutput = (webOutput + c.toString()).slice(-4000)));
  web.stderr!.on('data', (c: Buffer) => (webOutput = (webOutput + c.toString()).slice(-4000)));
  await waitFor('the second web server', async () => {
    if (web?.exitCode !== null) throw new Error(`next start exited (${web?.exitCode}): ${webOutput}`);
    return (await fetch(`${webUrl}/api/health`, { signal: AbortSignal.timeout(2_000) })).status === 200;
  }, 60_000, 250);

  worker = await startWorker({ id: 'restart-1', databaseUrl, clock, env: fakes.env });
}, 120_000);

afterAll(async () => {
  await worker?.stop();
  if (web && web.exitCode === null) {
    web.kill('SIGTERM');
    await new Promise((r) => web!.once('exit', r));
  }
  await fakes?.close();
  await db?.destroy().catch(() => {});
  pg?.stop();
  if (dir) rmSync(dir, { recursive: true, force: true });
});

/** A reminder row due now, written as the reminders run writes them; resolves when it reaches the inbox. */
async function oneEmailThroughTheWorker(tag: string) {
  const { insertNotifications } = await import('@/lib/data/notifications');
  const { messageIdFor } = await import('@/lib/notify/email');
  const email = `${tag}-${randomBytes(4).toString('hex')}@example.test`;
  // This file's rows go through its own `db` (the data layer's getDb() would point at the suite's database).
  const user = await db.insertInto('users').values({ email, name: `Person ${tag}`, password_hash: 'not-used' }).returning('id').executeTakeFirstOrThrow();
  const dedupeKey = `restart:${tag}`;
  await insertNotifications([{
    dedupeKey, userId: user.id, propertyId: null, stepId: null, kind: 'due-today', channel: 'email',
    message: { subject: `Restart check ${tag}`, text: 'A message to prove the worker works.', html: '<p>A message to prove the worker works.</p>', push: { title: 'Restart check', body: tag, url: webUrl, tag: dedupeKey }, messageId: messageIdFor(dedupeKey) },
    sendAfter: clock.get(),
  }], db);
  await waitFor(`the ${tag} e-mail in the inbox`, async () => (await fakes.inbox()).some((m) => m.messageId === messageIdFor(dedupeKey)), 30_000, 250);
}

describe('PostgreSQL restarted under light traffic', () => {
  it('before: the app answers and the worker delivers', async () => {
    expect((await ask('GET', '/api/health')).status).toBe(200);
    expect((await signUp()).status).toBe(202);
    const email = `restart-reader-${randomBytes(4).toString('hex')}@example.test`;
    expect((await ask('POST', '/api/users', { email, name: 'Restart Reader', password: 'a long enough passphrase 42' })).status).toBe(202);
    sessionCookie = await signInHere(email, 'a long enough passphrase 42');
    // A signed-in request reads the account on every request (its session may have ended): while the database
    // is down that read must answer 503 like any other, not "sign in first".
    expect((await ask('GET', '/api/properties', undefined, sessionCookie)).status).toBe(200);
    await oneEmailThroughTheWorker('before');
  });

  it('while down: every request is answered 503 with Retry-After within a few seconds; after: both recover without a restart', async () => {
    const stopTraffic = traffic();
    await waitFor('some traffic', () => answers.filter((a) => a.status === 202).length >= 3, 20_000, 100);
    const downFrom = Date.now();
    pg.stop();
    expect(pg.isRunning()).toBe(false);
    await new Promise((r) => setTimeout(r, 8_000)); // down long enough for several requests and pool timeouts
    const upFrom = Date.now();
    pg.start();
    // Recovery: no process was restarted; the pools open new connections on their own.
    await waitFor('a sign-up after the restart', () => answers.some((a) => a.at >= upFrom && a.status === 202), 30_000, 200);
    await stopTraffic();

    // Requests started while the server was down (the stop itself takes a moment, so start after it began).
    const whileDown = answers.filter((a) => a.at >= downFrom + 1_000 && a.at + a.ms <= upFrom);
    expect(whileDown.length).toBeGreaterThanOrEqual(4);
    for (const a of whileDown) {
      expect(a.status, `${a.path} at +${a.at - downFrom} ms`).toBe(503);
      expect(a.ms, `${a.path} at +${a.at - downFrom} ms`).toBeLessThan(DOWN_ANSWER_BOUND_MS);
      if (a.path === '/api/users') expect(a.retryAfter).toBeTruthy();
    }
    // Around the restart nothing hangs or breaks the connection, and nothing answers 500.
    const around = answers.filter((a) => a.at >= downFrom - 2_000);
    expect(around.filter((a) => a.status === 0 || a.status === 500)).toEqual([]);
    expect(web?.exitCode).toBeNull();

    // The worker was not restarted either: it is the same process and delivers a new reminder.
    expect(worker.alive()).toBe(true);
    await oneEmailThroughTheWorker('after');
    expect((await ask('GET', '/api/health')).status).toBe(200);
    expect((await ask('GET', '/api/properties', undefined, sessionCookie)).status).toBe(200);
    expect(whileDown.some((a) => a.path === '/api/properties')).toBe(true);

    const slowest = Math.max(...whileDown.map((a) => a.ms));
    console.log(JSON.stringify({ requestsWhileDown: whileDown.length, slowestWhileDownMs: slowest, recoveredAfterMs: (answers.find((a) => a.at >= upFrom && a.status === 202)?.at ?? 0) - upFrom }));
  }, 120_000);
});
