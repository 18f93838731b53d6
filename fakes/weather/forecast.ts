// GET /v1/forecast of the stand-in: the request and answer of Open-Meteo's forecast API (Open-Meteo API
// documentation, https://open-meteo.com/en/docs) for the variables Sowcast reads, with invented numbers.
// Only what Sowcast asks is served: one location, hourly variables, GMT, unix seconds, a start and end
// date. Anything else gets a 400 {error:true, reason} like the real API's, so a drifting client is noticed.
import { applyEvents, LocalDates, type ControlEvent, type HourValues } from './events';
import { cellOf, InventedSeason, relativeHumidityPct, soilTemperatures } from './season';

const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;
/** Soil needs the air of the days before the first hour asked for; 5 days makes the start value irrelevant. */
const WARM_UP_HOURS = 120;
/** The last asked date is finished for any zone (UTC−12…+14), so a cold snap there sees its whole date. */
const TAIL_HOURS = 36;
const MAX_DAYS = 16;

export const HOURLY_UNITS = {
  temperature_2m: '°C',
  relative_humidity_2m: '%',
  precipitation: 'mm',
  precipitation_probability: '%',
  wind_speed_10m: 'km/h',
  wind_gusts_10m: 'km/h',
  soil_temperature_6cm: '°C',
} as const;
export type HourlyVariable = keyof typeof HOURLY_UNITS;

const SUPPORTED = new Set(['latitude', 'longitude', 'hourly', 'wind_speed_unit', 'temperature_unit', 'precipitation_unit', 'timezone', 'timeformat', 'start_date', 'end_date']);

export class BadRequest extends Error {}

export interface ForecastRequest {
  latitude: number;
  longitude: number;
  hourly: HourlyVariable[];
  timezone: 'GMT' | 'UTC';
  startDate: string;
  endDate: string;
}

function single(params: URLSearchParams, name: string): string | null {
  const all = params.getAll(name);
  if (all.length > 1) throw new BadRequest(`Parameter '${name}' is given ${all.length} times.`);
  return all[0] ?? null;
}

function dateMs(value: string | null, name: string): number {
  if (value === null) throw new BadRequest(`Parameter '${name}' is required by this stand-in (it has no notion of today, so forecast_days cannot be used).`);
  const ms = /^\d{4}-\d{2}-\d{2}$/.test(value) ? Date.parse(`${value}T00:00:00Z`) : NaN;
  if (Number.isNaN(ms) || new Date(ms).toISOString().slice(0, 10) !== value) throw new BadRequest(`Parameter '${name}' must be a date (yyyy-mm-dd), not '${value}'.`);
  return ms;
}

function degrees(value: string | null, name: string, limit: number): number {
  if (value === null) throw new BadRequest(`Parameter '${name}' is required.`);
  if (value.includes(',')) throw new BadRequest('This stand-in answers one location per request.');
  const n = Number(value);
  if (value.trim() === '' || !Number.isFinite(n)) throw new BadRequest(`Parameter '${name}' must be a number, not '${value}'.`);
  if (Math.abs(n) > limit) throw new BadRequest(`${name === 'latitude' ? 'Latitude' : 'Longitude'} must be in range of -${limit} to ${limit}°. Given: ${n}.`);
  return n;
}

export function parseForecastRequest(params: URLSearchParams): ForecastRequest {
  for (const name of new Set(params.keys())) {
    if (!SUPPORTED.has(name)) throw new BadRequest(`Parameter '${name}' is not supported by this stand-in.`);
  }
  const latitude = degrees(single(params, 'latitude'), 'latitude', 90);
  const longitude = degrees(single(params, 'longitude'), 'longitude', 180);

  const hourly = params
    .getAll('hourly')
    .flatMap((v) => v.split(','))
    .map((v) => v.trim())
    .filter(Boolean);
  if (!hourly.length) throw new BadRequest("Parameter 'hourly' is required by this stand-in.");
  for (const v of hourly) {
    if (!(v in HOURLY_UNITS)) throw new BadRequest(`Hourly variable '${v}' is not known to this stand-in; it serves ${Object.keys(HOURLY_UNITS).join(', ')}.`);
  }
  const fixed: [string, string[], string][] = [
    ['wind_speed_unit', ['kmh'], 'kmh'],
    ['temperature_unit', ['celsius'], 'celsius'],
    ['precipitation_unit', ['mm'], 'mm'],
    ['timeformat', ['unixtime'], 'unixtime'],
    ['timezone', ['GMT', 'UTC'], 'GMT'],
  ];
  const chosen: Record<string, string> = {};
  for (const [name, allowed, fallback] of fixed) {
    const value = single(params, name) ?? (name === 'timeformat' ? null : fallback);
    if (value === null) throw new BadRequest("Parameter 'timeformat=unixtime' is required by this stand-in.");
    if (!allowed.includes(value)) throw new BadRequest(`Parameter '${name}=${value}' is not supported by this stand-in; use ${allowed.join(' or ')}.`);
    chosen[name] = value;
  }
  const startDate = single(params, 'start_date');
  const endDate = single(params, 'end_date');
  const startMs = dateMs(startDate, 'start_date');
  const endMs = dateMs(endDate, 'end_date');
  if (endMs < startMs) throw new BadRequest(`End-date must be larger or equals than start-date (${endDate} < ${startDate}).`);
  const days = (endMs - startMs) / DAY_MS + 1;
  if (days > MAX_DAYS) throw new BadRequest(`At most ${MAX_DAYS} days per request; ${startDate} to ${endDate} is ${days}.`);
  return {
    latitude,
    longitude,
    hourly: [...new Set(hourly)] as HourlyVariable[],
    timezone: chosen.timezone as 'GMT' | 'UTC',
    startDate: startDate as string,
    endDate: endDate as string,
  };
}

