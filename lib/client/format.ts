// Fixed locale so the server's and the browser's rendering agree (no hydration mismatch).
const LOCALE = 'en-US';

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
export const MONTH_NAMES = [
  'January', 'February', 'March', 'April', 'May', 'June',
  'July', 'August', 'September', 'October', 'November', 'December',
];

const acresFormat = new Intl.NumberFormat(LOCALE, { maximumFractionDigits: 2 });
const decimalFormat = new Intl.NumberFormat(LOCALE, { maximumFractionDigits: 3 });

export const formatAcres = (acres: number) => `${acresFormat.format(acres)} ac`;
export const formatNumber = (value: number) => decimalFormat.format(value);

export function formatCoordinates(latitude: number, longitude: number): string {
  const lat = `${decimalFormat.format(Math.abs(latitude))}° ${latitude >= 0 ? 'N' : 'S'}`;
  const lon = `${decimalFormat.format(Math.abs(longitude))}° ${longitude >= 0 ? 'E' : 'W'}`;
  return `${lat}, ${lon}`;
}

/** 'MM-DD' (a day that recurs each year) → "Apr 2". */
export function formatMonthDay(value: string | null): string | null {
  if (!value) return null;
  const [month, day] = value.split('-').map(Number);
  if (!MONTHS[month - 1] || !day) return value;
  return `${MONTHS[month - 1]} ${day}`;
}

/**
 * 'YYYY-MM-DD' (a local calendar date) → "Sat, Sep 25, 2027". Formatted in UTC on purpose: the date has
 * no time of day, and reading it in the viewer's zone could show the day before.
 */
export function formatLocalDate(value: string | null): string | null {
  if (!value) return null;
  const [y, m, d] = value.split('-').map(Number);
  const date = new Date(Date.UTC(y, m - 1, d));
  if (Number.isNaN(date.getTime())) return value;
  return date.toLocaleDateString(LOCALE, { timeZone: 'UTC', weekday: 'short', month: 'short', day: 'numeric', year: 'numeric' });
}

/** An instant (ISO string) shown as a date in the viewer's own zone. */
export function formatInstantDate(iso: string): string {
  return new Date(iso).toLocaleDateString(LOCALE, { month: 'short', day: 'numeric', year: 'numeric' });
}
