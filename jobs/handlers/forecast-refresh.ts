// Forecast refresh: one fetch per grid cell, stored whole or not at all, then a replan for every active
// planting in the cell. Every three hours for all properties; for one property when it is new or has moved. A provider that is down, slow or talking nonsense leaves the last good forecast in
// place (the weather panel shows it as stale from the first failure on) and the worker carries on.
import { now } from '@/lib/clock';
import { forecastTargets, latestForecast, recordForecastFailure, storeForecast } from '@/lib/data/forecasts';
import { activePlantingIds } from '@/lib/data/plantings';
import { localDateOf } from '@/lib/schedule/local-dates';
import { gridCell, weatherClientFromEnv, WeatherError, type GridCell } from '@/lib/weather/client';
import type { JobContext } from '../context';
import { errorText } from '../log';
import { replanJob, type ForecastRefreshJob } from '../queues';

/** Open-Meteo forecasts up to 16 days ahead (Open-Meteo API documentation, forecast_days). */
export const FORECAST_DAYS = 16;
/** Cells fetched at once: enough to keep a slow provider from serialising a large club, polite to a free API. */
const PARALLEL_FETCHES = 4;
/** A refresh for one property (new, or moved) reuses its cell's forecast when it is this recent. */
const FRESH_ENOUGH_MS = 60 * 60_000;

interface Cell extends GridCell {
  timeZone: string;
  propertyIds: string[];
}

export async function refreshForecasts(ctx: JobContext, job: { id: string; data: ForecastRefreshJob }) {
  const targets = await forecastTargets(job.data.propertyId);
  const cells = new Map<string, Cell>();
  for (const t of targets) {
    const cell = gridCell(t.latitude, t.longitude);
    const known = cells.get(cell.key);
    if (known) known.propertyIds.push(t.id);
    else cells.set(cell.key, { ...cell, timeZone: t.time_zone, propertyIds: [t.id] });
  }
  const client = weatherClientFromEnv();
  const queue = [...cells.values()];
  let stored = 0;
  let failed = 0;
  let replans = 0;

  async function replansFor(cell: Cell) {
    const plantings = await activePlantingIds(cell.propertyIds);
    for (const plantingId of plantings) {
      const j = replanJob(plantingId);
      // null: a replan of this planting is already waiting, and it will read this newest forecast.
      if (await ctx.boss.send(j.name, j.data, j.options)) replans++;
    }
    return plantings.length;
  }

  async function refresh(cell: Cell) {
    const at = now();
    if (job.data.propertyId) {
      const recent = await latestForecast(cell.key);
      if (recent && at.getTime() - Date.parse(recent.fetchedAt) < FRESH_ENOUGH_MS) {
        const plantings = await replansFor(cell);
        ctx.log('info', 'forecast of the cell is fresh; replans queued', { queue: 'forecast-refresh', jobId: job.id, gridKey: cell.key, forecastId: recent.id, plantings });
        return;
      }
    }
    let forecast;
    try {
      forecast = await client.fetchForecast(
        { latitude: cell.latitude, longitude: cell.longitude, timeZone: cell.timeZone, startDate: localDateOf(at, cell.timeZone), days: FORECAST_DAYS },
        at,
      );
    } catch (error) {
      if (!(error instanceof WeatherError)) throw error;
      failed++;
      await recordForecastFailure(cell.key, now(), `${error.kind}: ${error.message}`);
      ctx.log('warn', 'forecast refresh failed; the last good forecast stays', {
        queue: 'forecast-refresh',
        jobId: job.id,
        gridKey: cell.key,
        provider: client.provider,
        kind: error.kind,
        attempts: error.attempts,
        error: error.message,
      });
      return;
    }
    const forecastId = await storeForecast({ gridKey: cell.key, latitude: cell.latitude, longitude: cell.longitude, provider: client.provider, forecast });
    stored++;
    const plantings = await replansFor(cell);
    ctx.log('info', 'forecast stored', { queue: 'forecast-refresh', jobId: job.id, gridKey: cell.key, forecastId, hours: forecast.hours.length, plantings });
  }

  const runners = Array.from({ length: Math.min(PARALLEL_FETCHES, queue.length) }, async () => {
    for (let cell = queue.shift(); cell; cell = queue.shift()) {
      try {
        await refresh(cell);
      } catch (error) {
        // A database error on one cell stops this runner, not the others; the job then fails and pg-boss retries it.
        failed++;
        ctx.log('error', 'forecast refresh error', { queue: 'forecast-refresh', jobId: job.id, gridKey: cell.key, error: errorText(error) });
        throw error;
      }
    }
  });
  const results = await Promise.allSettled(runners);
  const broken = results.find((r): r is PromiseRejectedResult => r.status === 'rejected');
  if (broken) throw broken.reason;
  return { cells: cells.size, stored, failed, replans };
}
