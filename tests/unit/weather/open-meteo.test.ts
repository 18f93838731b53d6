// The Open-Meteo client with a stubbed fetch. The fixture is hand-made in the exact shape the Open-Meteo API
// documentation gives for /v1/forecast with timeformat=unixtime and timezone=GMT ("JSON Return Object",
// "Hourly Parameter Definition"); its numbers are invented.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { gridCell, gridCellKey, WeatherError, weatherClientFromEnv, type ForecastQuery } from '@/lib/weather/client';
import { createOpenMeteoClient, forecastRequestUrl, OPEN_METEO_HOURLY, parseOpenMeteoForecast } from '@/lib/weather/open-meteo';

const FIXTURE_TEXT = readFileSync(path.join(__dirname, 'fixtures/open-meteo-forecast-unixtime.json'), 'utf8');
const fixture = () => JSON.parse(FIXTURE_TEXT);
const NOW = new Date('2027-08-19T23:30:00Z');
const QUERY: ForecastQuery = { latitude: 41.88, longitude: -87.63, timeZone: 'America/Chicago', startDate: '2027-08-20', days: 1 };

type Answer = { status?: number; body?: unknown; text?: string } | Error | 'hang';

/** A fetch that plays back answers in order and records each URL it was asked for. */
function stubFetch(...answers: Answer[]) {
  const urls: string[] = [];
  const fetchStub = (async (input: string | URL | Request, init?: RequestInit) => {
    urls.push(String(input));
    const answer = answers[Math.min(urls.length - 1, answers.length - 1)];
    if (answer instanceof Error) throw answer;
    if (answer === 'hang') {
      return new Promise<Response>((_, reject) => {
        init?.signal?.addEventListener('abort', () => reject(new DOMException('This operation was aborted', 'AbortError')));
      });
    }
    const text = answer.text ?? JSON.stringify(answer.body);
    return new Response(text, { status: answer.status ?? 200, headers: { 'content-type': 'application/json' } });
  }) as typeof fetch;
  return { fetch: fetchStub, urls };
}

