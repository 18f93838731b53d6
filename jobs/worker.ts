// The Sowcast worker: a pg-boss process beside the web server, sharing its PostgreSQL. Any number of workers
// may run against one database — pg-boss hands each job to one of them, and notification rows are claimed
// with SKIP LOCKED — which is how Sowcast grows past one machine.
//
// Environment: DATABASE_URL (required); SOWCAST_WORKER_ID (default host:pid, stored with each claim);
// SOWCAST_POLL_SECONDS (job polling, default 2, at least 0.5); SOWCAST_CRON_SECONDS (how often pg-boss checks
// its cron schedules, 1–45, default 30); SOWCAST_REMINDER_TICK_SECONDS (tests and demos: also run the reminders
// every N seconds, not only on the minute cron); SOWCAST_CLAIM_BATCH (notifications handed out per reminders
// run, default 500); SOWCAST_LOG_LEVEL (default info); SOWCAST_CLOCK_FILE (lib/clock.ts: a moved "now").
import { hostname } from 'node:os';
import PgBoss from 'pg-boss';
import { getDb, getPool } from '@/db';
import { closeEmailTransport } from '@/lib/notify/email';
import type { JobContext } from './context';
import { refreshForecasts } from './handlers/forecast-refresh';
import { replanPlanting } from './handlers/replan';
import { runReminders } from './handlers/reminders-due';
import { sendEmailNotification } from './handlers/email-send';
import { sendPushNotification } from './handlers/push-send';
import { createLogger, errorText, type Logger } from './log';
import { createQueues, forecastRefreshJob, QUEUES, SCHEDULES, type QueueName } from './queues';

function numberFromEnv(name: string, fallback: number, min: number, max: number): number {
  const raw = process.env[name]?.trim();
  if (!raw) return fallback;
  const value = Number(raw);
  if (!Number.isFinite(value) || value < min || value > max) throw new Error(`${name} must be a number from ${min} to ${max}, not ${JSON.stringify(raw)}`);
  return value;
}

const workerId = process.env.SOWCAST_WORKER_ID?.trim() || `${hostname()}:${process.pid}`;
const log: Logger = createLogger({ worker: workerId });

/**
 * Wraps a handler for pg-boss 10, which hands a worker an ARRAY of jobs: each job runs on its own, a failure
 * fails only that job (pg-boss then retries it with backoff, and after the last try moves it to the
 * dead-letter queue), and every outcome is one log line.
 */
function each<T>(boss: PgBoss, queue: QueueName, handle: (ctx: JobContext, job: PgBoss.Job<T>) => Promise<unknown>) {
  const ctx: JobContext = { boss, workerId, log };
  return async (jobs: PgBoss.Job<T>[]) => {
    await Promise.all(
      jobs.map(async (job) => {
        const started = Date.now();
        try {
          const result = await handle(ctx, job);
          log('debug', 'job done', { queue, jobId: job.id, data: job.data, ms: Date.now() - started, result });
        } catch (error) {
          log('error', 'job failed', { queue, jobId: job.id, data: job.data, ms: Date.now() - started, error: errorText(error) });
          await boss.fail(queue, job.id, { message: errorText(error) });
        }
      }),
    );
  };
}

