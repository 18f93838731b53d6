// The weather panel's route: GET /api/properties/[propertyId]/weather, over real HTTP with real sessions and a
// forecast stored the way the worker stores one (lib/data/forecasts.ts). The role matrix for the route is in
// access.test.ts; this file checks what it says.
import { randomInt } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDb, createPool } from '@/db';
import { recordForecastFailure, storeForecast } from '@/lib/data/forecasts';
import type { ForecastHour } from '@/lib/schedule/types';
import { gridCellKey } from '@/lib/weather/client';
import { createProperty, signedInUser, type Client } from '../support/http';

const HOUR_MS = 3_600_000;
const TIME_ZONE = 'America/Chicago';

/** The local date of an instant in a zone, read from the runtime's ICU time zone data (en-CA gives YYYY-MM-DD). */
const localDate = (ms: number, timeZone = TIME_ZONE) =>
  new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' }).format(ms);

/** Local midnight of today, found by stepping back hour by hour until the local date changes (no project code). */
function localMidnightMs(nowMs: number, timeZone = TIME_ZONE): number {
  const today = localDate(nowMs, timeZone);
  let ms = Math.floor(nowMs / HOUR_MS) * HOUR_MS;
  while (localDate(ms - HOUR_MS, timeZone) === today) ms -= HOUR_MS;
  return ms;
}

const localHour = (ms: number, timeZone = TIME_ZONE) =>
  Number(new Intl.DateTimeFormat('en-US', { timeZone, hour: 'numeric', hourCycle: 'h23' }).format(ms));

/**
 * 16 local days of hours from local midnight: a plain day is 4 °C at night and 14 °C at 15:00, wind 10 km/h with
 * 22 km/h at 15:00, soil 8 °C; day 2 has 2.2 mm an hour from 13:00 to 17:00 (stamps 14:00–18:00) at 80 %.
 */
function syntheticHours(startMs: number, days = 16): ForecastHour[] {
  const hours: ForecastHour[] = [];
  for (let i = 0; i < days * 24; i++) {
    const ms = startMs + i * HOUR_MS;
    const hour = localHour(ms);
    const day = Math.floor(i / 24);
    const wet = day === 2 && hour >= 14 && hour <= 18;
    hours.push({
      time: new Date(ms).toISOString(),
      rainMm: wet ? 2.2 : 0,
      rainProbabilityPct: wet ? 80 : 10,
      airTempC: hour === 15 ? 14 : 4,
      relativeHumidityPct: 70,
      windKmh: hour === 15 ? 22 : 10,
      windGustKmh: null,
      soilTempC: 8,
    });
  }
  return hours;
}

/** A 0.1° grid cell of its own, so no other test's forecast lands in it. */
function lonelyPlace() {
  return { latitude: 40 + randomInt(0, 800) / 100, longitude: -(100 + randomInt(0, 2000) / 100) };
}

let owner: Client;
const db = createDb(createPool(process.env.DATABASE_URL));

beforeAll(async () => {
  ({ client: owner } = await signedInUser('weather-panel'));
});

afterAll(async () => {
  await db.destroy();
});

async function propertyWithForecast(o: { fetchedAgoMs: number; startMs?: number }) {
  const place = lonelyPlace();
  const property = await createProperty(owner, { ...place, timeZone: TIME_ZONE });
  const gridKey = gridCellKey(place.latitude, place.longitude);
  const nowMs = Date.now();
  const fetchedAt = new Date(nowMs - o.fetchedAgoMs).toISOString();
  const hours = syntheticHours(o.startMs ?? localMidnightMs(nowMs));
  await storeForecast({ gridKey, ...place, provider: 'open-meteo', forecast: { timeZone: TIME_ZONE, fetchedAt, hours } });
  return { property, gridKey, fetchedAt, hours };
}

