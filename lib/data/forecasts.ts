import { sql } from 'kysely';
import { getDb } from '@/db';
import type { Forecast, ForecastHour } from '@/lib/schedule/types';

export interface StoredForecast {
  id: string;
  gridKey: string;
  provider: string;
  fetchedAt: string;
  hours: ForecastHour[];
}

/** Stores one validated fetch for a grid cell and marks the cell healthy, in one transaction. */
export async function storeForecast(o: { gridKey: string; latitude: number; longitude: number; provider: string; forecast: Forecast }) {
  const { hours } = o.forecast;
  if (hours.length === 0) throw new Error('refusing to store an empty forecast');
  return getDb()
    .transaction()
    .execute(async (trx) => {
      const row = await trx
        .insertInto('forecasts')
        .values({
          grid_key: o.gridKey,
          latitude: o.latitude,
          longitude: o.longitude,
          provider: o.provider,
          fetched_at: o.forecast.fetchedAt,
          first_hour: hours[0].time,
          last_hour: hours[hours.length - 1].time,
          hours: JSON.stringify(hours),
        })
        .returning('id')
        .executeTakeFirstOrThrow();
      await trx
        .insertInto('forecast_status')
        .values({
          grid_key: o.gridKey,
          last_attempt_at: o.forecast.fetchedAt,
          last_success_at: o.forecast.fetchedAt,
          failing_since: null,
          last_error: null,
          consecutive_failures: 0,
        })
        .onConflict((oc) =>
          oc.column('grid_key').doUpdateSet({
            last_attempt_at: o.forecast.fetchedAt,
            last_success_at: o.forecast.fetchedAt,
            failing_since: null,
            last_error: null,
            consecutive_failures: 0,
          }),
        )
        .execute();
      return row.id;
    });
}

/** A failed refresh: the last good forecast stays; the cell is marked failing from the first failure on. */
export async function recordForecastFailure(gridKey: string, at: Date, error: string) {
  await getDb()
    .insertInto('forecast_status')
    .values({ grid_key: gridKey, last_attempt_at: at, failing_since: at, last_error: error.slice(0, 500), consecutive_failures: 1 })
    .onConflict((oc) =>
      oc.column('grid_key').doUpdateSet({
        last_attempt_at: at,
        failing_since: sql`coalesce(forecast_status.failing_since, excluded.failing_since)`,
        last_error: error.slice(0, 500),
        consecutive_failures: sql`forecast_status.consecutive_failures + 1`,
      }),
    )
    .execute();
}

export async function latestForecast(gridKey: string): Promise<StoredForecast | null> {
  const row = await getDb()
    .selectFrom('forecasts')
    .selectAll()
    .where('grid_key', '=', gridKey)
    .orderBy('fetched_at', 'desc')
    // Two fetches within one clock reading (a frozen test clock): the later row is the newer answer.
    .orderBy('id', 'desc')
    .limit(1)
    .executeTakeFirst();
  if (!row) return null;
  return {
    id: row.id,
    gridKey: row.grid_key,
    provider: row.provider,
    fetchedAt: new Date(row.fetched_at).toISOString(),
    hours: row.hours as ForecastHour[],
  };
}

export async function forecastStatus(gridKey: string) {
  const row = await getDb().selectFrom('forecast_status').selectAll().where('grid_key', '=', gridKey).executeTakeFirst();
  if (!row) return null;
  const iso = (v: Date | string | null) => (v ? new Date(v).toISOString() : null);
  return {
    lastAttemptAt: iso(row.last_attempt_at),
    lastSuccessAt: iso(row.last_success_at),
    failingSince: iso(row.failing_since),
    lastError: row.last_error,
    consecutiveFailures: row.consecutive_failures,
  };
}

/** Where forecasts are needed: every property (or one), with the zone its local days are counted in. */
export async function forecastTargets(propertyId?: string) {
  let query = getDb().selectFrom('properties').select(['id', 'latitude', 'longitude', 'time_zone']).orderBy('created_at');
  if (propertyId) query = query.where('id', '=', propertyId);
  return query.execute();
}

/**
 * Properties whose grid cell has no forecast yet — just created, or moved to another cell — and whose cell was
 * not tried in the last `retryMinutes` (a provider that is down is not asked again every minute).
 */
export async function propertiesAwaitingForecast(now: Date, cellKey: (latitude: number, longitude: number) => string, retryMinutes = 15) {
  const since = new Date(now.getTime() - retryMinutes * 60_000);
  const [properties, known, tried] = await Promise.all([
    forecastTargets(),
    getDb().selectFrom('forecasts').select('grid_key').distinct().execute(),
    getDb().selectFrom('forecast_status').select('grid_key').where('last_attempt_at', '>', since).execute(),
  ]);
  const skip = new Set([...known, ...tried].map((r) => r.grid_key));
  return properties.filter((p) => !skip.has(cellKey(p.latitude, p.longitude)));
}
