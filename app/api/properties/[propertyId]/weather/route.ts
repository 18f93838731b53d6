import { requireRole } from '@/lib/auth/roles';
import { now } from '@/lib/clock';
import { forecastStatus, latestForecast } from '@/lib/data/forecasts';
import { getProperty } from '@/lib/data/properties';
import { json, notFound, route } from '@/lib/http';
import { indexForecast } from '@/lib/schedule/forecast-days';
import { localDateOf } from '@/lib/schedule/local-dates';
import { DEFAULT_SCHEDULE_PARAMETERS } from '@/lib/schedule/parameters';
import type { ForecastHour } from '@/lib/schedule/types';
import { gridCellKey } from '@/lib/weather/client';

type Context = { params: Promise<{ propertyId: string }> };

/**
 * A forecast counts as stale once it is 12 hours old even if no refresh failed: the worker refreshes every
 * few hours, so a forecast that old means refreshing has stopped. Sowcast's own threshold, no source.
 */
const STALE_AFTER_MS = 12 * 3_600_000;
/** A local day is listed when the forecast covers at least half of it (the last day of a fetch is partial). */
const MIN_HOURS_PER_DAY = 12;

/** The worker stores the provider's error as it was thrown; people get its first line, never a stack. */
function humanError(raw: string | null): string | null {
  if (!raw) return null;
  const firstLine = raw.split('\n')[0].replace(/^\s*(?:[A-Z][A-Za-z]*)?Error:\s*/, '').trim();
  if (!firstLine) return 'The forecast provider did not give a usable answer.';
  return firstLine.length > 300 ? `${firstLine.slice(0, 297)}…` : firstLine;
}

function dailyRows(hours: ForecastHour[], fetchedAt: string, timeZone: string, today: string) {
  const seed = DEFAULT_SCHEDULE_PARAMETERS.seedBeforeRain;
  // The engine's own reading of the forecast, so the panel and the plan agree on what a local day's rain is.
  const index = indexForecast({ timeZone, fetchedAt, hours }, timeZone, {
    measurableRainMm: seed.measurableRainMm,
    eventGapHours: seed.eventGapHours,
    soakingRainMm: seed.soakingRainMm,
    soakingWindowHours: seed.soakingWindowHours,
  });
  return index.days
    .filter((day) => day.date >= today && day.lastHour - day.firstHour + 1 >= MIN_HOURS_PER_DAY)
    .map((day) => {
      const dayHours = index.hours.slice(day.firstHour, day.lastHour + 1);
      const probabilities = dayHours.map((h) => h.rainProbabilityPct).filter((p): p is number => typeof p === 'number');
      return {
        date: day.date,
        hours: dayHours.length,
        rainMm: day.rainMm,
        // The rain that the seeding rules wait for (0.25 in, lib/schedule/rules/seed-before-rain.ts).
        soaking: day.rainMm >= seed.soakingRainMm,
        rainProbabilityMaxPct: probabilities.length ? Math.max(...probabilities) : null,
        tMinC: day.airMinC,
        tMaxC: day.airMaxC,
        windMaxKmh: Math.max(...dayHours.map((h) => h.windKmh)),
        soilTempC: day.soilTempC,
        soilSource: day.soilSource,
      };
    });
}

/** The forecast as it was last fetched for the property's grid cell, read in the property's time zone. */
export const GET = route(async (_request, { params }: Context) => {
  const { propertyId } = await params;
  await requireRole(propertyId, 'viewer');
  const property = await getProperty(propertyId);
  if (!property) throw notFound();
  const gridKey = gridCellKey(property.latitude, property.longitude);
  const [forecast, status] = await Promise.all([latestForecast(gridKey), forecastStatus(gridKey)]);
  const at = now();
  const failingSince = status?.failingSince ?? null;
  const lastError = failingSince ? humanError(status?.lastError ?? null) : null;
  const today = localDateOf(at, property.time_zone);
  const base = { timeZone: property.time_zone, now: at.toISOString(), today, failingSince, lastError, staleAfterHours: STALE_AFTER_MS / 3_600_000 };

  if (!forecast) {
    return json({ ...base, provider: null, fetchedAt: null, stale: false, staleSince: null, staleReason: null, days: [] });
  }

  const oldSince = Date.parse(forecast.fetchedAt) + STALE_AFTER_MS;
  const tooOld = at.getTime() > oldSince;
  const reasons: { reason: 'failing' | 'old'; since: number }[] = [];
  if (failingSince) reasons.push({ reason: 'failing', since: Date.parse(failingSince) });
  if (tooOld) reasons.push({ reason: 'old', since: oldSince });
  const first = reasons.sort((a, b) => a.since - b.since)[0];

  return json({
    ...base,
    provider: forecast.provider,
    fetchedAt: forecast.fetchedAt,
    stale: reasons.length > 0,
    staleSince: first ? new Date(first.since).toISOString() : null,
    // Refreshes failing says more than age alone, so it is named whenever it applies.
    staleReason: failingSince ? 'failing' : tooOld ? 'old' : null,
    days: dailyRows(forecast.hours, forecast.fetchedAt, property.time_zone, today),
  });
});
