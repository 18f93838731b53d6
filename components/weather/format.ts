// How the weather panel writes numbers: US customary first (people read rain gauges in inches, thermometers in
// °F, wind in mph), metric beside it where a provider's own number helps. Conversions go through the one units
// module.
import { cToF, kmhToMph, mmToIn } from '@/lib/agronomy/units';

const LOCALE = 'en-US';
const fixed = (digits: number) => new Intl.NumberFormat(LOCALE, { minimumFractionDigits: digits, maximumFractionDigits: digits });
const twoDigits = fixed(2);
const oneDigit = fixed(1);

/** Rain: hundredths of an inch, as a rain gauge reads; a trace below that is said as such. */
export function rainInches(mm: number): string {
  if (mm <= 0) return '0 in';
  const inches = mmToIn(mm);
  return inches < 0.005 ? 'trace' : `${twoDigits.format(inches)} in`;
}

export function rainMillimetres(mm: number): string {
  return mm <= 0 ? '0 mm' : `${oneDigit.format(mm)} mm`;
}

export const fahrenheit = (tempC: number) => Math.round(cToF(tempC));
export const celsius = (tempC: number) => Math.round(tempC);
export const mph = (kmh: number) => Math.round(kmhToMph(kmh));

/** "3 h ago", measured against the server's clock so a test clock or a skewed phone shows the same. */
export function ago(fromIso: string, nowIso: string): string {
  const minutes = Math.max(0, Math.round((Date.parse(nowIso) - Date.parse(fromIso)) / 60_000));
  if (minutes < 1) return 'just now';
  if (minutes < 60) return `${minutes} min ago`;
  const hours = Math.round(minutes / 60);
  if (hours < 48) return `${hours} h ago`;
  return `${Math.round(hours / 24)} days ago`;
}

/** An instant in the property's zone: "Thu, Dec 3, 9:04 AM CST". */
export function instantInZone(iso: string, timeZone: string): string {
  return new Date(iso).toLocaleString(LOCALE, {
    timeZone,
    weekday: 'short',
    month: 'short',
    day: 'numeric',
    hour: 'numeric',
    minute: '2-digit',
    timeZoneName: 'short',
  });
}

const WEEKDAYS = ['Sun', 'Mon', 'Tue', 'Wed', 'Thu', 'Fri', 'Sat'];
const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** A local date of the property as a row label: weekday and day; it already is the property's date. */
export function dayLabel(date: string): { weekday: string; day: string } {
  const [y, m, d] = date.split('-').map(Number);
  const utc = new Date(Date.UTC(y, m - 1, d));
  return { weekday: WEEKDAYS[utc.getUTCDay()], day: `${MONTHS[m - 1]} ${d}` };
}
