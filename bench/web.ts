// The web server the API and page benchmarks load: a production build of its own (.next-bench), started with
// `next start` on a free loopback port against a database holding the demo club and a 1,000-plot club, and a
// signed-in session cookie for the owner of each, obtained through next-auth's real credentials flow.
import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { copyFileSync, existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import os from 'node:os';
import path from 'node:path';
import bcrypt from 'bcryptjs';
import { getDb } from '@/db';
import { loadDemo } from '@/db/demo';
import demoUsers from '@/db/demo-users.json';
import { migrateToLatest } from '@/db/migrate';
import { makeClubs } from './clubs';
import { freePort, useDatabase, type BenchPostgres } from './support';

const ROOT = path.resolve(import.meta.dirname, '..');
const DIST_DIR = '.next-bench';
const SESSION_COOKIE = 'next-auth.session-token';
const BIG_CLUB_PASSWORD = 'bench-owner-2026';

export interface BenchClub {
  name: 'demo' | '1,000 plots';
  email: string;
  password: string;
  plots: number;
  cookie: string;
}

export interface Web {
  baseUrl: string;
  clubs: BenchClub[];
  buildSeconds: number | null;
  stop(): Promise<void>;
}

/** `next build` into .next-bench; Next lists that folder in tsconfig.json, so the file is put back after. */
function build(env: NodeJS.ProcessEnv): number | null {
  if (process.env.SOWCAST_BENCH_SKIP_BUILD === '1' && existsSync(path.join(ROOT, DIST_DIR, 'BUILD_ID'))) {
    console.log(`\nReusing ${DIST_DIR} (SOWCAST_BENCH_SKIP_BUILD=1)`);
    return null;
  }
  console.log(`\nBuilding the app into ${DIST_DIR} (next build; SOWCAST_BENCH_SKIP_BUILD=1 reuses it next time)`);
  const tsconfig = path.join(ROOT, 'tsconfig.json');
  const before = readFileSync(tsconfig);
  const saved = path.join(os.tmpdir(), `sowcast-bench-tsconfig-${process.pid}.json`);
  copyFileSync(tsconfig, saved);
  const started = performance.now();
  try {
    const result = spawnSync(process.execPath, ['node_modules/next/dist/bin/next', 'build'], { cwd: ROOT, env, stdio: ['ignore', 'pipe', 'inherit'], encoding: 'utf8' });
    if (result.status !== 0) console.error(result.stdout.slice(-3000));
    if (result.status !== 0) throw new Error(`next build exited with ${result.status ?? result.signal}`);
  } finally {
    if (!readFileSync(tsconfig).equals(before)) copyFileSync(saved, tsconfig);
    rmSync(saved, { force: true });
  }
  return (performance.now() - started) / 1000;
}

async function waitForHealth(url: string, child: ChildProcess, timeoutMs = 90_000) {
  const until = Date.now() + timeoutMs;
  while (Date.now() < until) {
    if (child.exitCode !== null) throw new Error(`next start exited with ${child.exitCode}`);
    try {
      if ((await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2_000) })).status < 500) return;
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
}

/** next-auth's credentials flow as a browser does it: the CSRF token, then the form post; returns the cookie header. */
async function signIn(baseUrl: string, email: string, password: string): Promise<string> {
  const jar = new Map<string, string>();
  const keep = (response: Response) => {
    for (const header of response.headers.getSetCookie()) {
      const [pair] = header.split(';');
      const eq = pair.indexOf('=');
      jar.set(pair.slice(0, eq).trim(), pair.slice(eq + 1).trim());
    }
  };
  const cookieHeader = () => [...jar].map(([k, v]) => `${k}=${v}`).join('; ');
  const csrf = await fetch(`${baseUrl}/api/auth/csrf`);
  keep(csrf);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const answer = await fetch(`${baseUrl}/api/auth/callback/credentials`, {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded', cookie: cookieHeader() },
    body: new URLSearchParams({ csrfToken, email, password, callbackUrl: `${baseUrl}/`, json: 'true' }).toString(),
    redirect: 'manual',
  });
  keep(answer);
  await answer.text();
  const session = jar.get(SESSION_COOKIE);
  if (!session) throw new Error(`sign-in as ${email} gave no session cookie (status ${answer.status})`);
  return `${SESSION_COOKIE}=${session}`;
}

