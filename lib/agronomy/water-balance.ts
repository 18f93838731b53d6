// Seed-zone moisture from forecast rain and reference evapotranspiration: the FAO-56 (Allen et al. 1998) chapter 7
// surface-layer water balance, used for the top 10 cm where small seeds sit. It answers "will freshly broadcast
// seed stay in moist soil, and for how many days".

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
  moist: boolean;
}

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

export function seedZoneMoisture(
  days: WaterDay[],
  opts: { texture?: SoilTexture; initialDepletionMm?: number; keMax?: number } = {},
): {
  days: SeedZoneDay[];
  moistDays: number;
  firstDryDate: string | null;
  readilyEvaporableMm: number;
  totalEvaporableMm: number;
} {
  const { readilyEvaporableMm: rew, totalEvaporableMm: tew } = evaporableWater(opts.texture ?? 'loam');
  const keMax = opts.keMax ?? BARE_SOIL_KE_MAX;
  if (!(keMax > 0 && keMax <= 1.5)) throw new RangeError(`keMax must be more than 0 and at most 1.5 (got ${keMax}).`);
  // Without a known recent wetting, the surface layer is taken as dried out: a conservative start, Sowcast's
  // choice, so only forecast rain can make the seed zone moist.
  const initial = opts.initialDepletionMm ?? tew;
  if (!Number.isFinite(initial) || initial < 0 || initial > tew) {
    throw new RangeError(
      `Starting depletion must be between 0 and ${tew.toFixed(1)} mm for this soil (got ${opts.initialDepletionMm}).`,
    );
  }

  let depletionMm = initial;
  const out: SeedZoneDay[] = [];
  for (const day of days) {
    if (!Number.isFinite(day.rainMm) || day.rainMm < 0) {
      throw new RangeError(`Rain on ${day.date} must be 0 mm or more (got ${day.rainMm}).`);
    }
    if (!Number.isFinite(day.et0Mm) || day.et0Mm < 0) {
      throw new RangeError(`Reference evapotranspiration on ${day.date} must be 0 mm or more (got ${day.et0Mm}).`);
    }
    // Rain first (early in the day); what the layer cannot hold drains (DPe, eq. 79), so depletion stops at 0.
    // FAO-56 eq. 77 takes Kr from the previous day's depletion; applying the day's rain first is Sowcast's
    // simplification, so a rainy day starts at stage 1.
    const wettedMm = Math.max(0, depletionMm - day.rainMm);
    // Stage 1 at the full rate while De ≤ REW; stage 2 falling linearly to 0 at TEW (eq. 74).
    const kr = wettedMm <= rew ? 1 : Math.max(0, (tew - wettedMm) / (tew - rew));
    const evaporationMm = kr * keMax * day.et0Mm;
    depletionMm = Math.min(tew, wettedMm + evaporationMm);
    // Sowcast's own reading, no source: while the layer is still in stage 1 (De < REW) the surface stays wet
    // enough for seed to take up water; once stage 2 begins the top dries and broadcast seed stalls.
    out.push({ date: day.date, depletionMm, moist: depletionMm < rew });
  }

  const firstDry = out.findIndex((d) => !d.moist);
  return {
    days: out,
    moistDays: firstDry === -1 ? out.length : firstDry,
    firstDryDate: firstDry === -1 ? null : out[firstDry].date,
    readilyEvaporableMm: rew,
    totalEvaporableMm: tew,
  };
}
