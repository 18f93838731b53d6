// Sunrise and sunset, for the rules that only allow work in daylight (spraying, burning).
// NOAA Global Monitoring Laboratory, "General Solar Position Calculations": the fractional year γ, the
// equation of time and the solar declination as Fourier series (after Spencer 1971), and the sunrise hour
// angle for a zenith of 90.833° (refraction plus the sun's semi-diameter). With a zenith of exactly 90°
// the day length is the geometric one of FAO-56 eq. 25/34.
import { dayNumber, dayOfYear, isLeapYear, zoneOffsetMs } from './local-dates';

const DEG = Math.PI / 180;
const MINUTE_MS = 60_000;
const DAY_MS = 86_400_000;

/** NOAA's sunrise/sunset zenith: 90° + 0.833° (34′ refraction at the horizon + 16′ semi-diameter). */
export const SUNRISE_ZENITH_DEG = 90.833;

function fractionalYear(date: string, utcHour: number): number {
  const year = Number(date.slice(0, 4));
  const days = isLeapYear(year) ? 366 : 365;
  return ((2 * Math.PI) / days) * (dayOfYear(date) - 1 + (utcHour - 12) / 24);
}

/** Equation of time, minutes (apparent − mean solar time). */
export function equationOfTimeMinutes(date: string, utcHour = 12): number {
  const g = fractionalYear(date, utcHour);
  return (
    229.18 *
    (0.000075 + 0.001868 * Math.cos(g) - 0.032077 * Math.sin(g) - 0.014615 * Math.cos(2 * g) - 0.040849 * Math.sin(2 * g))
  );
}

/** Solar declination, radians. */
export function solarDeclinationRad(date: string, utcHour = 12): number {
  const g = fractionalYear(date, utcHour);
  return (
    0.006918 -
    0.399912 * Math.cos(g) +
    0.070257 * Math.sin(g) -
    0.006758 * Math.cos(2 * g) +
    0.000907 * Math.sin(2 * g) -
    0.002697 * Math.cos(3 * g) +
    0.00148 * Math.sin(3 * g)
  );
}

export interface SunTimes {
  /** Instants (ms since epoch); null in polar night or midnight sun. */
  sunriseMs: number | null;
  sunsetMs: number | null;
  solarNoonMs: number;
  daylightHours: number;
  /** The longitude used: given, or the zone's standard meridian. */
  longitudeDeg: number;
  longitudeEstimated: boolean;
}

/** The meridian of the zone's standard (non-DST) time: 15° per hour of offset. */
export function standardMeridianDeg(timeZone: string, year: number): number {
  const jan = zoneOffsetMs(timeZone, Date.UTC(year, 0, 1));
  const jul = zoneOffsetMs(timeZone, Date.UTC(year, 6, 1));
  // DST adds to the offset in both hemispheres, so the smaller of the two is standard time.
  return (Math.min(jan, jul) / 3_600_000) * 15;
}

/** Sunrise, sunset and solar noon on a local date. */
export function sunTimes(
  date: string,
  latitudeDeg: number,
  longitudeDeg: number | null | undefined,
  timeZone: string,
  zenithDeg = SUNRISE_ZENITH_DEG,
): SunTimes {
  const estimated = longitudeDeg === null || longitudeDeg === undefined;
  const lon = estimated ? standardMeridianDeg(timeZone, Number(date.slice(0, 4))) : longitudeDeg;
  // Local noon is close to solar noon; evaluate the series there (UTC hour of local 12:00 by longitude).
  const utcHourAtNoon = 12 - lon / 15;
  const eqTime = equationOfTimeMinutes(date, utcHourAtNoon);
  const decl = solarDeclinationRad(date, utcHourAtNoon);
  const lat = latitudeDeg * DEG;
  const cosHa = Math.cos(zenithDeg * DEG) / (Math.cos(lat) * Math.cos(decl)) - Math.tan(lat) * Math.tan(decl);
  const midnightUtcMs = dayNumber(date) * DAY_MS;
  const solarNoonMinutes = 720 - 4 * lon - eqTime;
  const solarNoonMs = midnightUtcMs + solarNoonMinutes * MINUTE_MS;
  // The local date's solar noon can fall on the previous/next UTC day far from Greenwich; keep it on the
  // local date by checking it against the zone's midnight.
  const offset = zoneOffsetMs(timeZone, solarNoonMs);
  const localNoonDay = Math.floor((solarNoonMs + offset) / DAY_MS);
  const shift = (dayNumber(date) - localNoonDay) * DAY_MS;
  const noon = solarNoonMs + shift;
  if (cosHa > 1) return { sunriseMs: null, sunsetMs: null, solarNoonMs: noon, daylightHours: 0, longitudeDeg: lon, longitudeEstimated: estimated };
  if (cosHa < -1) return { sunriseMs: null, sunsetMs: null, solarNoonMs: noon, daylightHours: 24, longitudeDeg: lon, longitudeEstimated: estimated };
  const haDeg = Math.acos(cosHa) / DEG;
  return {
    sunriseMs: noon - 4 * haDeg * MINUTE_MS,
    sunsetMs: noon + 4 * haDeg * MINUTE_MS,
    solarNoonMs: noon,
    daylightHours: (8 * haDeg) / 60,
    longitudeDeg: lon,
    longitudeEstimated: estimated,
  };
}