export async function startWeb(pg: BenchPostgres): Promise<Web> {
  const url = pg.createDatabase('sowcast_bench_web');
  await useDatabase(url);
  await migrateToLatest(getDb());
  const at = new Date();
  await loadDemo(getDb(), at);
  const t = performance.now();
  const [big] = await makeClubs({
    tag: 'thousand',
    properties: 10,
    plotsPerProperty: 100,
    now: at,
    seedInDays: 12,
    ownersShared: true,
    passwordHash: await bcrypt.hash(BIG_CLUB_PASSWORD, 10),
  });
  console.log(`\nClubs: the demo club and ${big.plots} plots on ${big.propertyIds.length} properties (${((performance.now() - t) / 1000).toFixed(1)} s through lib/data)`);
  // The web server gets the connections from here on.
  await useDatabase(url);

  const port = await freePort();
  const baseUrl = `http://127.0.0.1:${port}`;
  const dataDir = mkdtempSync(path.join(os.tmpdir(), 'sowcast-bench-data-'));
  const env: NodeJS.ProcessEnv = {
    NODE_ENV: 'production',
    PATH: process.env.PATH,
    HOME: process.env.HOME ?? os.tmpdir(),
    TZ: 'UTC',
    NEXT_TELEMETRY_DISABLED: '1',
    NEXT_DIST_DIR: DIST_DIR,
    DATABASE_URL: url,
    NEXTAUTH_SECRET: randomBytes(32).toString('base64url'),
    NEXTAUTH_URL: baseUrl,
    APP_BASE_URL: baseUrl,
    SOWCAST_DATA_DIR: dataDir,
  };
  let buildSeconds: number | null;
  try {
    buildSeconds = build(env);
  } catch (error) {
    rmSync(dataDir, { recursive: true, force: true });
    throw error;
  }
  const child = spawn(process.execPath, ['scripts/web-server.mjs', '-H', '127.0.0.1', '-p', String(port)], {
    cwd: ROOT,
    env,
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  let errors = '';
  child.stderr!.on('data', (c: Buffer) => (errors = (errors + c.toString()).slice(-4000)));
  const stop = async () => {
    if (child.exitCode === null) {
      child.kill('SIGTERM');
      await new Promise<void>((resolve) => {
        const timer = setTimeout(() => (child.kill('SIGKILL'), resolve()), 10_000);
        child.once('exit', () => (clearTimeout(timer), resolve()));
      });
    }
    rmSync(dataDir, { recursive: true, force: true });
  };
  try {
    await waitForHealth(baseUrl, child);
    const owner = demoUsers.users.find((u) => u.role === 'owner')!;
    const bigOwner = (await getDb().selectFrom('users').select('email').where('id', '=', big.ownerId).executeTakeFirstOrThrow()).email;
    const demoPlots = Number(
      (await getDb().selectFrom('plots').innerJoin('memberships', 'memberships.property_id', 'plots.property_id').innerJoin('users', 'users.id', 'memberships.user_id').select((eb) => eb.fn.countAll<number>().as('n')).where('users.email', '=', owner.email).executeTakeFirstOrThrow()).n,
    );
    const clubs: BenchClub[] = [
      { name: 'demo', email: owner.email, password: owner.password, plots: demoPlots, cookie: await signIn(baseUrl, owner.email, owner.password) },
      { name: '1,000 plots', email: bigOwner, password: BIG_CLUB_PASSWORD, plots: big.plots, cookie: await signIn(baseUrl, bigOwner, BIG_CLUB_PASSWORD) },
    ];
    return { baseUrl, clubs, buildSeconds, stop };
  } catch (error) {
    await stop();
    throw new Error(`${(error as Error).message}\n${errors}`);
  }
}
