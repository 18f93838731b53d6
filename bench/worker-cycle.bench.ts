// Worker cycle: 1,000 properties with 3,000 plantings. One forecast refresh — 1,000 fetches from the fake
// weather service over loopback, each stored — queues a replan per planting; the replans run through the real
// handler (lib/data writes the steps and the move history, and the "moved" messages); then one reminders run
// makes the reminders due and queues their sending. All of it is jobs/handlers/* on a real pg-boss, in this
// process. The floor: the very rows that cycle wrote, written again by one multi-row INSERT per table. And
// pgbench against the same server, so a reader can tell a slow server from slow code.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import PgBoss from 'pg-boss';
import { sql } from 'kysely';
import { getDb, getPool } from '@/db';
import { migrateToLatest } from '@/db/migrate';
import { startFakeWeather } from '@/fakes/weather/server';
import type { JobContext } from '@/jobs/context';
import { refreshForecasts } from '@/jobs/handlers/forecast-refresh';
import { runReminders } from '@/jobs/handlers/reminders-due';
import { replanPlanting } from '@/jobs/handlers/replan';
import { createQueues, QUEUES, type ReplanJob } from '@/jobs/queues';
import { makeClubs } from './clubs';
import { useDatabase, type BenchPostgres } from './support';

/** The worker's own settings (jobs/worker.ts): replans are fetched four at a time, the queue polled every 2 s. */
const REPLAN_BATCH = 4;
const DEFAULT_POLL_SECONDS = 2;

export interface WorkerCycleResult {
  properties: number;
  plantings: number;
  setupSeconds: number;
  phases: { refreshSeconds: number; replanSeconds: number; remindersSeconds: number };
  workerSeconds: number;
  refresh: { cells: number; stored: number; failed: number; replans: number };
  replans: { done: number; failed: number; moved: number; meanBatchMs: number };
  reminders: { created: number; claimed: number; queued: number };
  rows: Record<string, number>;
  floorSeconds: number;
  workerOverFloor: number;
  /** What the worker process as configured would take for the replans: at most one batch per poll. */
  pollBoundReplanSeconds: number;
}

export interface PgbenchResult {
  scale: number;
  clients: number;
  seconds: number;
  selectOnlyTps: number;
  tpcbLikeTps: number;
}

const silent: JobContext['log'] = () => {};

async function countRows(): Promise<Record<string, number>> {
  const db = getDb();
  const one = async (table: string, where = sql``) =>
    Number((await sql<{ n: number }>`select count(*)::int as n from ${sql.raw(table)} ${where}`.execute(db)).rows[0].n);
  return {
    forecasts: await one('forecasts'),
    forecast_status: await one('forecast_status'),
    steps: await one('steps'),
    step_moves: await one('step_moves'),
    notifications: await one('notifications'),
    'pgboss.job': await one('pgboss.job'),
  };
}

/**
 * The floor: each table the cycle wrote, copied as JSON to this process, then written back into an empty copy
 * of the table (same columns and indexes) by ONE insert per table, in one transaction. Only the inserts are
 * timed; what is left is what the server needs to store those bytes.
 */
async function bulkFloor(tables: string[]): Promise<number> {
  const pool = getPool();
  await pool.query('drop schema if exists bench_floor cascade; create schema bench_floor');
  const payloads: { target: string; json: string }[] = [];
  for (const table of tables) {
    const target = `bench_floor.${table.replace('.', '_')}`;
    // pg-boss's job table is partitioned per queue: copy its columns only.
    const like = table.startsWith('pgboss.') ? `like ${table} including defaults` : `like ${table} including defaults including indexes`;
    await pool.query(`create table ${target} (${like})`);
    const { rows } = await pool.query(`select coalesce(json_agg(t), '[]')::text as json from ${table} t`);
    payloads.push({ target, json: rows[0].json });
  }
  const client = await pool.connect();
  try {
    const started = performance.now();
    await client.query('begin');
    for (const p of payloads) await client.query(`insert into ${p.target} select * from json_populate_recordset(null::${p.target}, $1::json)`, [p.json]);
    await client.query('commit');
    return (performance.now() - started) / 1000;
  } finally {
    client.release();
    await pool.query('drop schema bench_floor cascade');
  }
}

