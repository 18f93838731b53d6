// The invented weather of the stand-in: a plausible season for any place and hour, computed from the
// place's 0.1° cell and the instant alone, so the same question always gets the same answer and nothing is
// random at run time. None of it is observed weather; the shapes are textbook outlines, named where used.
const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;
/** Mean Gregorian year, so the seasons do not drift over the years. */
const YEAR_DAYS = 365.2425;

export interface Cell {
  key: string; // '41.9,-87.6'
  latitude: number; // the cell centre, returned as the answer's latitude like a model grid point
  longitude: number;
}

export function cellOf(latitude: number, longitude: number): Cell {
  const snap = (v: number) => {
    const s = Math.round(v * 10) / 10;
    return s === 0 ? 0 : s;
  };
  const lat = snap(latitude);
  let lon = snap(((((longitude + 180) % 360) + 360) % 360) - 180);
  if (lon >= 180) lon = -180;
  return { key: `${lat.toFixed(1)},${lon.toFixed(1)}`, latitude: lat, longitude: lon };
}

/** FNV-1a over the parts, finished with MurmurHash3's fmix32 so neighbouring days differ well: [0, 1). */
export function unitHash(...parts: (string | number)[]): number {
  let h = 0x811c9dc5;
  const text = parts.join('|');
  for (let i = 0; i < text.length; i++) h = Math.imul(h ^ text.charCodeAt(i), 0x01000193);
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b);
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35);
  h ^= h >>> 16;
  return (h >>> 0) / 4_294_967_296;
}

export interface InventedRain {
  startMs: number; // on a whole UTC hour
  hours: number;
  /** Tenths of a millimetre per hour, so the total is exact to the 0.1 mm Open-Meteo reports. */
  tenthsPerHour: number[];
}

/** Exact split of `totalTenths` over `hours`, heavier in the middle (a shower builds and fades). */
export function spreadTenths(totalTenths: number, hours: number): number[] {
  const weights = Array.from({ length: hours }, (_, k) => 1 + Math.min(k, hours - 1 - k));
  const sum = weights.reduce((a, b) => a + b, 0);
  const raw = weights.map((w) => (totalTenths * w) / sum);
  const out = raw.map(Math.floor);
  let left = totalTenths - out.reduce((a, b) => a + b, 0);
  const order = raw.map((r, k) => [r - Math.floor(r), k] as const).sort((a, b) => b[0] - a[0] || a[1] - b[1]);
  for (const [, k] of order) {
    if (left <= 0) break;
    out[k]++;
    left--;
  }
  return out;
}

export interface InventedHour {
  airTempC: number;
  dewPointC: number;
  rainMm: number; // in the hour ending at the stamp
  rainProbabilityPct: number;
  windKmh: number;
  windGustKmh: number;
}

/** Saturation vapour pressure, hPa (Magnus form with Alduchov & Eskridge 1996 constants). */
export function saturationVapourPressureHpa(tempC: number): number {
  return 6.1094 * Math.exp((17.625 * tempC) / (tempC + 243.04));
}

export function relativeHumidityPct(tempC: number, dewPointC: number): number {
  const rh = (100 * saturationVapourPressureHpa(Math.min(dewPointC, tempC))) / saturationVapourPressureHpa(tempC);
  return Math.max(5, Math.min(100, rh));
}

/**
 * One place's invented weather. Day-level quantities (warm or cool spell, rainy day, wind) are hashed per
 * solar day and blended smoothly between day centres, so nothing jumps at midnight.
 */
export class InventedSeason {
  private readonly rainByDay = new Map<number, InventedRain | null>();
  private readonly solarOffsetMs: number;

  constructor(readonly cell: Cell) {
    // Local solar time runs 4 minutes per degree of longitude ahead of UTC.
    this.solarOffsetMs = (cell.longitude / 360) * DAY_MS;
  }

  /** Solar day number (days since 1970-01-01 at the cell's solar midnight), with a fraction. */
  private solarDay(ms: number): number {
    return (ms + this.solarOffsetMs) / DAY_MS;
  }

  /** A smooth value in [−1, 1] for a named quantity, from one hash per solar day blended between day centres. */
  private smooth(name: string, ms: number): number {
    const x = this.solarDay(ms) - 0.5;
    const n = Math.floor(x);
    const t = x - n;
    const a = 2 * unitHash(this.cell.key, name, n) - 1;
    const b = 2 * unitHash(this.cell.key, name, n + 1) - 1;
    const blend = (1 - Math.cos(Math.PI * t)) / 2;
    return a + (b - a) * blend;
  }

  private rainyDay(day: number): boolean {
    return unitHash(this.cell.key, 'rain-day', day) < 0.2; // about one day in five: invented
  }

  /** 0 on a dry day, 1 on a rainy one, blended like `smooth`. */
  private rainyness(ms: number): number {
    const x = this.solarDay(ms) - 0.5;
    const n = Math.floor(x);
    const t = x - n;
    const blend = (1 - Math.cos(Math.PI * t)) / 2;
    const a = this.rainyDay(n) ? 1 : 0;
    const b = this.rainyDay(n + 1) ? 1 : 0;
    return a + (b - a) * blend;
  }

  /** The rain of one solar day, if it rains: a single spell of 2–8 hours and 1–30 mm (invented). */
  rainOfDay(day: number): InventedRain | null {
    if (this.rainByDay.has(day)) return this.rainByDay.get(day) ?? null;
    let rain: InventedRain | null = null;
    if (this.rainyDay(day)) {
      const key = this.cell.key;
      const startSolarHour = Math.floor(unitHash(key, 'rain-start', day) * 24);
      const hours = 2 + Math.floor(unitHash(key, 'rain-hours', day) * 7);
      const totalTenths = 10 + Math.round(290 * unitHash(key, 'rain-mm', day) ** 2);
      const solarStart = day * DAY_MS - this.solarOffsetMs + startSolarHour * HOUR_MS;
      const startMs = Math.round(solarStart / HOUR_MS) * HOUR_MS;
      rain = { startMs, hours, tenthsPerHour: spreadTenths(totalTenths, hours) };
    }
    this.rainByDay.set(day, rain);
    return rain;
  }

