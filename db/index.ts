import { Kysely, PostgresDialect } from 'kysely';
import pg from 'pg';
import type { Database } from './database';

// `date` columns stay 'YYYY-MM-DD' strings: they are local calendar dates in a property's time zone, and
// turning them into JavaScript Dates would shift them by the server's offset.
pg.types.setTypeParser(pg.types.builtins.DATE, (value) => value);
// bigint counts (count(*)) fit comfortably in a double for our sizes.
pg.types.setTypeParser(pg.types.builtins.INT8, (value) => Number(value));

export function databaseUrl(): string {
  const url = process.env.DATABASE_URL;
  if (!url) {
    throw new Error('DATABASE_URL is not set. Start Sowcast with `npm start`, which sets it for you.');
  }
  return url;
}

export function createPool(url = databaseUrl()): pg.Pool {
  const pool = new pg.Pool({
    connectionString: url,
    max: Number(process.env.PG_POOL_MAX ?? 10),
    // Fail fast instead of hanging when the server is down: the route answers 503.
    connectionTimeoutMillis: 5_000,
    idleTimeoutMillis: 30_000,
  });
  // node-postgres emits an idle client's error (server restarted, connection terminated) on the pool; with no
  // listener that is an uncaught exception that ends the process. The client is discarded and the next query
  // opens a new connection, so noting it is enough.
  pool.on('error', (error) => {
    console.warn(`PostgreSQL connection lost while idle: ${error.message}`);
  });
  return pool;
}

export function createDb(pool: pg.Pool): Kysely<Database> {
  return new Kysely<Database>({ dialect: new PostgresDialect({ pool }) });
}

const globalForDb = globalThis as unknown as { sowcastPool?: pg.Pool; sowcastDb?: Kysely<Database> };

/** The process-wide pool and Kysely instance (one per web or worker process). */
export function getPool(): pg.Pool {
  if (!globalForDb.sowcastPool) {
    globalForDb.sowcastPool = createPool();
    globalForDb.sowcastPool.on('error', (error) => {
      console.error(JSON.stringify({ level: 'error', msg: 'postgres pool error', error: error.message }));
    });
  }
  return globalForDb.sowcastPool;
}

export function getDb(): Kysely<Database> {
  if (!globalForDb.sowcastDb) globalForDb.sowcastDb = createDb(getPool());
  return globalForDb.sowcastDb;
}