export async function runWorkerCycle(pg: BenchPostgres, o: { properties?: number; plantingsPerProperty?: number } = {}): Promise<WorkerCycleResult> {
  const properties = o.properties ?? 1_000;
  const perProperty = o.plantingsPerProperty ?? 3;
  const url = pg.createDatabase('sowcast_bench_worker');
  await useDatabase(url);
  await migrateToLatest(getDb());

  // The worker's "now" (lib/clock.ts): 07:00 in Chicago on a late-summer morning, fall plantings ahead.
  const dir = mkdtempSync(path.join(os.tmpdir(), 'sowcast-bench-clock-'));
  const clockFile = path.join(dir, 'clock');
  const at = new Date('2027-08-18T12:00:00Z');
  writeFileSync(clockFile, at.toISOString());
  const saved = { clock: process.env.SOWCAST_CLOCK_FILE, weather: process.env.WEATHER_BASE_URL, base: process.env.APP_BASE_URL };
  process.env.SOWCAST_CLOCK_FILE = clockFile;
  process.env.APP_BASE_URL = 'http://sowcast.test';

  const weather = await startFakeWeather({ port: 0, log: false });
  process.env.WEATHER_BASE_URL = weather.url;
  const pool = getPool();
  const boss = new PgBoss({ db: { executeSql: (text, values) => pool.query(text, values) }, supervise: false, schedule: false });
  boss.on('error', () => {});
  try {
    let t = performance.now();
    await makeClubs({ tag: 'cycle', properties, plotsPerProperty: perProperty, now: at, seedInDays: 15, ownersShared: false, passwordHash: 'not-used-by-the-worker' });
    const setupSeconds = (performance.now() - t) / 1000;
    await boss.start();
    await createQueues(boss);
    const ctx: JobContext = { boss, workerId: 'bench', log: silent };

    const started = performance.now();
    const refresh = await refreshForecasts(ctx, { id: 'bench-refresh', data: {} });
    const refreshed = performance.now();

    // The replans as a worker takes them — REPLAN_BATCH per fetch, each job alone, failures back to pg-boss —
    // but fetching again at once instead of sleeping out the poll interval.
    const replans = { done: 0, failed: 0, moved: 0, meanBatchMs: 0 };
    let batches = 0;
    let batchMs = 0;
    for (;;) {
      const jobs = await boss.fetch<ReplanJob>(QUEUES.replan, { batchSize: REPLAN_BATCH });
      if (!jobs?.length) break;
      const b = performance.now();
      await Promise.all(
        jobs.map(async (job) => {
          try {
            const result = await replanPlanting(ctx, job);
            replans.done++;
            if (result.outcome === 'moved') replans.moved++;
            await boss.complete(QUEUES.replan, job.id);
          } catch (error) {
            replans.failed++;
            await boss.fail(QUEUES.replan, job.id, { message: String(error) });
          }
        }),
      );
      batchMs += performance.now() - b;
      batches++;
    }
    replans.meanBatchMs = batches ? batchMs / batches : 0;
    const replanned = performance.now();
    const reminders = await runReminders(ctx, { id: 'bench-reminders' });
    const finished = performance.now();

    const rows = await countRows();
    const floorSeconds = await bulkFloor(Object.keys(rows));
    const workerSeconds = (finished - started) / 1000;
    t = Math.max(replans.meanBatchMs / 1000, DEFAULT_POLL_SECONDS);
    return {
      properties,
      plantings: properties * perProperty,
      setupSeconds,
      phases: { refreshSeconds: (refreshed - started) / 1000, replanSeconds: (replanned - refreshed) / 1000, remindersSeconds: (finished - replanned) / 1000 },
      workerSeconds,
      refresh,
      replans,
      reminders: { created: reminders.created, claimed: reminders.claimed, queued: reminders.queued },
      rows,
      floorSeconds,
      workerOverFloor: workerSeconds / floorSeconds,
      pollBoundReplanSeconds: batches * t,
    };
  } finally {
    await boss.stop({ graceful: false, wait: true, close: false }).catch(() => {});
    await weather.close();
    rmSync(dir, { recursive: true, force: true });
    for (const [name, value] of [['SOWCAST_CLOCK_FILE', saved.clock], ['WEATHER_BASE_URL', saved.weather], ['APP_BASE_URL', saved.base]] as const) {
      if (value === undefined) delete process.env[name];
      else process.env[name] = value;
    }
  }
}

function tps(output: string): number {
  const match = /tps = ([\d.]+) \(without initial connection time\)/.exec(output);
  if (!match) throw new Error(`pgbench printed no tps:\n${output.slice(-800)}`);
  return Number(match[1]);
}

/** PostgreSQL's own pgbench on the same server: `-i`, then the select-only and the default (TPC-B-like) script. */
export function runPgbench(pg: BenchPostgres, o: { scale?: number; clients?: number; seconds?: number } = {}): PgbenchResult {
  const scale = o.scale ?? 10;
  const clients = o.clients ?? 8;
  const duration = o.seconds ?? 10;
  pg.createDatabase('pgbench');
  const bin = path.join(pg.bin, 'pgbench');
  const connect = ['-h', '127.0.0.1', '-p', String(pg.port), '-U', 'postgres'];
  const run = (args: string[]) => {
    const result = spawnSync(bin, [...connect, ...args, 'pgbench'], { encoding: 'utf8' });
    if (result.status !== 0) throw new Error(`pgbench ${args.join(' ')} failed:\n${result.stderr}`);
    return `${result.stdout}\n${result.stderr}`;
  };
  run(['-i', '-q', '-s', String(scale)]);
  const threads = String(Math.max(1, Math.min(clients, os.cpus().length)));
  const selectOnlyTps = tps(run(['-S', '-T', String(duration), '-c', String(clients), '-j', threads]));
  const tpcbLikeTps = tps(run(['-T', String(duration), '-c', String(clients), '-j', threads]));
  return { scale, clients, seconds: duration, selectOnlyTps, tpcbLikeTps };
}
