// The real Open-Meteo client against the local stand-in (fakes/weather), started in-process on a free port,
// and the stand-in's command line. Local dates and hours come from the IANA time zone database through Intl;
// the request and answer shape from the Open-Meteo API documentation. No database or web server is needed.
import { spawn } from 'node:child_process';
import net from 'node:net';
import path from 'node:path';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { startFakeWeather, type FakeWeather } from '@/fakes/weather/server';
import type { Forecast, ForecastHour } from '@/lib/schedule/types';
import { WeatherError, weatherClientFromEnv, type ForecastQuery, type WeatherClient } from '@/lib/weather/client';

const HOUR_MS = 3_600_000;
const CHICAGO = 'America/Chicago';
const NOW = new Date('2027-08-19T12:00:00Z');
// An invented spot in the mid-Mississippi valley.
const PLACE = { latitude: 38.44, longitude: -91.37, timeZone: CHICAGO };
const AUGUST: ForecastQuery = { ...PLACE, startDate: '2027-08-20', days: 16 };

let fake: FakeWeather;
let client: WeatherClient;

async function control(pathname: string, body?: unknown): Promise<any> {
  const res = await fetch(`${fake.url}${pathname}`, body === undefined ? {} : { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });
  const json = await res.json();
  if (!res.ok) throw new Error(`${pathname}: ${res.status} ${JSON.stringify(json)}`);
  return json;
}

async function failure(promise: Promise<unknown>): Promise<WeatherError> {
  try {
    await promise;
  } catch (error) {
    if (error instanceof WeatherError) return error;
    throw error;
  }
  throw new Error('expected a WeatherError');
}