async function main() {
  const pollingIntervalSeconds = numberFromEnv('SOWCAST_POLL_SECONDS', 2, 0.5, 60);
  const cronSeconds = numberFromEnv('SOWCAST_CRON_SECONDS', 30, 1, 45);
  const tickSeconds = numberFromEnv('SOWCAST_REMINDER_TICK_SECONDS', 0, 0, 3600);

  const pool = getPool();
  const boss = new PgBoss({
    // One pool for Kysely and pg-boss: the worker holds a single set of connections.
    db: { executeSql: (text, values) => pool.query(text, values) },
    cronMonitorIntervalSeconds: cronSeconds,
    cronWorkerIntervalSeconds: Math.min(cronSeconds, 5),
  });
  boss.on('error', (error) => log('error', 'pg-boss error', { error: errorText(error) }));

  await boss.start();
  // Workers starting together would deadlock creating the same queue partitions: one at a time, across processes.
  const setup = await pool.connect();
  try {
    await setup.query('select pg_advisory_lock(hashtext($1))', ['sowcast:worker-setup']);
    await createQueues(boss);
    for (const s of SCHEDULES) await boss.schedule(s.queue, s.cron, {}, { tz: 'UTC' });
  } finally {
    await setup.query('select pg_advisory_unlock(hashtext($1))', ['sowcast:worker-setup']).catch(() => {});
    setup.release();
  }

  const work = { pollingIntervalSeconds };
  // pg-boss waits a polling interval after every fetch, even a full one: 4 replans per 2 s would cap a worker
  // at 2 plantings a second (a 1,000-property refresh then takes 25 minutes; see `npm run bench -- worker`).
  // When a batch came back full there is probably more waiting, so the worker is told to fetch again now.
  const drain = async <T>(queue: QueueName, batchSize: number, handler: (jobs: PgBoss.Job<T>[]) => Promise<void>) => {
    let id: string | null = null;
    id = await boss.work<T>(queue, { ...work, batchSize }, async (jobs) => {
      await handler(jobs);
      if (jobs.length >= batchSize && id) boss.notifyWorker(id);
    });
  };
  await boss.work(QUEUES.forecastRefresh, { ...work, batchSize: 1 }, each(boss, QUEUES.forecastRefresh, refreshForecasts));
  await drain(QUEUES.replan, 4, each(boss, QUEUES.replan, replanPlanting));
  await boss.work(QUEUES.remindersDue, { ...work, batchSize: 1 }, each(boss, QUEUES.remindersDue, runReminders));
  await drain(QUEUES.emailSend, 10, each(boss, QUEUES.emailSend, sendEmailNotification));
  await drain(QUEUES.pushSend, 10, each(boss, QUEUES.pushSend, sendPushNotification));
  await boss.work(QUEUES.deadLetter, { ...work, batchSize: 10 }, async (jobs) => {
    for (const job of jobs) log('error', 'job gave up after its retries', { queue: QUEUES.deadLetter, jobId: job.id, data: job.data });
  });

  // A fresh start gets its forecasts now rather than at the next three-hour mark.
  const first = forecastRefreshJob();
  await boss.send(first.name, first.data, first.options);

  let tick: NodeJS.Timeout | null = null;
  if (tickSeconds > 0) {
    tick = setInterval(() => {
      boss
        .send(QUEUES.remindersDue, {}, { singletonKey: workerId, singletonSeconds: tickSeconds })
        .catch((error) => log('warn', 'could not queue a reminders run', { queue: QUEUES.remindersDue, error: errorText(error) }));
    }, tickSeconds * 1000);
  }

  log('info', 'worker started', { pollingIntervalSeconds, cronSeconds, tickSeconds, queues: Object.values(QUEUES) });

  let stopping = false;
  const stop = async (signal: string) => {
    if (stopping) return;
    stopping = true;
    log('info', 'worker stopping', { signal });
    if (tick) clearInterval(tick);
    try {
      // Graceful: running jobs finish (up to the timeout); jobs not started stay queued for another worker.
      await boss.stop({ graceful: true, wait: true, timeout: 20_000 });
      closeEmailTransport();
      await getDb().destroy(); // ends the shared pool
      log('info', 'worker stopped', { signal });
      process.exit(0);
    } catch (error) {
      log('error', 'worker stop failed', { signal, error: errorText(error) });
      process.exit(1);
    }
  };
  process.on('SIGTERM', () => void stop('SIGTERM'));
  process.on('SIGINT', () => void stop('SIGINT'));
}

process.on('unhandledRejection', (error) => log('error', 'unhandled rejection', { error: errorText(error) }));

main().catch((error) => {
  log('error', 'worker could not start', { error: errorText(error), stack: (error as Error)?.stack });
  process.exit(1);
});
