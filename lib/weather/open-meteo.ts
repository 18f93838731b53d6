// A client for Open-Meteo's forecast API (GET /v1/forecast), as described by the Open-Meteo API documentation
// (https://open-meteo.com/en/docs): hourly variables, km/h, GMT with unix-second timestamps, a start and end
// date. Each answer is checked whole before it is turned into the engine's Forecast, so a broken or partial
// answer is refused instead of half-stored. Its only I/O is the `fetch` it is given.
import { z } from 'zod';
import type { Forecast, ForecastHour } from '@/lib/schedule/types';
import type { ForecastQuery, WeatherClient } from './client';
import { WeatherError } from './weather-error';

/** The hourly variables Sowcast reads, in the order they are asked for. */
export const OPEN_METEO_HOURLY = [
  'temperature_2m',
  'relative_humidity_2m',
  'precipitation',
  'precipitation_probability',
  'wind_speed_10m',
  'wind_gusts_10m',
  'soil_temperature_6cm',
] as const;
export type OpenMeteoHourlyVariable = (typeof OPEN_METEO_HOURLY)[number];

/** Units each variable must come in (Open-Meteo API documentation, "Hourly Parameter Definition"; km/h asked for). */
export const OPEN_METEO_UNITS: Record<OpenMeteoHourlyVariable, string> = {
  temperature_2m: '°C',
  relative_humidity_2m: '%',
  precipitation: 'mm',
  precipitation_probability: '%',
  wind_speed_10m: 'km/h',
  wind_gusts_10m: 'km/h',
  soil_temperature_6cm: '°C',
};

export const MAX_FORECAST_DAYS = 16; // Open-Meteo API documentation: forecast_days 0–16
export const DEFAULT_TIMEOUT_MS = 10_000;
export const DEFAULT_ATTEMPTS = 3;
export const DEFAULT_RETRY_DELAY_MS = 500;

const HOUR_S = 3600;
const DAY_MS = 86_400_000;
/** Open-Meteo sends null for hours past a model's reach at the end of a 16-day range (open-meteo/open-meteo
 * issues #71 and #1428). Up to one day of such a tail is cut off; more than that is a broken answer. */
const MAX_TRAILING_GAP_HOURS = 24;
/** The grid cell answering may lie "a few kilometers away" (Open-Meteo API documentation, JSON return object);
 * a whole degree off means the answer is for another place. */
const MAX_CELL_OFFSET_DEG = 1;

// Plausible bounds. Air: the WMO archive of weather and climate extremes (−89.2 °C at Vostok, 56.7 °C in Death
// Valley, from memory), with a margin. Soil near the surface runs hotter than air in sun: common practice, no
// source. Hourly rain: the record hour is around 300 mm (from memory); gusts: the record gust is 408 km/h (WMO).
const bounds = {
  airC: [-95, 65],
  soilC: [-70, 85],
  humidityPct: [0, 100],
  rainMm: [0, 500],
  probabilityPct: [0, 100],
  windKmh: [0, 500],
} as const;

const DATE_RE = /^(\d{4})-(\d{2})-(\d{2})$/;

function dateToUtcMs(date: string): number | null {
  const m = DATE_RE.exec(date);
  if (!m) return null;
  const ms = Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3]));
  return new Date(ms).toISOString().slice(0, 10) === date ? ms : null;
}

function isTimeZone(timeZone: string): boolean {
  try {
    new Intl.DateTimeFormat('en-US', { timeZone });
    return true;
  } catch {
    return false;
  }
}

/** A bad query is the caller's mistake, not the provider's: RangeError, so it is never taken for an outage. */
export function checkForecastQuery(query: ForecastQuery): void {
  const problems: string[] = [];
  const num = (x: unknown): x is number => typeof x === 'number' && Number.isFinite(x);
  if (!num(query?.latitude) || query.latitude < -90 || query.latitude > 90) problems.push('latitude must be between −90 and 90 degrees');
  if (!num(query?.longitude) || query.longitude < -180 || query.longitude > 180) problems.push('longitude must be between −180 and 180 degrees');
  if (typeof query?.timeZone !== 'string' || !isTimeZone(query.timeZone)) problems.push(`unknown time zone ${JSON.stringify(query?.timeZone)}`);
  if (typeof query?.startDate !== 'string' || dateToUtcMs(query.startDate) === null) problems.push(`start date ${JSON.stringify(query?.startDate)} is not a date (YYYY-MM-DD)`);
  if (!Number.isInteger(query?.days) || query.days < 1 || query.days > MAX_FORECAST_DAYS) problems.push(`days must be a whole number from 1 to ${MAX_FORECAST_DAYS}`);
  if (problems.length) throw new RangeError(`Cannot ask for this forecast: ${problems.join('; ')}.`);
}