  /** Tenths of a mm in the hour ending at `stampMs`, and how close (hours) the nearest invented rain is. */
  private rainAt(stampMs: number): { tenths: number; hoursAway: number } {
    const startOfHour = stampMs - HOUR_MS;
    const day = Math.floor(this.solarDay(startOfHour));
    let tenths = 0;
    let hoursAway = Infinity;
    for (let d = day - 1; d <= day + 1; d++) {
      const rain = this.rainOfDay(d);
      if (!rain) continue;
      const k = Math.round((startOfHour - rain.startMs) / HOUR_MS);
      if (k >= 0 && k < rain.hours) {
        tenths += rain.tenthsPerHour[k];
        hoursAway = 0;
      } else {
        hoursAway = Math.min(hoursAway, k < 0 ? -k : k - rain.hours + 1);
      }
    }
    return { tenths, hoursAway };
  }

  /** Seasonal mean air temperature: warmest near 20 July in the north (half a year later in the south). */
  private seasonalMeanC(ms: number): number {
    const lat = this.cell.latitude;
    const annualMean = 27 - 0.0085 * lat * lat; // ≈ 27 °C at the equator, 13 °C at 40°, −3 °C at 60°: invented fit
    const amplitude = 0.3 * Math.abs(lat); // continental half-range grows with latitude: invented fit
    const phase = (2 * Math.PI * (this.solarDay(ms) - 200)) / YEAR_DAYS; // day 200 of 1970 = 20 July
    return annualMean + Math.sign(lat) * amplitude * Math.cos(phase);
  }

  /** Daily mean air temperature of the moment: season, warm/cool spells, cloud on rainy days. */
  private dailyMeanC(ms: number): number {
    return this.seasonalMeanC(ms) + 3.5 * this.smooth('spell', ms) - 2 * this.rainyness(ms);
  }

  hour(stampMs: number): InventedHour {
    const key = this.cell.key;
    const solarHour = ((((stampMs + this.solarOffsetMs) % DAY_MS) + DAY_MS) % DAY_MS) / HOUR_MS;
    const rainy = this.rainyness(stampMs);

    // Coolest at about 06 and warmest at about 15 solar time, two half-cosines joined there.
    const diurnal = solarHour >= 6 && solarHour < 15 ? -Math.cos((Math.PI * (solarHour - 6)) / 9) : Math.cos((Math.PI * ((solarHour - 15 + 24) % 24)) / 15);
    const dailyRangeC = 10 + 3 * this.smooth('range', stampMs) - 4.5 * rainy; // clouds narrow the range
    const meanC = this.dailyMeanC(stampMs);
    const airTempC = meanC + (dailyRangeC / 2) * diurnal;
    // Humidity follows from a dew point that changes by the day, not by the hour: high at dawn, low mid-afternoon.
    const dewPointC = meanC - Math.max(0.8, 6 + 3 * this.smooth('dry', stampMs) - 4.5 * rainy);

    const { tenths, hoursAway } = this.rainAt(stampMs);
    const hourHash = unitHash(key, 'hour', stampMs / HOUR_MS);
    let rainProbabilityPct: number;
    if (hoursAway === 0) rainProbabilityPct = 60 + 30 * hourHash;
    else if (hoursAway <= 3) rainProbabilityPct = 25 + 20 * hourHash;
    else rainProbabilityPct = (rainy > 0.5 ? 10 : 0) + 10 * hourHash;

    // Wind picks up through the day as the air mixes and drops at night (invented shape).
    const baseKmh = Math.max(2, 9 + 5 * this.smooth('wind', stampMs) + 4 * rainy);
    const mixing = solarHour >= 8 && solarHour <= 20 ? Math.sin((Math.PI * (solarHour - 8)) / 12) : 0;
    const windKmh = Math.max(0, baseKmh * (0.55 + 0.55 * mixing) + 2 * (unitHash(key, 'wind-hour', stampMs / HOUR_MS) - 0.5));
    const windGustKmh = windKmh * (1.4 + 0.4 * unitHash(key, 'gust', stampMs / HOUR_MS)) + 3;

    return {
      airTempC,
      dewPointC,
      rainMm: tenths / 10,
      rainProbabilityPct,
      windKmh,
      windGustKmh,
    };
  }

  /** Near 150–450 m, fixed per cell (a stand-in for the elevation model the real service reports). */
  elevationM(): number {
    return Math.round(150 + 300 * unitHash(this.cell.key, 'elevation'));
  }
}

/**
 * Soil at 6 cm as a first-order lag of the air: dT/dt = (air − soil)/τ with τ = 5 h. For the daily cycle that
 * gives about 60 % of the air's swing, peaking about 3½ h later — the damped, delayed wave of heat conduction
 * into soil (textbook outline; the τ is invented). Starting `warmUpHours` early makes the start value irrelevant.
 */
export const SOIL_LAG_HOURS = 5;
export function soilTemperatures(airC: readonly number[]): number[] {
  const out = new Array<number>(airC.length);
  const k = 1 - Math.exp(-1 / SOIL_LAG_HOURS);
  let soil = airC[0] ?? 0;
  for (let i = 0; i < airC.length; i++) {
    soil += (airC[i] - soil) * k;
    out[i] = soil;
  }
  return out;
}