const round1 = (x: number) => Math.round(x * 10) / 10 || 0;

export interface ForecastAnswer {
  latitude: number;
  longitude: number;
  generationtime_ms: number;
  utc_offset_seconds: number;
  timezone: string;
  timezone_abbreviation: string;
  elevation: number;
  hourly_units: Record<string, string>;
  hourly: Record<string, number[]>;
}

/** The answer for a request: invented season, then the events of the request's cell, then soil, then rounding. */
export function forecastAnswer(request: ForecastRequest, events: readonly ControlEvent[], generationMs = 0): ForecastAnswer {
  const cell = cellOf(request.latitude, request.longitude);
  const season = new InventedSeason(cell);
  const firstMs = Date.parse(`${request.startDate}T00:00:00Z`);
  const count = ((Date.parse(`${request.endDate}T00:00:00Z`) - firstMs) / DAY_MS + 1) * 24;
  const fromMs = firstMs - WARM_UP_HOURS * HOUR_MS;
  const total = WARM_UP_HOURS + count + TAIL_HOURS;

  const hours: HourValues[] = [];
  const winds: { windKmh: number; windGustKmh: number }[] = []; // events leave wind alone
  for (let i = 0; i < total; i++) {
    const stampMs = fromMs + i * HOUR_MS;
    const h = season.hour(stampMs);
    winds.push(h);
    hours.push({
      stampMs,
      airTempC: h.airTempC,
      dewPointC: h.dewPointC,
      rainTenths: Math.round(h.rainMm * 10),
      rainProbabilityPct: h.rainProbabilityPct,
      humidityFloorPct: null,
      humidityFactor: 1,
    });
  }
  applyEvents(
    hours,
    events.filter((e) => e.cell === cell.key),
    new LocalDates(),
  );
  const soil = soilTemperatures(hours.map((h) => h.airTempC));

  const slice = { from: WARM_UP_HOURS, to: WARM_UP_HOURS + count };
  const series: Record<HourlyVariable, number[]> = {
    temperature_2m: [],
    relative_humidity_2m: [],
    precipitation: [],
    precipitation_probability: [],
    wind_speed_10m: [],
    wind_gusts_10m: [],
    soil_temperature_6cm: [],
  };
  const time: number[] = [];
  for (let i = slice.from; i < slice.to; i++) {
    const h = hours[i];
    let rh = relativeHumidityPct(h.airTempC, h.dewPointC) * h.humidityFactor;
    if (h.humidityFloorPct !== null) rh = Math.max(rh, h.humidityFloorPct);
    time.push(h.stampMs / 1000);
    series.temperature_2m.push(round1(h.airTempC));
    series.relative_humidity_2m.push(Math.round(Math.min(100, rh)));
    series.precipitation.push(h.rainTenths / 10);
    series.precipitation_probability.push(Math.round(h.rainProbabilityPct));
    series.wind_speed_10m.push(round1(winds[i].windKmh));
    series.wind_gusts_10m.push(round1(winds[i].windGustKmh));
    series.soil_temperature_6cm.push(round1(soil[i]));
  }

  const hourly: Record<string, number[]> = { time };
  const hourlyUnits: Record<string, string> = { time: 'unixtime' };
  for (const v of request.hourly) {
    hourly[v] = series[v];
    hourlyUnits[v] = HOURLY_UNITS[v];
  }
  return {
    latitude: cell.latitude,
    longitude: cell.longitude,
    generationtime_ms: generationMs,
    utc_offset_seconds: 0,
    timezone: request.timezone,
    timezone_abbreviation: request.timezone,
    elevation: season.elevationM(),
    hourly_units: hourlyUnits,
    hourly,
  };
}