function addDays(date: string, days: number): string {
  return new Date((dateToUtcMs(date) as number) + days * DAY_MS).toISOString().slice(0, 10);
}

function coordinate(value: number): string {
  return String(Number(value.toFixed(4))); // 4 decimals ≈ 11 m, finer than any model grid
}

/**
 * The request. timezone=GMT with unix seconds gives unambiguous instants (Open-Meteo API documentation:
 * "all timestamp are in GMT+0"), so start_date/end_date name UTC days carrying the property's local dates.
 * West of Greenwich that covers a few evening hours of the day before and leaves the last local evening out;
 * the engine's `forecastThrough` (last local date covered in full) already accounts for it.
 */
export function forecastRequestUrl(baseUrl: string, query: ForecastQuery): URL {
  const url = new URL(`${baseUrl.replace(/\/+$/, '')}/v1/forecast`);
  const p = url.searchParams;
  p.set('latitude', coordinate(query.latitude));
  p.set('longitude', coordinate(query.longitude));
  p.set('hourly', OPEN_METEO_HOURLY.join(','));
  p.set('wind_speed_unit', 'kmh');
  p.set('timezone', 'GMT');
  p.set('timeformat', 'unixtime');
  p.set('start_date', query.startDate);
  p.set('end_date', addDays(query.startDate, query.days - 1));
  return url;
}

const values = (min: number, max: number) => z.array(z.number().min(min).max(max).nullable());

/** The whole answer, as the Open-Meteo API documentation describes it ("JSON Return Object"). */
export const openMeteoForecastSchema = z.object({
  latitude: z.number().min(-90).max(90),
  longitude: z.number().min(-180).max(180),
  generationtime_ms: z.number().nonnegative(),
  utc_offset_seconds: z.literal(0), // we ask for GMT
  timezone: z.string(),
  timezone_abbreviation: z.string(),
  elevation: z.number().nullable().optional(),
  hourly_units: z.object(
    Object.fromEntries(OPEN_METEO_HOURLY.map((v) => [v, z.literal(OPEN_METEO_UNITS[v])])) as {
      [K in OpenMeteoHourlyVariable]: z.ZodLiteral<string>;
    },
  ),
  hourly: z.object({
    time: z.array(z.number().int()),
    temperature_2m: values(...bounds.airC),
    relative_humidity_2m: values(...bounds.humidityPct),
    precipitation: values(...bounds.rainMm),
    precipitation_probability: values(...bounds.probabilityPct),
    wind_speed_10m: values(...bounds.windKmh),
    wind_gusts_10m: values(...bounds.windKmh),
    soil_temperature_6cm: values(...bounds.soilC),
  }),
});
export type OpenMeteoForecastAnswer = z.infer<typeof openMeteoForecastSchema>;

/** Variables without which an hour means nothing to the engine; the others may be null (the provider's gaps). */
const REQUIRED: OpenMeteoHourlyVariable[] = ['temperature_2m', 'relative_humidity_2m', 'precipitation', 'wind_speed_10m'];

function invalid(message: string): WeatherError {
  return new WeatherError('invalid', `The forecast answer was refused: ${message}`);
}

function isoInstant(unixSeconds: number): string {
  return new Date(unixSeconds * 1000).toISOString().replace('.000Z', 'Z');
}

function longitudeGap(a: number, b: number): number {
  const d = Math.abs(a - b) % 360;
  return d > 180 ? 360 - d : d;
}