const localFormat = new Intl.DateTimeFormat('en-CA', { timeZone: CHICAGO, year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', hourCycle: 'h23' });
/** Local date and hour (America/Chicago) of an instant. */
function local(ms: number): { date: string; hour: number } {
  const parts = Object.fromEntries(localFormat.formatToParts(ms).map((p) => [p.type, p.value]));
  return { date: `${parts.year}-${parts.month}-${parts.day}`, hour: Number(parts.hour) };
}
/** The local date and hour the rain of an hour fell in: the hour ENDING at the stamp. */
const rainHour = (h: ForecastHour) => local(Date.parse(h.time) - HOUR_MS);
const rainOn = (f: Forecast, date: string) => f.hours.filter((h) => rainHour(h).date === date);
const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);

beforeAll(async () => {
  fake = await startFakeWeather({ port: 0, log: false });
  // The default path of weatherClientFromEnv: no WEATHER_BASE_URL, the stand-in on FAKE_WEATHER_PORT.
  client = weatherClientFromEnv({ FAKE_WEATHER_PORT: String(fake.port), WEATHER_TIMEOUT_MS: '400', WEATHER_RETRY_DELAY_MS: '20' });
});
afterAll(async () => {
  await fake?.close();
});
beforeEach(async () => {
  await control('/_control/reset', {});
});

describe('the invented season through the real client', () => {
  it('maps to 16 days × 24 hours, hour by hour from 00:00 UTC of the start date', async () => {
    const forecast = await client.fetchForecast(AUGUST, NOW);
    expect(forecast.timeZone).toBe(CHICAGO);
    expect(forecast.fetchedAt).toBe(NOW.toISOString());
    expect(forecast.hours).toHaveLength(16 * 24);
    expect(forecast.hours[0].time).toBe('2027-08-20T00:00:00Z');
    expect(forecast.hours.at(-1)?.time).toBe('2027-09-04T23:00:00Z');
    forecast.hours.forEach((h, i) => {
      expect(Date.parse(h.time)).toBe(Date.parse('2027-08-20T00:00:00Z') + i * HOUR_MS);
      expect(h.relativeHumidityPct).toBeGreaterThanOrEqual(0);
      expect(h.relativeHumidityPct).toBeLessThanOrEqual(100);
      expect(h.rainMm).toBeGreaterThanOrEqual(0);
      expect(h.windGustKmh).toBeGreaterThanOrEqual(h.windKmh);
      expect(h.soilTempC).not.toBeNull();
    });
    const { count, recent } = await control('/_control/requests');
    expect(count).toBe(1);
    expect(recent[0]).toContain('start_date=2027-08-20&end_date=2027-09-04');
  });

  it('is plausible: August warm at 38° N, winter colder than summer, the seasons reversed south of the equator', async () => {
    const mean = (f: Forecast) => sum(f.hours.map((h) => h.airTempC)) / f.hours.length;
    const august = await client.fetchForecast(AUGUST, NOW);
    // August mean air temperature in the mid-Mississippi valley is about 25 °C (NOAA normals, from memory).
    expect(mean(august)).toBeGreaterThan(18);
    expect(mean(august)).toBeLessThan(32);
    const january = await client.fetchForecast({ ...AUGUST, startDate: '2028-01-20', days: 7 }, NOW);
    expect(mean(january)).toBeLessThan(mean(august) - 12);
    const south = { latitude: -38.44, longitude: 145.2, timeZone: 'Australia/Melbourne', days: 7 };
    const southJanuary = await client.fetchForecast({ ...south, startDate: '2028-01-20' }, NOW);
    const southJuly = await client.fetchForecast({ ...south, startDate: '2027-07-20' }, NOW);
    expect(mean(southJanuary)).toBeGreaterThan(mean(southJuly) + 8);
  });

  it('has humidity falling as the air warms, and soil at 6 cm following the air damped and later', async () => {
    const forecast = await client.fetchForecast(AUGUST, NOW);
    const day = forecast.hours.slice(24 * 3, 24 * 4); // 23 August UTC
    // Relative humidity is lowest in the warm afternoon (definition of RH against a slowly changing dew point).
    const t = day.map((h) => h.airTempC);
    const rh = day.map((h) => h.relativeHumidityPct);
    const tMean = sum(t) / 24;
    const rhMean = sum(rh) / 24;
    const covariance = sum(t.map((x, i) => (x - tMean) * (rh[i] - rhMean)));
    expect(covariance).toBeLessThan(0);
    // Heat conduction damps and delays the daily wave with depth (soil physics textbooks, from memory).
    const soil = day.map((h) => h.soilTempC as number);
    const range = (xs: number[]) => Math.max(...xs) - Math.min(...xs);
    expect(range(soil)).toBeLessThan(range(t));
    expect(range(soil)).toBeGreaterThan(0.3 * range(t));
    const peak = (xs: number[]) => xs.indexOf(Math.max(...xs));
    const lagHours = (peak(soil) - peak(t) + 24) % 24;
    expect(lagHours).toBeGreaterThanOrEqual(1);
    expect(lagHours).toBeLessThanOrEqual(6);
  });

  it('is deterministic: the same query gives the same numbers, an overlapping query the same hours, the whole 0.1° cell the same', async () => {
    const a = await client.fetchForecast(AUGUST, NOW);
    const b = await client.fetchForecast(AUGUST, new Date(NOW.getTime() + 3 * HOUR_MS));
    expect(b.hours).toEqual(a.hours);
    const later = await client.fetchForecast({ ...AUGUST, startDate: '2027-08-23', days: 4 }, NOW);
    expect(later.hours).toEqual(a.hours.slice(72, 72 + 96));
    const neighbour = await client.fetchForecast({ ...AUGUST, latitude: 38.42, longitude: -91.39 }, NOW);
    expect(neighbour.hours).toEqual(a.hours);
    const elsewhere = await client.fetchForecast({ ...AUGUST, latitude: 39.1 }, NOW);
    expect(elsewhere.hours).not.toEqual(a.hours);
  });
});

describe('weather put in through the control API', () => {
  it('a rain event lands on the right local hours of the right date and totals the mm asked for', async () => {
    await control('/_control/events', { kind: 'rain', ...PLACE, date: '2027-08-22', totalMm: 18.4, startHour: 15, hours: 3 });
    // A late-evening shower runs past midnight UTC but stays on its local date.
    await control('/_control/events', { kind: 'rain', ...PLACE, date: '2027-08-25', totalMm: 7, startHour: 21, hours: 3 });
    const forecast = await client.fetchForecast(AUGUST, NOW);

    const wet22 = rainOn(forecast, '2027-08-22').filter((h) => h.rainMm > 0);
    expect(wet22.map((h) => rainHour(h).hour)).toEqual([15, 16, 17]);
    // August in Chicago's zone is on daylight time, UTC−5 (IANA tz; US rule since 2007): 15:00 CDT = 20:00 UTC,
    // and the first hour's rain is stamped at its end, 21:00 UTC (Open-Meteo: preceding hour sum).
    expect(wet22.map((h) => h.time)).toEqual(['2027-08-22T21:00:00Z', '2027-08-22T22:00:00Z', '2027-08-22T23:00:00Z']);
    expect(sum(rainOn(forecast, '2027-08-22').map((h) => h.rainMm))).toBeCloseTo(18.4, 6);
    for (const h of wet22) expect(h.rainProbabilityPct).toBeGreaterThanOrEqual(80);

    const wet25 = rainOn(forecast, '2027-08-25').filter((h) => h.rainMm > 0);
    expect(wet25.map((h) => rainHour(h).hour)).toEqual([21, 22, 23]);
    expect(wet25.map((h) => h.time)).toEqual(['2027-08-26T03:00:00Z', '2027-08-26T04:00:00Z', '2027-08-26T05:00:00Z']);
    expect(sum(wet25.map((h) => h.rainMm))).toBeCloseTo(7, 6);

    // The event belongs to its cell only.
    const away = await client.fetchForecast({ ...AUGUST, latitude: 38.7 }, NOW);
    expect(sum(rainOn(away, '2027-08-22').filter((h) => [15, 16, 17].includes(rainHour(h).hour)).map((h) => h.rainMm))).not.toBeCloseTo(18.4, 1);
  });

  it('a rain event on the spring-forward day skips the hour that does not exist', async () => {
    // US daylight time starts at 02:00 on the second Sunday of March: 12 March 2028 (IANA tz, America/Chicago).
    await control('/_control/events', { kind: 'rain', ...PLACE, date: '2028-03-12', totalMm: 9, startHour: 1, hours: 3 });
    const forecast = await client.fetchForecast({ ...PLACE, startDate: '2028-03-10', days: 5 }, NOW);
    const day = rainOn(forecast, '2028-03-12');
    expect(day).toHaveLength(23);
    const wet = day.filter((h) => h.rainMm > 0);
    expect(wet.map((h) => rainHour(h).hour)).toEqual([1, 3, 4]);
    expect(wet.map((h) => h.time)).toEqual(['2028-03-12T08:00:00Z', '2028-03-12T09:00:00Z', '2028-03-12T10:00:00Z']);
    expect(sum(day.map((h) => h.rainMm))).toBeCloseTo(9, 6);
  });

  it('a cold snap brings the date’s lowest temperature to minC and chills the soil, leaving earlier days alone', async () => {
    const query: ForecastQuery = { ...PLACE, startDate: '2027-10-10', days: 8 };
    const before = await client.fetchForecast(query, NOW);
    await control('/_control/events', { kind: 'cold', ...PLACE, date: '2027-10-13', minC: -3 });
    const after = await client.fetchForecast(query, NOW);
    const onDate = (f: Forecast, date: string) => f.hours.filter((h) => local(Date.parse(h.time)).date === date);
    expect(Math.min(...onDate(after, '2027-10-13').map((h) => h.airTempC))).toBeCloseTo(-3, 1);
    const soilMin = (f: Forecast) => Math.min(...onDate(f, '2027-10-13').map((h) => h.soilTempC as number));
    expect(soilMin(after)).toBeLessThan(soilMin(before) - 2);
    expect(onDate(after, '2027-10-11')).toEqual(onDate(before, '2027-10-11'));
  });

  it('a dry spell takes the rain off its dates and nothing else', async () => {
    const before = await client.fetchForecast(AUGUST, NOW);
    const dates = [...new Set(before.hours.slice(24, -24).map((h) => rainHour(h).date))];
    const wetDate = dates.find((d) => sum(rainOn(before, d).map((h) => h.rainMm)) > 0);
    expect(wetDate, 'the invented season rains on some date in 16 days').toBeDefined();
    await control('/_control/events', { kind: 'dry', ...PLACE, date: wetDate, days: 1 });
    const after = await client.fetchForecast(AUGUST, NOW);
    expect(sum(rainOn(after, wetDate as string).map((h) => h.rainMm))).toBe(0);
    for (const d of dates.filter((x) => x !== wetDate)) {
      expect(rainOn(after, d).map((h) => h.rainMm)).toEqual(rainOn(before, d).map((h) => h.rainMm));
    }
  });

  it('refuses a bad event with a reason and keeps the others', async () => {
    await control('/_control/events', { kind: 'rain', ...PLACE, date: '2027-08-22', totalMm: 5 });
    const bad = [
      { kind: 'rain', ...PLACE, date: '2027-08-32', totalMm: 5 },
      { kind: 'rain', ...PLACE, date: '2027-08-22', totalMm: 5, startHour: 22, hours: 4 },
      { kind: 'snow', ...PLACE, date: '2027-08-22' },
      { kind: 'cold', ...PLACE, timeZone: 'Mars/Olympus', date: '2027-08-22', minC: -3 },
    ];
    for (const body of bad) {
      const res = await fetch(`${fake.url}/_control/events`, { method: 'POST', body: JSON.stringify(body) });
      expect(res.status).toBe(400);
      const json = await res.json();
      expect(json.error).toBe(true);
      expect(json.reason).toEqual(expect.any(String));
    }
    expect((await control('/_control/events')).events).toHaveLength(1);
  });
});

describe('a misbehaving provider', () => {
  it('fail → WeatherError http after 3 attempts', async () => {
    await control('/_control/mode', { mode: 'fail' });
    const error = await failure(client.fetchForecast(AUGUST, NOW));
    expect(error).toMatchObject({ kind: 'http', status: 500, attempts: 3 });
    expect((await control('/_control/requests')).count).toBe(3);
  });

  it('one failure, then the retry succeeds', async () => {
    await control('/_control/mode', { mode: 'fail', times: 1 });
    const forecast = await client.fetchForecast(AUGUST, NOW);
    expect(forecast.hours).toHaveLength(384);
    expect((await control('/_control/requests')).count).toBe(2);
  });

  it('slow beyond the timeout → WeatherError timeout, after 3 attempts', async () => {
    await control('/_control/mode', { mode: 'slow', delayMs: 3_000 });
    const started = Date.now();
    const error = await failure(client.fetchForecast(AUGUST, NOW));
    expect(error.kind).toBe('timeout');
    expect(Date.now() - started).toBeLessThan(2_900); // 3 × 400 ms and two short back-offs, never the 3 s wait
    expect((await control('/_control/requests')).count).toBe(3);
  });

  it('slow within the timeout is just slow', async () => {
    await control('/_control/mode', { mode: 'slow', delayMs: 100 });
    expect((await client.fetchForecast({ ...AUGUST, days: 2 }, NOW)).hours).toHaveLength(48);
  });

  it.each([
    ['garbage', /not JSON/],
    ['partial', /values for 384 hours/],
    ['empty', /0 hours instead of the 384/],
  ])('%s → WeatherError invalid, not retried', async (mode, reason) => {
    await control('/_control/mode', { mode });
    const error = await failure(client.fetchForecast(AUGUST, NOW));
    expect(error.kind).toBe('invalid');
    expect(error.message).toMatch(reason);
    expect((await control('/_control/requests')).count).toBe(1);
  });

  it('a 4xx (429, rate limit) is not retried', async () => {
    await control('/_control/mode', { mode: 'limit' });
    const error = await failure(client.fetchForecast(AUGUST, NOW));
    expect(error).toMatchObject({ kind: 'http', status: 429, attempts: 1 });
    expect((await control('/_control/requests')).count).toBe(1);
  });

  it('nobody listening → WeatherError network after 3 attempts', async () => {
    const closed = await startFakeWeather({ port: 0, log: false });
    await closed.close();
    const nowhere = weatherClientFromEnv({ WEATHER_BASE_URL: closed.url, WEATHER_RETRY_DELAY_MS: '10' });
    const error = await failure(nowhere.fetchForecast(AUGUST, NOW));
    expect(error).toMatchObject({ kind: 'network', attempts: 3 });
  });

  it('back to ok after reset', async () => {
    await control('/_control/mode', { mode: 'garbage' });
    await control('/_control/reset', {});
    expect((await client.fetchForecast(AUGUST, NOW)).hours).toHaveLength(384);
    expect(await control('/_control/mode')).toMatchObject({ mode: 'ok' });
  });
});

describe('the stand-in speaks Open-Meteo’s request and error format', () => {
  const base = 'latitude=38.44&longitude=-91.37&hourly=temperature_2m,precipitation&timezone=GMT&timeformat=unixtime&start_date=2027-08-20&end_date=2027-08-21';

  it('answers the documented JSON shape for only the variables asked', async () => {
    const res = await fetch(`${fake.url}/v1/forecast?${base}`);
    expect(res.status).toBe(200);
    const json = await res.json();
    expect(Object.keys(json)).toEqual(['latitude', 'longitude', 'generationtime_ms', 'utc_offset_seconds', 'timezone', 'timezone_abbreviation', 'elevation', 'hourly_units', 'hourly']);
    expect(json).toMatchObject({ latitude: 38.4, longitude: -91.4, utc_offset_seconds: 0, timezone: 'GMT' });
    expect(Object.keys(json.hourly)).toEqual(['time', 'temperature_2m', 'precipitation']);
    expect(json.hourly_units).toEqual({ time: 'unixtime', temperature_2m: '°C', precipitation: 'mm' });
    expect(json.hourly.time[0]).toBe(Date.UTC(2027, 7, 20) / 1000);
    expect(json.hourly.time).toHaveLength(48);
  });

  it.each([
    ['a daily variable', `${base}&daily=temperature_2m_max`],
    ['ISO 8601 times', base.replace('unixtime', 'iso8601')],
    ['a local time zone', base.replace('GMT', 'America%2FChicago')],
    ['an unknown hourly variable', base.replace('precipitation', 'soil_temp')],
    ['the end before the start', base.replace('end_date=2027-08-21', 'end_date=2027-08-19')],
    ['more than 16 days', base.replace('end_date=2027-08-21', 'end_date=2027-09-05')],
    ['no start date', base.replace('&start_date=2027-08-20', '')],
    ['a latitude off the globe', base.replace('latitude=38.44', 'latitude=95')],
    ['mph', `${base}&wind_speed_unit=mph`],
  ])('400 {error: true, reason} for %s', async (_name, query) => {
    const res = await fetch(`${fake.url}/v1/forecast?${query}`);
    expect(res.status).toBe(400);
    const json = await res.json();
    expect(json).toEqual({ error: true, reason: expect.any(String) });
  });

  it('has a health check', async () => {
    expect(await control('/health')).toEqual({ ok: true, service: 'fake-weather' });
  });
});

describe('the stand-in as a process', () => {
  it('starts on FAKE_WEATHER_PORT, logs one JSON line per request and exits cleanly on SIGTERM', async () => {
    const port = await new Promise<number>((resolve) => {
      const probe = net.createServer().listen(0, '127.0.0.1', () => {
        const p = (probe.address() as net.AddressInfo).port;
        probe.close(() => resolve(p));
      });
    });
    const root = path.resolve(__dirname, '../..');
    const child = spawn(process.execPath, ['--import', 'tsx', 'fakes/weather/server.ts'], { cwd: root, env: { ...process.env, FAKE_WEATHER_PORT: String(port) }, stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    child.stdout.on('data', (d) => (out += d));
    const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
    try {
      let up = false;
      for (let i = 0; i < 100 && !up; i++) {
        up = await fetch(`http://127.0.0.1:${port}/health`).then((r) => r.ok, () => false);
        if (!up) await new Promise((r) => setTimeout(r, 100));
      }
      expect(up).toBe(true);
      const remote = weatherClientFromEnv({ FAKE_WEATHER_PORT: String(port) });
      expect((await remote.fetchForecast({ ...AUGUST, days: 1 }, NOW)).hours).toHaveLength(24);
      child.kill('SIGTERM');
      expect(await exited).toBe(0);
    } finally {
      if (child.exitCode === null) child.kill('SIGKILL');
    }
    const lines = out.trim().split('\n').map((l) => JSON.parse(l));
    expect(lines.find((l) => l.path === '/v1/forecast')).toMatchObject({ service: 'fake-weather', method: 'GET', status: 200 });
    expect(lines.at(-1)).toMatchObject({ stopped: 'SIGTERM' });
  });
});
