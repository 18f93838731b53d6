// Seed-zone soil temperature per local day. Seeding rules compare it with each species' germination minimum, so a
// day must be the property's calendar day (IANA zone), not a UTC day.
import { fromDayNumber, isKnownTimeZone, offsetsForSortedInstants } from '@/lib/schedule/local-dates';

export interface HourlyTemp {
  /** ISO instant. */
  time: string;
  airTempC: number;
  soilTempC?: number | null;
}

export interface DailySoilTemperature {
  /** YYYY-MM-DD in the property's zone. */
  date: string;
  soilTempC: number;
  source: 'forecast' | 'estimated';
  /** Mean of the day's hourly air temperatures. */
  airTempC: number;
  hourCount: number;
}

export interface SoilTemperatureOptions {
  /** Days in the running mean of air temperature; 11 in the method below. */
  windowDays?: number;
  /** Share of a day's hours that must carry a forecast soil temperature for the forecast to be used. */
  forecastHourShare?: number;
}

/**
 * Estimate method: soil temperature near 10 cm is taken as a running weighted mean of daily mean air temperature
 * over the last 11 days, weights rising linearly from 1 (oldest) to 11 (the day itself); with fewer days known,
 * the same weighting over the days there are. This is the Biome-BGC 4.x scheme (P. E. Thornton, University of
 * Montana, daymet.c/metarr.c: "an 11-day running weighted average of daily average temperature is used as the soil
 * temperature at 10 cm … tail … weighted linearly from 1 to 11"), which goes back to Zheng, Hunt & Running (1993),
 * Climate Research 2:183–191 — that attribution and the paper's own parameters are from memory. No snow or
 * canopy correction. The running mean both lags and damps air temperature, as soil does.
 */
export const SOIL_ESTIMATE_METHOD =
  'running mean of daily mean air temperature, 11 days weighted 1…11 (Biome-BGC 4.x after Zheng, Hunt & Running 1993)';

const DEFAULT_WINDOW_DAYS = 11;
// "Most hours": a forecast missing a few hours still describes the day; one missing most of them does not.
const DEFAULT_FORECAST_HOUR_SHARE = 0.75;

/** dailyMeanAirC: oldest first, the day being estimated last. */
export function estimateSoilTempC(dailyMeanAirC: number[], windowDays: number = DEFAULT_WINDOW_DAYS): number {
  if (!Array.isArray(dailyMeanAirC) || dailyMeanAirC.length === 0) {
    throw new RangeError('Estimating soil temperature needs at least one day of air temperature.');
  }
  if (!Number.isInteger(windowDays) || windowDays < 1) {
    throw new RangeError(`The running-mean window must be a whole number of days, 1 or more (got ${windowDays}).`);
  }
  const recent = dailyMeanAirC.slice(-windowDays);
  let weighted = 0;
  let weights = 0;
  recent.forEach((tempC, index) => {
    if (!Number.isFinite(tempC)) throw new RangeError(`Air temperature must be a number (got ${tempC}).`);
    const weight = index + 1;
    weighted += tempC * weight;
    weights += weight;
  });
  return weighted / weights;
}

const DAY_MS = 86_400_000;

function assertTimeZone(timeZone: string): void {
  if (!isKnownTimeZone(timeZone)) {
    throw new RangeError(`Unknown time zone "${timeZone}"; use an IANA name such as America/Chicago.`);
  }
}

/**
 * Local dates ('YYYY-MM-DD') of sorted instants in a zone. The zone's offset changes only at its transitions,
 * so it is looked up a handful of times per forecast (offsetsForSortedInstants bisects between them) rather
 * than formatted through Intl for each of 384 hours; the date is then the civil day of instant + offset.
 */
export function localDatesOfSortedInstants(timeZone: string, instantsMs: readonly number[]): string[] {
  const offsets = offsetsForSortedInstants(timeZone, instantsMs);
  return instantsMs.map((ms, i) => fromDayNumber(Math.floor((ms + offsets[i]) / DAY_MS)));
}

export function dailySoilTemperatures(
  hours: HourlyTemp[],
  timeZone: string,
  options: SoilTemperatureOptions = {},
): DailySoilTemperature[] {
  assertTimeZone(timeZone);
  const windowDays = options.windowDays ?? DEFAULT_WINDOW_DAYS;
  const forecastHourShare = options.forecastHourShare ?? DEFAULT_FORECAST_HOUR_SHARE;
  if (!(forecastHourShare > 0 && forecastHourShare <= 1)) {
    throw new RangeError(`forecastHourShare must be more than 0 and at most 1 (got ${forecastHourShare}).`);
  }

  const byDate = new Map<string, { air: number[]; soil: number[] }>();
  const stamped = hours.map((hour) => {
    const instant = new Date(hour.time);
    if (Number.isNaN(instant.getTime())) throw new RangeError(`"${hour.time}" is not an ISO date-time.`);
    if (!Number.isFinite(hour.airTempC)) {
      throw new RangeError(`Air temperature at ${hour.time} must be a number (got ${hour.airTempC}).`);
    }
    return { hour, instantMs: instant.getTime() };
  });
  stamped.sort((a, b) => a.instantMs - b.instantMs);
  const dates = localDatesOfSortedInstants(timeZone, stamped.map((s) => s.instantMs));
  for (const [i, { hour }] of stamped.entries()) {
    const date = dates[i];
    let day = byDate.get(date);
    if (!day) {
      day = { air: [], soil: [] };
      byDate.set(date, day);
    }
    day.air.push(hour.airTempC);
    if (typeof hour.soilTempC === 'number' && Number.isFinite(hour.soilTempC)) day.soil.push(hour.soilTempC);
  }

  const mean = (values: number[]) => values.reduce((sum, x) => sum + x, 0) / values.length;
  const airMeans: number[] = [];
  const result: DailySoilTemperature[] = [];
  for (const [date, day] of [...byDate.entries()].sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0))) {
    const airTempC = mean(day.air);
    airMeans.push(airTempC);
    const forecastCovers = day.soil.length >= forecastHourShare * day.air.length;
    result.push(
      forecastCovers
        ? { date, soilTempC: mean(day.soil), source: 'forecast', airTempC, hourCount: day.air.length }
        : {
            date,
            soilTempC: estimateSoilTempC(airMeans, windowDays),
            source: 'estimated',
            airTempC,
            hourCount: day.air.length,
          },
    );
  }
  return result;
}
