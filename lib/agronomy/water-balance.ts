// Seed-zone moisture from forecast rain and reference evapotranspiration: the FAO-56 (Allen et al. 1998) chapter 7
// surface-layer water balance (eq. 73–79, two-stage evaporation), used for the top 10 cm where seed sits. It answers
// "does a rain wet the seed zone, and when does it dry again". Wet and dry turn on one threshold, the soaking rain
// that seed-before-rain seeds ahead of: a soaking rain on air-dry soil wets the seed zone, and it stays wet while the
// layer still holds at least that much water above air-dry.

export type SoilTexture =
  | 'sand'
  | 'loamy-sand'
  | 'sandy-loam'
  | 'loam'
  | 'silt-loam'
  | 'silt'
  | 'silty-clay-loam'
  | 'silty-clay'
  | 'clay';

export interface WaterDay {
  date: string;
  rainMm: number;
  et0Mm: number;
}

export interface SeedZoneDay {
  date: string;
  /** Cumulative evaporation depletion of the surface layer at the end of the day (FAO-56 De). */
  depletionMm: number;
  /** FAO-56 evaporation reduction coefficient used for the day (eq. 74): 1 in stage 1, falling in stage 2. */
  kr: number;
  evaporationMm: number;
  moist: boolean;
}

/**
 * The soaking rain: about a quarter inch (6.35 mm). Seed-before-rain seeds ahead of one, and the seed-zone balance
 * calls the seed zone wet while it holds at least this much water above air-dry — one number for both.
 */
export const SOAKING_RAIN_MM = 6.35;
export const SOAKING_RAIN_SOURCE =
  'common practice, no source: about a quarter inch (6.35 mm) of rain settles broadcast seed into the surface and starts ' +
  'germination; Sowcast uses the same amount as the water the seed zone must hold above air-dry (FAO-56 TEW − De) to count as wet';

export interface SoilWaterCharacteristics {
  /** Volumetric water content at field capacity, m³/m³: [low, high]. */
  fieldCapacity: [number, number];
  wiltingPoint: [number, number];
  readilyEvaporableMm: [number, number];
  /** As printed for Ze = 0.10 m. */
  totalEvaporableMm: [number, number];
}

/** FAO-56 Table 19, "Typical soil water characteristics for different soil types". */
export const FAO56_TABLE_19: Record<SoilTexture, SoilWaterCharacteristics> = {
  sand: { fieldCapacity: [0.07, 0.17], wiltingPoint: [0.02, 0.07], readilyEvaporableMm: [2, 7], totalEvaporableMm: [6, 12] },
  'loamy-sand': { fieldCapacity: [0.11, 0.19], wiltingPoint: [0.03, 0.1], readilyEvaporableMm: [4, 8], totalEvaporableMm: [9, 14] },
  'sandy-loam': { fieldCapacity: [0.18, 0.28], wiltingPoint: [0.06, 0.16], readilyEvaporableMm: [6, 10], totalEvaporableMm: [15, 20] },
  loam: { fieldCapacity: [0.2, 0.3], wiltingPoint: [0.07, 0.17], readilyEvaporableMm: [8, 10], totalEvaporableMm: [16, 22] },
  'silt-loam': { fieldCapacity: [0.22, 0.36], wiltingPoint: [0.09, 0.21], readilyEvaporableMm: [8, 11], totalEvaporableMm: [18, 25] },
  silt: { fieldCapacity: [0.28, 0.36], wiltingPoint: [0.12, 0.22], readilyEvaporableMm: [8, 11], totalEvaporableMm: [22, 26] },
  'silty-clay-loam': { fieldCapacity: [0.3, 0.37], wiltingPoint: [0.17, 0.24], readilyEvaporableMm: [8, 11], totalEvaporableMm: [22, 27] },
  // The online FAO-56 text prints this field capacity as "0-30 - 0.42", a typo for 0.30.
  'silty-clay': { fieldCapacity: [0.3, 0.42], wiltingPoint: [0.17, 0.29], readilyEvaporableMm: [8, 12], totalEvaporableMm: [22, 28] },
  clay: { fieldCapacity: [0.32, 0.4], wiltingPoint: [0.2, 0.24], readilyEvaporableMm: [8, 12], totalEvaporableMm: [22, 29] },
};

/** FAO-56 recommends Ze = 0.10–0.15 m; 0.10 m matches the seed zone and the Table 19 TEW column. */
export const EVAPORATION_LAYER_DEPTH_M = 0.1;

/**
 * Ke at stage 1 for bare soil wetted all over (fw = few = 1): Kc max − Kcb (FAO-56 eq. 71). Eq. 72 gives
 * Kc max = 1.20 in the standard climate (u2 = 2 m/s, RHmin = 45 %); for nearly bare soil Kcb ≈ 0.15 (the usual
 * initial-stage Kcb of FAO-56 Table 17 — from memory), so Ke max = 1.05. Callers may pass their own.
 */
export const BARE_SOIL_KE_MAX = 1.05;

const mid = ([low, high]: [number, number]) => (low + high) / 2;

/** TEW by FAO-56 eq. 73 from the midpoints of the Table 19 ranges; REW is the midpoint of its range. */
export function evaporableWater(texture: SoilTexture, layerDepthM: number = EVAPORATION_LAYER_DEPTH_M) {
  const row = FAO56_TABLE_19[texture];
  if (!row) {
    throw new RangeError(`Unknown soil texture "${texture}"; use one of ${Object.keys(FAO56_TABLE_19).join(', ')}.`);
  }
  const totalEvaporableMm = 1000 * (mid(row.fieldCapacity) - 0.5 * mid(row.wiltingPoint)) * layerDepthM;
  return { readilyEvaporableMm: mid(row.readilyEvaporableMm), totalEvaporableMm };
}

