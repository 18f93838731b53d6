import { RateLimiterPostgres } from 'rate-limiter-flexible';
import { getPool } from '@/db';

/**
 * A rate-limiter-flexible counter kept in PostgreSQL (table `rate_limits`, migration 0008), over the
 * process's own pool, so every web process counts the same tries. `points` per `durationSeconds` window,
 * started by the key's first try.
 */
export function postgresLimiter(keyPrefix: string, points: number, durationSeconds: number) {
  return new RateLimiterPostgres({
    storeClient: getPool(),
    storeType: 'pool',
    tableName: 'rate_limits',
    tableCreated: true,
    keyPrefix,
    points,
    duration: durationSeconds,
  });
}
