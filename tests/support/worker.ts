// Running the real worker in tests: a database of its own (so pg-boss schemas and notification rows never meet
// another file's), the local fakes in this process on free loopback ports, worker processes started as
// `node --import tsx jobs/worker.ts` with a clock file the test moves, and small clients for the fakes.
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import https from 'node:https';
import os from 'node:os';
import path from 'node:path';
import PgBoss from 'pg-boss';
import { createDb, createPool } from '@/db';
import { migrateToLatest } from '@/db/migrate';
import { startFakeMail, type FakeMail, type StoredMail } from '@/fakes/mail/server';
import { startFakePush, type FakePush, type ReceivedPush } from '@/fakes/push/server';
import { startFakeWeather, type FakeWeather } from '@/fakes/weather/server';
import { freshDatabase, type FreshDatabase } from './db';

const ROOT = path.resolve(__dirname, '../..');

/** A migrated database of its own; `drop()` removes it. */
export async function workerDatabase(prefix: string): Promise<FreshDatabase> {
  const fresh = await freshDatabase(prefix);
  await migrateToLatest(fresh.db);
  return fresh;
}

/** Points this test process's data layer (lib/data/*, through getDb()) at the file's own database. */
export function useDatabase(url: string) {
  const g = globalThis as { sowcastPool?: unknown; sowcastDb?: unknown };
  if (g.sowcastPool) throw new Error('the data layer already connected elsewhere; call useDatabase first');
  process.env.DATABASE_URL = url;
}

export async function waitFor<T>(what: string, probe: () => Promise<T | null | undefined | false> | T | null | undefined | false, timeoutMs = 20_000, everyMs = 200): Promise<T> {
  const until = Date.now() + timeoutMs;
  let last: unknown;
  for (;;) {
    try {
      const value = await probe();
      if (value) return value;
    } catch (error) {
      last = error;
    }
    if (Date.now() > until) throw new Error(`timed out after ${timeoutMs} ms waiting for ${what}${last ? ` (last error: ${(last as Error).message})` : ''}`);
    await new Promise((r) => setTimeout(r, everyMs));
  }
}

// ——— the clock ————————————————————————————————————————————————————————————————

export class ClockFile {
  constructor(readonly path: string) {}
  set(iso: string | Date) {
    writeFileSync(this.path, typeof iso === 'string' ? iso : iso.toISOString());
  }
  get(): Date {
    return new Date(readFileSync(this.path, 'utf8').trim());
  }
}

// ——— the fakes ————————————————————————————————————————————————————————————————

function httpsJson(certPath: string, method: string, url: string, body?: unknown): Promise<any> {
  const ca = readFileSync(certPath);
  return new Promise((resolve, reject) => {
    const req = https.request(url, { method, ca, headers: body === undefined ? {} : { 'content-type': 'application/json' } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => {
        const text = Buffer.concat(chunks).toString('utf8');
        if ((res.statusCode ?? 500) >= 400) return reject(new Error(`${method} ${url} → ${res.statusCode}: ${text}`));
        resolve(text ? JSON.parse(text) : null);
      });
    });
    req.on('error', reject);
    req.setTimeout(10_000, () => req.destroy(new Error(`${method} ${url} timed out`)));
    if (body !== undefined) req.write(JSON.stringify(body));
    req.end();
  });
}

async function httpJson(method: string, url: string, body?: unknown): Promise<any> {
  const res = await fetch(url, {
    method,
    headers: body === undefined ? {} : { 'content-type': 'application/json' },
    body: body === undefined ? undefined : JSON.stringify(body),
    signal: AbortSignal.timeout(10_000),
  });
  const text = await res.text();
  if (!res.ok) throw new Error(`${method} ${url} → ${res.status}: ${text}`);
  return text ? JSON.parse(text) : null;
}