function client(fetchImpl: typeof fetch, delays: number[] = [], extra: { timeoutMs?: number } = {}) {
  return createOpenMeteoClient({
    baseUrl: 'https://weather.example.test/',
    fetch: fetchImpl,
    retryDelayMs: 250,
    sleep: async (ms) => {
      delays.push(ms);
    },
    ...extra,
  });
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

describe('the request', () => {
  it('asks /v1/forecast for the hourly variables, km/h, GMT and unix seconds over the local start date and days − 1 after', () => {
    // Parameter names and values from the Open-Meteo API documentation (URL parameter table).
    const url = forecastRequestUrl('https://api.open-meteo.com/', { ...QUERY, days: 16 });
    expect(url.origin + url.pathname).toBe('https://api.open-meteo.com/v1/forecast');
    expect(Object.fromEntries(url.searchParams)).toEqual({
      latitude: '41.88',
      longitude: '-87.63',
      hourly: 'temperature_2m,relative_humidity_2m,precipitation,precipitation_probability,wind_speed_10m,wind_gusts_10m,soil_temperature_6cm',
      wind_speed_unit: 'kmh',
      timezone: 'GMT',
      timeformat: 'unixtime',
      start_date: '2027-08-20',
      end_date: '2027-09-04', // 20 August + 15 days: 16 days in all, the documented maximum
    });
    expect(OPEN_METEO_HOURLY).toHaveLength(7);
  });

  it('keeps a path prefix of the base URL and crosses month and leap-day ends', () => {
    const url = forecastRequestUrl('https://proxy.example.test/open-meteo', { ...QUERY, startDate: '2028-02-28', days: 3 });
    expect(url.pathname).toBe('/open-meteo/v1/forecast');
    expect(url.searchParams.get('end_date')).toBe('2028-03-01'); // 2028 is a leap year (Gregorian rule)
  });

  it('refuses a query the provider cannot answer before any request is made', async () => {
    const { fetch, urls } = stubFetch({ body: fixture() });
    const c = client(fetch);
    await expect(c.fetchForecast({ ...QUERY, days: 17 }, NOW)).rejects.toThrow(RangeError); // forecast_days 0–16 (Open-Meteo docs)
    await expect(c.fetchForecast({ ...QUERY, timeZone: 'America/Chikago' }, NOW)).rejects.toThrow(/time zone/);
    await expect(c.fetchForecast({ ...QUERY, startDate: '2027-02-30' }, NOW)).rejects.toThrow(/start date/);
    await expect(c.fetchForecast({ ...QUERY, latitude: 91 }, NOW)).rejects.toThrow(/latitude/);
    expect(urls).toHaveLength(0);
  });
});

describe('mapping an answer to the engine’s Forecast', () => {
  it('turns unix seconds into ISO instants and keeps every value as given', async () => {
    const { fetch, urls } = stubFetch({ body: fixture() });
    const forecast = await client(fetch).fetchForecast(QUERY, NOW);
    expect(urls).toHaveLength(1);
    expect(forecast.timeZone).toBe('America/Chicago');
    expect(forecast.fetchedAt).toBe('2027-08-19T23:30:00.000Z');
    expect(forecast.hours).toHaveLength(24);
    // POSIX time: seconds since 1970-01-01T00:00Z; Date.UTC gives the same count independently.
    expect(Date.UTC(2027, 7, 20) / 1000).toBe(1818720000);
    expect(forecast.hours[0].time).toBe('2027-08-20T00:00:00Z');
    expect(forecast.hours[23].time).toBe('2027-08-20T23:00:00Z');
    const f = fixture().hourly;
    forecast.hours.forEach((h, i) => {
      expect(h.airTempC).toBe(f.temperature_2m[i]);
      expect(h.relativeHumidityPct).toBe(f.relative_humidity_2m[i]);
      expect(h.windKmh).toBe(f.wind_speed_10m[i]); // km/h as asked (wind_speed_unit=kmh), no conversion
      expect(h.windGustKmh).toBe(f.wind_gusts_10m[i]);
      expect(h.rainProbabilityPct).toBe(f.precipitation_probability[i]);
      expect(h.soilTempC).toBe(f.soil_temperature_6cm[i]);
    });
  });

  it('keeps precipitation on its stamp: the "preceding hour sum" (Open-Meteo docs) is rain in the hour ending at `time`', async () => {
    const { fetch } = stubFetch({ body: fixture() });
    const forecast = await client(fetch).fetchForecast(QUERY, NOW);
    const wet = forecast.hours.filter((h) => h.rainMm > 0).map((h) => [h.time, h.rainMm]);
    expect(wet).toEqual([
      ['2027-08-20T14:00:00Z', 0.2],
      ['2027-08-20T15:00:00Z', 1.4],
      ['2027-08-20T16:00:00Z', 3.1],
      ['2027-08-20T17:00:00Z', 0.8],
    ]);
    // So the 3.1 mm fell from 15:00 to 16:00 UTC, i.e. 10:00–11:00 in Chicago, on summer time (UTC−5) that day
    // — IANA time zone database through Intl.
    const startOfHour = Date.parse('2027-08-20T16:00:00Z') - 3_600_000;
    const local = new Intl.DateTimeFormat('en-CA', { timeZone: 'America/Chicago', hour: '2-digit', hourCycle: 'h23', year: 'numeric', month: '2-digit', day: '2-digit' }).format(startOfHour);
    expect(local).toBe('2027-08-20, 10');
  });

  it('keeps the provider’s nulls as null where they are allowed (rain probability, soil temperature)', async () => {
    const { fetch } = stubFetch({ body: fixture() });
    const forecast = await client(fetch).fetchForecast(QUERY, NOW);
    expect(forecast.hours[20].rainProbabilityPct).toBeNull();
    expect(forecast.hours[21].soilTempC).toBeNull();
    expect(forecast.hours[22].rainProbabilityPct).toBe(8);
  });

  it('cuts a trailing run of nulls of at most a day (hours past the models’ reach: open-meteo/open-meteo issue #1428)', () => {
    const body = fixture();
    for (let i = 19; i < 24; i++) {
      body.hourly.temperature_2m[i] = null;
      body.hourly.wind_speed_10m[i] = null;
    }
    const forecast = parseOpenMeteoForecast(body, QUERY, NOW);
    expect(forecast.hours).toHaveLength(19);
    expect(forecast.hours.at(-1)?.time).toBe('2027-08-20T18:00:00Z');
  });

  it('over 16 days, cuts a 24-hour tail but refuses a longer one', () => {
    const sixteen = { ...QUERY, days: 16 };
    const long = () => {
      const body = fixture();
      for (const [name, values] of Object.entries(body.hourly) as [string, unknown[]][]) {
        body.hourly[name] = name === 'time' ? Array.from({ length: 384 }, (_, i) => 1818720000 + 3600 * i) : Array.from({ length: 384 }, (_, i) => values[i % 24]);
      }
      return body;
    };
    const dayShort = long();
    dayShort.hourly.temperature_2m.fill(null, 360);
    expect(parseOpenMeteoForecast(dayShort, sixteen, NOW).hours).toHaveLength(360);
    const moreThanADayShort = long();
    moreThanADayShort.hourly.precipitation.fill(null, 359);
    expect(() => parseOpenMeteoForecast(moreThanADayShort, sixteen, NOW)).toThrow(/25 hours before the end/);
  });
});

describe('a malformed, partial or empty answer is refused whole', () => {
  const cases: [string, (b: any) => void, RegExp][] = [
    ['a number sent as a string', (b) => (b.hourly.temperature_2m[3] = '23.5'), /temperature_2m\.3: .*expected number/],
    ['a missing value inside the series', (b) => (b.hourly.temperature_2m[5] = null), /temperature_2m is missing at 2027-08-20T05:00:00Z/],
    ['missing rain inside the series', (b) => (b.hourly.precipitation[2] = null), /precipitation is missing/],
    ['arrays of different lengths', (b) => b.hourly.relative_humidity_2m.pop(), /relative_humidity_2m has 23 values for 24 hours/],
    ['a variable left out', (b) => delete b.hourly.soil_temperature_6cm, /soil_temperature_6cm: .*expected array/],
    ['no hours at all', (b) => Object.keys(b.hourly).forEach((k) => (b.hourly[k] = [])), /0 hours instead of the 24/],
    ['fewer hours than asked', (b) => Object.keys(b.hourly).forEach((k) => b.hourly[k].splice(12)), /12 hours instead of the 24/],
    ['hours two apart', (b) => (b.hourly.time = b.hourly.time.map((t: number, i: number) => t + i * 3600)), /not one hour apart/],
    ['another start', (b) => (b.hourly.time = b.hourly.time.map((t: number) => t + 86_400)), /starts at 2027-08-21T00:00:00Z/],
    ['timestamps as text (iso8601, not unixtime)', (b) => (b.hourly.time = b.hourly.time.map((t: number) => new Date(t * 1000).toISOString().slice(0, 16))), /hourly\.time\.0/],
    ['a local-time answer (utc_offset_seconds ≠ 0)', (b) => (b.utc_offset_seconds = -18_000), /utc_offset_seconds/],
    ['wind in another unit than asked', (b) => (b.hourly_units.wind_speed_10m = 'mph'), /wind_speed_10m: .*km\/h/],
    ['temperature in °F', (b) => (b.hourly_units.temperature_2m = '°F'), /temperature_2m: .*°C/],
    ['air at 71 °C, beyond any recorded (WMO extremes archive)', (b) => (b.hourly.temperature_2m[10] = 71), /temperature_2m\.10: Too big/],
    ['humidity above 100 %', (b) => (b.hourly.relative_humidity_2m[10] = 104), /relative_humidity_2m\.10: Too big/],
    ['negative rain', (b) => (b.hourly.precipitation[1] = -0.1), /precipitation\.1: Too small/],
    ['rain probability above 100 %', (b) => (b.hourly.precipitation_probability[1] = 130), /precipitation_probability\.1: Too big/],
    ['a forecast for another place', (b) => (b.latitude = 44.5), /it is for 44\.5/],
    ['every temperature missing', (b) => (b.hourly.temperature_2m = b.hourly.temperature_2m.map(() => null)), /values stop 24 hours/],
    ['values stopping more than half-way through a one-day range', (b) => b.hourly.wind_speed_10m.fill(null, 11), /values stop 13 hours/],
    ['an error object with status 200', (b) => {
      for (const k of Object.keys(b)) delete b[k];
      Object.assign(b, { error: true, reason: 'x' });
    }, /latitude: /],
  ];
  for (const [name, spoil, reason] of cases) {
    it(name, async () => {
      const body = fixture();
      spoil(body);
      const { fetch, urls } = stubFetch({ body });
      const error = await failure(client(fetch).fetchForecast(QUERY, NOW));
      expect(error.kind).toBe('invalid');
      expect(error.message).toMatch(reason);
      expect(urls).toHaveLength(1); // nonsense is not retried
    });
  }

  it('NaN in the body (not JSON, RFC 8259 has no NaN) is refused', async () => {
    const { fetch } = stubFetch({ text: FIXTURE_TEXT.replace('"temperature_2m": [26.9', '"temperature_2m": [NaN') });
    expect((await failure(client(fetch).fetchForecast(QUERY, NOW))).kind).toBe('invalid');
  });

  it('NaN or Infinity reaching the parser as numbers is refused too', () => {
    for (const bad of [NaN, Infinity]) {
      const body = fixture();
      body.hourly.wind_speed_10m[4] = bad;
      expect(() => parseOpenMeteoForecast(body, QUERY, NOW)).toThrow(WeatherError);
    }
  });
});

describe('timeouts, retries and back-off', () => {
  it('retries a 5xx with doubling back-off and returns the good answer', async () => {
    const delays: number[] = [];
    const { fetch, urls } = stubFetch({ status: 503, body: { error: true, reason: 'busy' } }, { status: 502, text: 'Bad Gateway' }, { body: fixture() });
    const forecast = await client(fetch, delays).fetchForecast(QUERY, NOW);
    expect(forecast.hours).toHaveLength(24);
    expect(urls).toHaveLength(3);
    expect(delays).toEqual([250, 500]);
  });

  it('gives up after 3 attempts on a server that keeps failing: http, with the status', async () => {
    const delays: number[] = [];
    const { fetch, urls } = stubFetch({ status: 500, body: { error: true, reason: 'down' } });
    const error = await failure(client(fetch, delays).fetchForecast(QUERY, NOW));
    expect(error).toMatchObject({ kind: 'http', status: 500, attempts: 3 });
    expect(error.message).toMatch(/HTTP 500: down/);
    expect(urls).toHaveLength(3);
  });

  it('does not retry a 400 and passes on the provider’s reason (error object per Open-Meteo docs)', async () => {
    const reason = 'Cannot initialize WeatherVariable from invalid String value soil_temp for key hourly';
    const { fetch, urls } = stubFetch({ status: 400, body: { error: true, reason } });
    const error = await failure(client(fetch).fetchForecast(QUERY, NOW));
    expect(error).toMatchObject({ kind: 'http', status: 400, attempts: 1 });
    expect(error.message).toContain(reason);
    expect(urls).toHaveLength(1);
  });

  it('does not retry a 429 (rate limit): the worker’s queue backs off instead', async () => {
    const { fetch, urls } = stubFetch({ status: 429, body: { error: true, reason: 'Minutely API request limit exceeded' } });
    expect((await failure(client(fetch).fetchForecast(QUERY, NOW))).status).toBe(429);
    expect(urls).toHaveLength(1);
  });

  it('retries network errors, then reports kind network', async () => {
    const refused = Object.assign(new TypeError('fetch failed'), { cause: { code: 'ECONNREFUSED' } });
    const { fetch, urls } = stubFetch(refused);
    const error = await failure(client(fetch).fetchForecast(QUERY, NOW));
    expect(error.kind).toBe('network');
    expect(error.message).toContain('ECONNREFUSED');
    expect(urls).toHaveLength(3);
  });

  it('aborts an attempt at the timeout, retries, then reports kind timeout', async () => {
    const { fetch, urls } = stubFetch('hang');
    const started = Date.now();
    const error = await failure(client(fetch, [], { timeoutMs: 30 }).fetchForecast(QUERY, NOW));
    expect(error.kind).toBe('timeout');
    expect(urls).toHaveLength(3);
    expect(Date.now() - started).toBeLessThan(2_000);
  });

  it('recovers when only the first attempt times out', async () => {
    const { fetch, urls } = stubFetch('hang', { body: fixture() });
    const forecast = await client(fetch, [], { timeoutMs: 30 }).fetchForecast(QUERY, NOW);
    expect(forecast.hours).toHaveLength(24);
    expect(urls).toHaveLength(2);
  });
});

describe('grid cells', () => {
  it('puts places within the same 0.1° cell under one key (common practice, no source)', () => {
    expect(gridCellKey(41.8781, -87.6298)).toBe('41.9,-87.6');
    expect(gridCellKey(41.86, -87.64)).toBe('41.9,-87.6');
    expect(gridCellKey(41.84, -87.64)).toBe('41.8,-87.6');
    expect(gridCell(41.8781, -87.6298)).toEqual({ key: '41.9,-87.6', latitude: 41.9, longitude: -87.6 });
  });

  it('has no negative zero and one cell across the antimeridian', () => {
    expect(gridCellKey(-0.04, 0.03)).toBe('0.0,0.0');
    expect(gridCellKey(10, 179.97)).toBe(gridCellKey(10, -179.99));
    expect(gridCellKey(10, 180)).toBe('10.0,-180.0');
  });

  it('refuses coordinates that are not on Earth', () => {
    expect(() => gridCellKey(95, 0)).toThrow(RangeError);
    expect(() => gridCellKey(0, Number.NaN)).toThrow(RangeError);
  });
});

describe('weatherClientFromEnv', () => {
  it('points at the local stand-in by default, on FAKE_WEATHER_PORT or 4010', () => {
    expect(weatherClientFromEnv({})).toMatchObject({ provider: 'open-meteo', baseUrl: 'http://127.0.0.1:4010' });
    expect(weatherClientFromEnv({ FAKE_WEATHER_PORT: '4555' }).baseUrl).toBe('http://127.0.0.1:4555');
  });

  it('uses WEATHER_BASE_URL when set, and WEATHER_PROVIDER as the stored name', () => {
    const c = weatherClientFromEnv({ WEATHER_BASE_URL: 'https://api.open-meteo.com/', FAKE_WEATHER_PORT: '4555' });
    expect(c).toMatchObject({ provider: 'open-meteo', baseUrl: 'https://api.open-meteo.com' });
    expect(weatherClientFromEnv({ WEATHER_PROVIDER: 'sowcast-fake-weather' }).provider).toBe('sowcast-fake-weather');
  });

  it('says which setting is wrong', () => {
    expect(() => weatherClientFromEnv({ WEATHER_TIMEOUT_MS: 'soon' })).toThrow(/WEATHER_TIMEOUT_MS/);
    expect(() => weatherClientFromEnv({ WEATHER_RETRY_DELAY_MS: '-5' })).toThrow(/WEATHER_RETRY_DELAY_MS/);
    expect(() => weatherClientFromEnv({ FAKE_WEATHER_PORT: '70000' })).toThrow(/FAKE_WEATHER_PORT/);
    expect(() => weatherClientFromEnv({ WEATHER_BASE_URL: 'ftp://weather.example.test' })).toThrow(/http or https/);
    expect(() => weatherClientFromEnv({ WEATHER_BASE_URL: 'not a url' })).toThrow();
  });
});