export interface SeedZoneMoisture {
  days: SeedZoneDay[];
  /** Days moist in all. */
  moistDays: number;
  firstMoistDate: string | null;
  /** The first dry day after the seed zone was first wet: when a soaked seed zone dries out. */
  firstDryDate: string | null;
  readilyEvaporableMm: number;
  totalEvaporableMm: number;
  /** Depletion at or below which the seed zone counts as wet: TEW − the soaking rain. */
  wetDepletionMm: number;
}

export function seedZoneMoisture(
  days: WaterDay[],
  opts: {
    texture?: SoilTexture;
    initialDepletionMm?: number;
    keMax?: number;
    soakingRainMm?: number;
    /** Run the balance over every day but report only from this date on (rain before seeding still wets the soil). */
    reportFrom?: string;
  } = {},
): SeedZoneMoisture {
  const { readilyEvaporableMm: rew, totalEvaporableMm: tew } = evaporableWater(opts.texture ?? 'loam');
  const keMax = opts.keMax ?? BARE_SOIL_KE_MAX;
  if (!(keMax > 0 && keMax <= 1.5)) throw new RangeError(`keMax must be more than 0 and at most 1.5 (got ${keMax}).`);
  const soakingRainMm = opts.soakingRainMm ?? SOAKING_RAIN_MM;
  if (!(Number.isFinite(soakingRainMm) && soakingRainMm > 0)) {
    throw new RangeError(`The soaking rain must be more than 0 mm (got ${opts.soakingRainMm}).`);
  }
  // Without a known recent wetting the surface layer is taken as air-dry (De = TEW): Sowcast's conservative start,
  // so only forecast rain wets the seed zone.
  const initial = opts.initialDepletionMm ?? tew;
  if (!Number.isFinite(initial) || initial < 0 || initial > tew) {
    throw new RangeError(
      `Starting depletion must be between 0 and ${tew.toFixed(1)} mm for this soil (got ${opts.initialDepletionMm}).`,
    );
  }
  const wetDepletionMm = Math.max(0, tew - soakingRainMm);

  let depletionMm = initial;
  const out: SeedZoneDay[] = [];
  for (const day of days) {
    if (!Number.isFinite(day.rainMm) || day.rainMm < 0) {
      throw new RangeError(`Rain on ${day.date} must be 0 mm or more (got ${day.rainMm}).`);
    }
    if (!Number.isFinite(day.et0Mm) || day.et0Mm < 0) {
      throw new RangeError(`Reference evapotranspiration on ${day.date} must be 0 mm or more (got ${day.et0Mm}).`);
    }
    // Eq. 74: Kr from the previous day's depletion — 1 while De ≤ REW (stage 1), then falling linearly to 0 at TEW.
    const kr = depletionMm <= rew ? 1 : Math.max(0, (tew - depletionMm) / (tew - rew));
    // Eq. 71/76 for bare soil wetted all over (few = 1): E = Kr · Ke max · ET0.
    const evaporationMm = kr * keMax * day.et0Mm;
    // Eq. 77–79: rain refills the layer and what it cannot hold drains (DPe), so De never goes below 0; no runoff
    // on a level plot (RO = 0, Sowcast's assumption) and no transpiration from a bare seedbed; De stays ≤ TEW.
    depletionMm = Math.min(tew, Math.max(0, depletionMm - day.rainMm) + evaporationMm);
    // Float noise (19 − 6.35 − 0) must not decide a day: a hair's margin.
    out.push({ date: day.date, depletionMm, kr, evaporationMm, moist: depletionMm <= wetDepletionMm + 1e-9 });
  }

  const from = opts.reportFrom;
  const reported = from ? out.filter((d) => d.date >= from) : out;
  const firstMoist = reported.findIndex((d) => d.moist);
  const firstDry = firstMoist === -1 ? -1 : reported.findIndex((d, i) => i > firstMoist && !d.moist);
  return {
    days: reported,
    moistDays: reported.filter((d) => d.moist).length,
    firstMoistDate: firstMoist === -1 ? null : reported[firstMoist].date,
    firstDryDate: firstDry === -1 ? null : reported[firstDry].date,
    readilyEvaporableMm: rew,
    totalEvaporableMm: tew,
    wetDepletionMm,
  };
}

/**
 * The first run of `spellDays` dry days in a row after the seed zone was first wet: a dry spell that can kill
 * sprouted seed. Null when the seed zone never wets or never stays dry that long.
 */
export function firstDrySpell(moisture: SeedZoneMoisture, spellDays: number): { startDate: string; endDate: string } | null {
  if (!Number.isInteger(spellDays) || spellDays < 1) throw new RangeError(`A dry spell must be a whole number of days, 1 or more (got ${spellDays}).`);
  const { days } = moisture;
  const firstMoist = days.findIndex((d) => d.moist);
  if (firstMoist === -1) return null;
  let run = 0;
  for (let i = firstMoist + 1; i < days.length; i++) {
    run = days[i].moist ? 0 : run + 1;
    if (run === spellDays) return { startDate: days[i - spellDays + 1].date, endDate: days[i].date };
  }
  return null;
}