/**
 * Checks an answer (already JSON-parsed) against the query and turns it into the engine's Forecast.
 * `precipitation` is the "sum of the preceding hour" (Open-Meteo API documentation), which is exactly the
 * engine's rainMm convention (rain in the hour ending at `time`), so values are taken as they are. It is total
 * precipitation, snow as water included (same table): for a seedbed, melted snow wets it too.
 */
export function parseOpenMeteoForecast(body: unknown, query: ForecastQuery, now: Date): Forecast {
  const parsed = openMeteoForecastSchema.safeParse(body);
  if (!parsed.success) {
    const first = parsed.error.issues[0];
    const where = first?.path.length ? first.path.join('.') : 'answer';
    throw invalid(`${where}: ${first?.message ?? 'not the expected shape'}${parsed.error.issues.length > 1 ? ` (and ${parsed.error.issues.length - 1} more problems)` : ''}.`);
  }
  const answer = parsed.data;
  const { time } = answer.hourly;
  const expectedHours = query.days * 24;
  const expectedStart = (dateToUtcMs(query.startDate) as number) / 1000;

  for (const variable of OPEN_METEO_HOURLY) {
    const length = answer.hourly[variable].length;
    if (length !== time.length) throw invalid(`hourly.${variable} has ${length} values for ${time.length} hours.`);
  }
  if (time.length !== expectedHours) throw invalid(`${time.length} hours instead of the ${expectedHours} asked for.`);
  if (time[0] !== expectedStart) throw invalid(`it starts at ${isoInstant(time[0])}, not at ${isoInstant(expectedStart)}.`);
  for (let i = 1; i < time.length; i++) {
    if (time[i] - time[i - 1] !== HOUR_S) throw invalid(`hours are not one hour apart at ${isoInstant(time[i - 1])}.`);
  }
  if (Math.abs(answer.latitude - query.latitude) > MAX_CELL_OFFSET_DEG || longitudeGap(answer.longitude, query.longitude) > MAX_CELL_OFFSET_DEG) {
    throw invalid(`it is for ${answer.latitude}, ${answer.longitude}, not near ${query.latitude}, ${query.longitude}.`);
  }

  // A required variable may only be missing at the very end (past the models' reach); a gap inside is an error.
  let kept = time.length;
  for (const variable of REQUIRED) {
    const series = answer.hourly[variable];
    let firstTrailingNull = series.length;
    while (firstTrailingNull > 0 && series[firstTrailingNull - 1] === null) firstTrailingNull--;
    const gap = series.slice(0, firstTrailingNull).indexOf(null);
    if (gap !== -1) throw invalid(`hourly.${variable} is missing at ${isoInstant(time[gap])}.`);
    kept = Math.min(kept, firstTrailingNull);
  }
  // Never more than a day, and never most of a short range: what is left must still be the forecast asked for.
  if (time.length - kept > Math.min(MAX_TRAILING_GAP_HOURS, Math.floor(time.length / 2))) {
    throw invalid(`values stop ${time.length - kept} hours before the end of the range asked for.`);
  }

  const h = answer.hourly;
  const hours: ForecastHour[] = [];
  for (let i = 0; i < kept; i++) {
    hours.push({
      time: isoInstant(time[i]),
      rainMm: h.precipitation[i] as number,
      rainProbabilityPct: h.precipitation_probability[i],
      airTempC: h.temperature_2m[i] as number,
      relativeHumidityPct: h.relative_humidity_2m[i] as number,
      windKmh: h.wind_speed_10m[i] as number,
      windGustKmh: h.wind_gusts_10m[i],
      soilTempC: h.soil_temperature_6cm[i],
    });
  }
  return { timeZone: query.timeZone, fetchedAt: now.toISOString(), hours };
}

export interface OpenMeteoOptions {
  baseUrl: string;
  provider?: string;
  /** Per attempt, including reading the body. */
  timeoutMs?: number;
  attempts?: number;
  /** First back-off; each later one doubles. */
  retryDelayMs?: number;
  fetch?: typeof fetch;
  sleep?: (ms: number) => Promise<void>;
}

const defaultSleep = (ms: number) => new Promise<void>((resolve) => setTimeout(resolve, ms));

