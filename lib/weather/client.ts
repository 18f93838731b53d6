// The one way Sowcast gets a forecast: a WeatherClient returning the engine's hourly Forecast. Chosen by
// environment only (see weatherClientFromEnv), so the worker and the web never know which server answers.
import type { Forecast } from '@/lib/schedule/types';
import { OpenMeteoClient } from './open-meteo';

export { WeatherError, type WeatherErrorKind } from './weather-error';
export { gridCell, gridCellKey, type GridCell } from './grid';

export interface ForecastQuery {
  latitude: number;
  longitude: number;
  /** The property's IANA zone; it becomes the Forecast's timeZone. */
  timeZone: string;
  /** First day asked for, YYYY-MM-DD (the property's local date). */
  startDate: string;
  /** 1–16: Open-Meteo forecasts at most 16 days ahead (Open-Meteo API documentation, forecast_days). */
  days: number;
}

export interface WeatherClient {
  /** Which API the forecast comes from, stored beside each forecast and shown in the weather panel. */
  readonly provider: string;
  /** Where that API is reached, for logs and the weather panel. */
  readonly baseUrl?: string;
  /** Throws WeatherError when no complete forecast can be had; never returns part of one. */
  fetchForecast(query: ForecastQuery, now: Date): Promise<Forecast>;
}

export const DEFAULT_FAKE_WEATHER_PORT = 4010;

/** process.env, or any plain map of the same settings (tests pass one without NODE_ENV). */
export type WeatherEnv = Readonly<Record<string, string | undefined>>;

function positiveInteger(env: WeatherEnv, name: string): number | undefined {
  const raw = env[name]?.trim();
  if (!raw) return undefined;
  const value = Number(raw);
  if (!Number.isInteger(value) || value <= 0) throw new Error(`${name} must be a whole number of milliseconds above 0, not ${JSON.stringify(raw)}.`);
  return value;
}

/**
 * WEATHER_BASE_URL (e.g. https://api.open-meteo.com) names the server; unset, the local stand-in at
 * http://127.0.0.1:${FAKE_WEATHER_PORT ?? 4010} answers. Both speak Open-Meteo's forecast API, so the provider is
 * 'open-meteo' either way and `baseUrl` tells them apart; WEATHER_PROVIDER renames it when a deployment wants the
 * stored forecasts to say more (e.g. 'sowcast-fake-weather' for the demo).
 * WEATHER_TIMEOUT_MS (default 10 000) bounds each attempt; WEATHER_RETRY_DELAY_MS (default 500) is the first
 * back-off, doubled for the next.
 */
export function weatherClientFromEnv(env: WeatherEnv = process.env): WeatherClient {
  let baseUrl = env.WEATHER_BASE_URL?.trim();
  if (!baseUrl) {
    const rawPort = env.FAKE_WEATHER_PORT?.trim() || String(DEFAULT_FAKE_WEATHER_PORT);
    const port = Number(rawPort);
    if (!Number.isInteger(port) || port < 1 || port > 65_535) {
      throw new Error(`FAKE_WEATHER_PORT must be a port number from 1 to 65535, not ${JSON.stringify(rawPort)}.`);
    }
    baseUrl = `http://127.0.0.1:${port}`;
  }
  return new OpenMeteoClient({
    baseUrl,
    provider: env.WEATHER_PROVIDER?.trim() || 'open-meteo',
    timeoutMs: positiveInteger(env, 'WEATHER_TIMEOUT_MS'),
    retryDelayMs: positiveInteger(env, 'WEATHER_RETRY_DELAY_MS'),
  });
}