describe('GET /api/properties/[propertyId]/weather', () => {
  it('with no forecast yet: no provider, no days, not stale', async () => {
    const property = await createProperty(owner, { ...lonelyPlace(), timeZone: TIME_ZONE });
    const res = await owner.get(`/api/properties/${property.id}/weather`);
    expect(res.status, res.text).toBe(200);
    expect(res.body).toMatchObject({ provider: null, fetchedAt: null, stale: false, staleSince: null, days: [], timeZone: TIME_ZONE });
  });

  it('gives 16 local days with rain, chance, low/high, wind and soil, from the stored forecast', async () => {
    const { property, fetchedAt } = await propertyWithForecast({ fetchedAgoMs: HOUR_MS });
    const res = await owner.get(`/api/properties/${property.id}/weather`);
    expect(res.status, res.text).toBe(200);
    expect(res.body.provider).toBe('open-meteo');
    expect(res.body.fetchedAt).toBe(fetchedAt);
    expect(res.body.stale).toBe(false);
    expect(res.body.staleSince).toBeNull();

    const days = res.body.days as Record<string, unknown>[];
    expect(days).toHaveLength(16);
    // Consecutive local dates from today in America/Chicago (IANA zone via the runtime's Intl).
    const today = localDate(Date.now());
    expect(res.body.today).toBe(today);
    expect(days[0].date).toBe(today);
    for (let i = 1; i < days.length; i++) {
      const prev = Date.parse(`${days[i - 1].date}T12:00:00Z`);
      expect(Date.parse(`${days[i].date}T12:00:00Z`) - prev).toBe(86_400_000);
    }

    // Day 2: 5 hours × 2.2 mm = 11 mm, which passes the 0.25 in (6.35 mm) soaking threshold.
    expect(days[2]).toMatchObject({ rainProbabilityMaxPct: 80, soaking: true });
    expect(days[2].rainMm).toBeCloseTo(11, 6);
    expect(days[1]).toMatchObject({ rainMm: 0, rainProbabilityMaxPct: 10, soaking: false });
    for (const day of days.slice(1, -1)) {
      expect(day).toMatchObject({ tMinC: 4, tMaxC: 14, windMaxKmh: 22, soilTempC: 8, soilSource: 'forecast' });
    }
  });

  it('drops the days of an older forecast that are already past', async () => {
    const nowMs = Date.now();
    const { property } = await propertyWithForecast({ fetchedAgoMs: 2 * HOUR_MS, startMs: localMidnightMs(nowMs) - 2 * 24 * HOUR_MS });
    const res = await owner.get(`/api/properties/${property.id}/weather`);
    expect(res.body.days[0].date).toBe(localDate(nowMs));
    expect(res.body.days).toHaveLength(14);
  });

  it('is stale once the forecast is more than 12 hours old, stale since fetchedAt + 12 h', async () => {
    const { property, fetchedAt } = await propertyWithForecast({ fetchedAgoMs: 13 * HOUR_MS });
    const res = await owner.get(`/api/properties/${property.id}/weather`);
    expect(res.body).toMatchObject({ stale: true, staleReason: 'old', failingSince: null, lastError: null });
    expect(Date.parse(res.body.staleSince)).toBe(Date.parse(fetchedAt) + 12 * HOUR_MS);
  });

  it('is stale since the first failed refresh when forecast_status.failing_since is set, with the error in plain words', async () => {
    const { property, gridKey } = await propertyWithForecast({ fetchedAgoMs: 3 * HOUR_MS });
    const firstFailure = new Date(Date.now() - 2 * HOUR_MS);
    firstFailure.setMilliseconds(0);
    await recordForecastFailure(gridKey, firstFailure, 'WeatherError: The forecast server answered HTTP 500.\n    at OpenMeteoClient.fetchForecast (lib/weather/open-meteo.ts:317:15)');
    await recordForecastFailure(gridKey, new Date(Date.now() - HOUR_MS), 'WeatherError: No forecast answer within 10000 ms.\n    at Timeout._onTimeout (node:internal/timers:1:1)');
    const res = await owner.get(`/api/properties/${property.id}/weather`);
    expect(res.body).toMatchObject({ stale: true, staleReason: 'failing', lastError: 'No forecast answer within 10000 ms.' });
    // failing_since stays at the first failure (coalesce), and that is when the forecast went stale.
    expect(res.body.failingSince).toBe(firstFailure.toISOString());
    expect(res.body.staleSince).toBe(firstFailure.toISOString());
    expect(res.text).not.toMatch(/\bat .+:\d+:\d+/);
    // The last good forecast is still what the panel shows.
    expect(res.body.days).toHaveLength(16);
    expect(res.body.provider).toBe('open-meteo');
  });

  it('is fresh again once a refresh succeeds after failures', async () => {
    const { property, gridKey } = await propertyWithForecast({ fetchedAgoMs: 5 * HOUR_MS });
    await recordForecastFailure(gridKey, new Date(Date.now() - 4 * HOUR_MS), 'WeatherError: The forecast answer was refused: it is not JSON.');
    expect((await owner.get(`/api/properties/${property.id}/weather`)).body.stale).toBe(true);
    const place = await db.selectFrom('properties').select(['latitude', 'longitude']).where('id', '=', property.id).executeTakeFirstOrThrow();
    const fetchedAt = new Date().toISOString();
    await storeForecast({
      gridKey,
      ...place,
      provider: 'open-meteo',
      forecast: { timeZone: TIME_ZONE, fetchedAt, hours: syntheticHours(localMidnightMs(Date.now())) },
    });
    const res = await owner.get(`/api/properties/${property.id}/weather`);
    expect(res.body).toMatchObject({ stale: false, staleSince: null, failingSince: null, lastError: null, fetchedAt });
  });

  it('a failing cell with no forecast at all says so without being "stale"', async () => {
    const place = lonelyPlace();
    const property = await createProperty(owner, { ...place, timeZone: TIME_ZONE });
    await recordForecastFailure(gridCellKey(place.latitude, place.longitude), new Date(), 'WeatherError: The forecast server could not be reached: ECONNREFUSED.');
    const res = await owner.get(`/api/properties/${property.id}/weather`);
    expect(res.body).toMatchObject({ provider: null, stale: false, days: [], lastError: 'The forecast server could not be reached: ECONNREFUSED.' });
    expect(res.body.failingSince).not.toBeNull();
  });
});