export interface Fakes {
  dir: string;
  weather: FakeWeather;
  mail: FakeMail;
  push: FakePush;
  /** Env for a worker process: where the fakes listen, and trust for the push service's certificate. */
  env: Record<string, string>;
  inbox(): Promise<StoredMail[]>;
  rawMail(id: string): Promise<Buffer>;
  setSmtp(mode: 'ok' | 'down'): Promise<void>;
  pushes(): Promise<ReceivedPush[]>;
  subscribe(label: string): Promise<{ id: string; endpoint: string; keys: { p256dh: string; auth: string } }>;
  devicePrivateKey(id: string): Promise<{ privateKey: string; p256dh: string; auth: string }>;
  /** The device drops its subscription: the push service answers 410 Gone to later pushes. */
  unsubscribe(id: string): Promise<void>;
  weatherEvent(event: Record<string, unknown>): Promise<void>;
  clearWeatherEvents(): Promise<void>;
  weatherMode(mode: string, extra?: Record<string, unknown>): Promise<void>;
  weatherRequests(): Promise<{ count: number; recent: string[] }>;
  close(): Promise<void>;
}

/** Fake weather, mail and push in this process, on free loopback ports. */
export async function startFakes(): Promise<Fakes> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'sowcast-worker-'));
  const [weather, mail, push] = await Promise.all([
    startFakeWeather({ port: 0, log: false }),
    startFakeMail({ smtpPort: 0, inboxPort: 0 }),
    startFakePush({ port: 0, dir: path.join(dir, 'fake-push') }),
  ]);
  return {
    dir,
    weather,
    mail,
    push,
    env: {
      WEATHER_BASE_URL: weather.url,
      SMTP_URL: mail.smtpUrl,
      NODE_EXTRA_CA_CERTS: push.certPath,
      // The fake push service listens on loopback, which real endpoints may never be (lib/notify/push-endpoint.ts).
      PUSH_ENDPOINT_ALLOWED_ORIGINS: push.url,
      SOWCAST_DATA_DIR: path.join(dir, 'data'),
    },
    inbox: () => httpJson('GET', `${mail.inboxUrl}/api/messages`),
    rawMail: async (id) => {
      const res = await fetch(`${mail.inboxUrl}/api/messages/${id}/raw`, { signal: AbortSignal.timeout(10_000) });
      if (!res.ok) throw new Error(`raw message ${id} → ${res.status}`);
      return Buffer.from(await res.arrayBuffer());
    },
    setSmtp: (mode) => httpJson('POST', `${mail.inboxUrl}/api/control`, { mode }),
    pushes: () => httpsJson(push.certPath, 'GET', `${push.url}/_control/messages`),
    subscribe: (label) => httpsJson(push.certPath, 'POST', `${push.url}/_control/subscriptions`, { label }),
    devicePrivateKey: (id) => httpsJson(push.certPath, 'GET', `${push.url}/_control/subscriptions/${id}/private-key`),
    unsubscribe: (id) => httpsJson(push.certPath, 'POST', `${push.url}/_control/subscriptions/${id}/gone`),
    weatherEvent: (event) => httpJson('POST', `${weather.url}/_control/events`, event),
    clearWeatherEvents: () => httpJson('DELETE', `${weather.url}/_control/events`),
    weatherMode: (mode, extra = {}) => httpJson('POST', `${weather.url}/_control/mode`, { mode, ...extra }),
    weatherRequests: () => httpJson('GET', `${weather.url}/_control/requests`),
    async close() {
      await Promise.allSettled([weather.close(), mail.close(), push.close()]);
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

// ——— worker processes —————————————————————————————————————————————————————————————

export interface LogLine {
  time: string;
  level: string;
  msg: string;
  worker: string;
  [field: string]: unknown;
}

export interface WorkerProcess {
  id: string;
  child: ChildProcess;
  lines: LogLine[];
  /** Output that is not a JSON log line (a crash trace, a warning from Node). */
  other: string[];
  waitForLog(what: string, match: (line: LogLine) => boolean, timeoutMs?: number, from?: number): Promise<LogLine>;
  alive(): boolean;
  stop(): Promise<number | null>;
}

/** Starts `node --import tsx jobs/worker.ts` against `databaseUrl`, with the test knobs set. */
export async function startWorker(o: { id: string; databaseUrl: string; clock: ClockFile; env?: Record<string, string> }): Promise<WorkerProcess> {
  const child = spawn(process.execPath, ['--import', 'tsx', 'jobs/worker.ts'], {
    cwd: ROOT,
    env: {
      PATH: process.env.PATH ?? '',
      HOME: process.env.HOME ?? os.tmpdir(),
      TZ: 'UTC',
      NODE_ENV: 'production',
      NEXT_TELEMETRY_DISABLED: '1',
      DATABASE_URL: o.databaseUrl,
      SOWCAST_WORKER_ID: o.id,
      SOWCAST_CLOCK_FILE: o.clock.path,
      SOWCAST_POLL_SECONDS: '0.5',
      SOWCAST_CRON_SECONDS: '1',
      SOWCAST_REMINDER_TICK_SECONDS: '1',
      APP_BASE_URL: 'http://sowcast.test',
      WEATHER_TIMEOUT_MS: '1500',
      WEATHER_RETRY_DELAY_MS: '100',
      PG_POOL_MAX: '6',
      SOWCAST_LOG_LEVEL: 'debug', // the tests follow every job through its log line
      ...o.env,
    } as NodeJS.ProcessEnv,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const lines: LogLine[] = [];
  const other: string[] = [];
  const waiters = new Set<() => void>();
  const take = (chunk: Buffer, rest: { text: string }) => {
    rest.text += chunk.toString('utf8');
    let i: number;
    while ((i = rest.text.indexOf('\n')) >= 0) {
      const line = rest.text.slice(0, i);
      rest.text = rest.text.slice(i + 1);
      if (!line.trim()) continue;
      try {
        lines.push(JSON.parse(line));
      } catch {
        other.push(line);
      }
    }
    for (const w of waiters) w();
  };
  const out = { text: '' };
  const err = { text: '' };
  child.stdout!.on('data', (c: Buffer) => take(c, out));
  child.stderr!.on('data', (c: Buffer) => take(c, err));
  let exitCode: number | null | undefined;
  const exited = new Promise<number | null>((resolve) =>
    child.on('exit', (code, signal) => {
      exitCode = code ?? (signal ? null : 0);
      for (const w of waiters) w();
      resolve(exitCode);
    }),
  );

  const worker: WorkerProcess = {
    id: o.id,
    child,
    lines,
    other,
    alive: () => exitCode === undefined,
    waitForLog(what, match, timeoutMs = 20_000, from = 0) {
      return new Promise((resolve, reject) => {
        const check = () => {
          const found = lines.slice(from).find(match);
          if (found) return done(() => resolve(found));
          if (exitCode !== undefined) return done(() => reject(new Error(`worker ${o.id} exited (${exitCode}) before ${what}:\n${tail()}`)));
        };
        const timer = setTimeout(() => done(() => reject(new Error(`timed out after ${timeoutMs} ms waiting for ${what} from worker ${o.id}:\n${tail()}`))), timeoutMs);
        const done = (fn: () => void) => {
          clearTimeout(timer);
          waiters.delete(check);
          fn();
        };
        waiters.add(check);
        check();
      });
    },
    async stop() {
      if (exitCode !== undefined) return exitCode;
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), 25_000);
      const code = await exited;
      clearTimeout(timer);
      return code;
    },
  };
  const tail = () => [...lines.slice(-15).map((l) => JSON.stringify(l)), ...other.slice(-10)].join('\n');
  await worker.waitForLog('"worker started"', (l) => l.msg === 'worker started', 40_000);
  return worker;
}

/** Index of the next log line: pass as `from` to wait only for what happens after this moment. */
export const mark = (w: WorkerProcess) => w.lines.length;

/** Waits until a reminders run has happened with "now" at or after `instant` (the worker has seen the clock). */
export function reminderRunAt(w: WorkerProcess, instant: Date, timeoutMs = 20_000, from = 0) {
  return w.waitForLog(`a reminders run at ${instant.toISOString()}`, (l) => l.msg === 'reminders run' && Date.parse(String(l.now)) >= instant.getTime(), timeoutMs, from);
}

/** A pg-boss client in the test process, to put jobs on the worker's queues as the web app would. */
export async function queueClient(databaseUrl: string) {
  const pool = createPool(databaseUrl);
  const boss = new PgBoss({ db: { executeSql: (text, values) => pool.query(text, values) }, supervise: false, schedule: false, migrate: false });
  boss.on('error', () => {});
  await boss.start();
  return {
    boss,
    db: createDb(pool),
    async close() {
      await boss.stop({ graceful: false, wait: true, close: false });
      await pool.end();
    },
  };
}

// ——— a club to remind ————————————————————————————————————————————————————————————

export interface ClubPerson {
  id: string;
  email: string;
  role: 'owner' | 'manager' | 'member' | 'viewer';
  /** The fake push service's subscription id of the person's virtual phone, when they have one. */
  deviceId: string | null;
}

/**
 * People, one property and a plot, written through the data layer the app uses. Each person may get a virtual
 * phone registered with the fake push service.
 */
export async function makeClub(o: {
  fakes: Fakes;
  tag: string;
  people: { name: string; role: ClubPerson['role']; phone?: boolean }[];
  property?: Partial<{ name: string; latitude: number; longitude: number; timeZone: string }>;
  plot?: Partial<{ name: string; acres: number; cover: 'grass-weeds' | 'brush' | 'bare-soil' | 'tilled' | 'existing-stand' }>;
}) {
  const { createUser } = await import('@/lib/data/users');
  const { createProperty } = await import('@/lib/data/properties');
  const { createPlot } = await import('@/lib/data/plots');
  const { saveSubscription } = await import('@/lib/data/push-subscriptions');
  const { getDb } = await import('@/db');
  const people: ClubPerson[] = [];
  for (const p of o.people) {
    const email = `${p.name.toLowerCase().replace(/\W+/g, '.')}.${o.tag}@example.test`;
    const user = await createUser({ email, name: p.name, passwordHash: 'not-used-by-the-worker' });
    if (!user) throw new Error(`could not create ${email}`);
    let deviceId: string | null = null;
    if (p.phone) {
      const device = await o.fakes.subscribe(`${p.name}'s phone`);
      await saveSubscription(user.id, { endpoint: device.endpoint, keys: device.keys, label: `${p.name}'s phone` });
      deviceId = device.id;
    }
    people.push({ id: user.id, email, role: p.role, deviceId });
  }
  const owner = people.find((p) => p.role === 'owner');
  if (!owner) throw new Error('a club needs an owner');
  const property = await createProperty(owner.id, {
    name: o.property?.name ?? `Hollow Oak ${o.tag}`,
    latitude: o.property?.latitude ?? 36.41,
    longitude: o.property?.longitude ?? -90.12,
    timeZone: o.property?.timeZone ?? 'America/Chicago',
    elevationM: 105,
    avgLastSpringFrost: '04-05',
    avgFirstFallFrost: '10-25',
    tenure: 'owned',
  } as never);
  for (const p of people) {
    if (p.id === owner.id) continue;
    await getDb().insertInto('memberships').values({ property_id: property.id, user_id: p.id, role: p.role }).execute();
  }
  const plot = await createPlot(property.id, {
    name: o.plot?.name ?? 'Creekside strip',
    acres: o.plot?.acres ?? 0.5,
    cover: o.plot?.cover ?? 'grass-weeds',
    sun: 'full',
  } as never);
  return { people, owner, property, plot };
}

/** Plans and stores a planting the way the planner does (the engine, then lib/data/plantings). */
export async function makePlanting(o: { plotId: string; form: Record<string, unknown>; now: Date; createdBy: string }) {
  const { plantingSchema } = await import('@/lib/validations/planting');
  const { buildPlantingInput } = await import('@/lib/planning/input');
  const { planPlanting } = await import('@/lib/schedule/plan');
  const { createPlanting, getStepRows } = await import('@/lib/data/plantings');
  const { getDb } = await import('@/db');
  const form = plantingSchema.parse(o.form);
  const plot = await getDb().selectFrom('plots').selectAll().where('id', '=', o.plotId).executeTakeFirstOrThrow();
  const property = await getDb().selectFrom('properties').selectAll().where('id', '=', plot.property_id).executeTakeFirstOrThrow();
  const plan = planPlanting(buildPlantingInput(property, plot, form), null, o.now);
  const planting = await createPlanting({ plotId: o.plotId, form, plan, createdBy: o.createdBy });
  const steps = async () => getStepRows(planting.id);
  const step = async (kind: string) => {
    const row = (await steps()).find((s) => s.kind === kind);
    if (!row) throw new Error(`the planting has no ${kind} step`);
    return row;
  };
  return { planting, steps, step };
}