/** Network trouble, timeouts and 5xx may pass; 4xx (our request, or a rate limit) and nonsense will not. */
function worthRetrying(error: WeatherError): boolean {
  if (error.kind === 'network' || error.kind === 'timeout') return true;
  return error.kind === 'http' && (error.status ?? 0) >= 500;
}

function providerReason(text: string): string | null {
  try {
    const body = JSON.parse(text) as { reason?: unknown };
    return typeof body?.reason === 'string' ? body.reason : null;
  } catch {
    return null;
  }
}

export class OpenMeteoClient implements WeatherClient {
  readonly provider: string;
  readonly baseUrl: string;
  private readonly timeoutMs: number;
  private readonly attempts: number;
  private readonly retryDelayMs: number;
  private readonly fetchImpl: typeof fetch;
  private readonly sleep: (ms: number) => Promise<void>;

  constructor(options: OpenMeteoOptions) {
    const base = new URL(options.baseUrl); // throws on a malformed WEATHER_BASE_URL, at start-up rather than at the first refresh
    if (base.protocol !== 'http:' && base.protocol !== 'https:') throw new Error(`The weather base URL must be http or https, not ${options.baseUrl}.`);
    this.baseUrl = options.baseUrl.replace(/\/+$/, '');
    this.provider = options.provider ?? 'open-meteo';
    this.timeoutMs = options.timeoutMs ?? DEFAULT_TIMEOUT_MS;
    this.attempts = Math.max(1, options.attempts ?? DEFAULT_ATTEMPTS);
    this.retryDelayMs = options.retryDelayMs ?? DEFAULT_RETRY_DELAY_MS;
    this.fetchImpl = options.fetch ?? ((input, init) => fetch(input, init));
    this.sleep = options.sleep ?? defaultSleep;
  }

  async fetchForecast(query: ForecastQuery, now: Date): Promise<Forecast> {
    checkForecastQuery(query);
    const url = forecastRequestUrl(this.baseUrl, query);
    let last: WeatherError | null = null;
    let attempt = 0;
    while (attempt < this.attempts) {
      attempt++;
      if (attempt > 1) await this.sleep(this.retryDelayMs * 2 ** (attempt - 2));
      try {
        const body = await this.getJson(url);
        return parseOpenMeteoForecast(body, query, now);
      } catch (error) {
        if (!(error instanceof WeatherError)) throw error;
        last = error;
        if (!worthRetrying(error)) break;
      }
    }
    const error = last as WeatherError;
    const tries = attempt === 1 ? '1 attempt' : `${attempt} attempts`;
    throw new WeatherError(error.kind, `${error.message} (${this.provider} at ${url.host}; ${tries})`, {
      status: error.status,
      attempts: attempt,
      cause: error,
    });
  }

  /** One attempt: the answer parsed as JSON, or a WeatherError saying what went wrong. */
  private async getJson(url: URL): Promise<unknown> {
    const controller = new AbortController();
    let timedOut = false;
    const timer = setTimeout(() => {
      timedOut = true;
      controller.abort();
    }, this.timeoutMs);
    try {
      let response: Response;
      let text: string;
      try {
        response = await this.fetchImpl(url, { signal: controller.signal, headers: { accept: 'application/json' } });
        text = await response.text();
      } catch (error) {
        if (timedOut) throw new WeatherError('timeout', `No forecast answer within ${this.timeoutMs} ms.`, { cause: error });
        throw new WeatherError('network', `The forecast server could not be reached: ${describe(error)}.`, { cause: error });
      }
      if (!response.ok) {
        const reason = providerReason(text);
        throw new WeatherError('http', `The forecast server answered HTTP ${response.status}${reason ? `: ${reason}` : ''}.`, { status: response.status });
      }
      try {
        return JSON.parse(text);
      } catch (error) {
        throw new WeatherError('invalid', 'The forecast answer was refused: it is not JSON.', { cause: error });
      }
    } finally {
      clearTimeout(timer);
    }
  }
}

function describe(error: unknown): string {
  const e = error as { message?: string; cause?: { code?: string; message?: string } };
  return e?.cause?.code ?? e?.cause?.message ?? e?.message ?? String(error);
}

export function createOpenMeteoClient(options: OpenMeteoOptions): OpenMeteoClient {
  return new OpenMeteoClient(options);
}
