// Growing degree days for one day by the average (max + min) / 2 method, in whatever temperature scale the
// caller uses for all three numbers (°F with the usual 50 °F base, or °C with a 10 °C base).
// Without an upper cap: the simple method, (Tmax + Tmin)/2 − base, floored at zero (Iowa State University
// Agronomy). With an upper cap: the modified method used for corn (the 86/50 °F method, Ohio State University
// Extension): Tmax above the cap counts as the cap, and either temperature below the base counts as the base,
// because development neither runs faster in heat above the cap nor goes backward in cold.

export interface DegreeDayOptions {
  base: number;
  upperCap?: number;
}

export function growingDegreeDays(tMax: number, tMin: number, opts: DegreeDayOptions): number {
  const { base, upperCap } = opts;
  for (const [name, value] of [['Maximum temperature', tMax], ['Minimum temperature', tMin], ['Base temperature', base]] as const) {
    if (!Number.isFinite(value)) throw new RangeError(`${name} must be a number, got ${value}.`);
  }
  if (tMin > tMax) throw new RangeError(`Minimum temperature (${tMin}) is above the maximum (${tMax}).`);
  if (upperCap === undefined) return Math.max(0, (tMax + tMin) / 2 - base);
  if (!Number.isFinite(upperCap) || upperCap <= base) {
    throw new RangeError(`Upper cap (${upperCap}) must be a number above the base temperature (${base}).`);
  }
  const clamp = (t: number) => Math.min(upperCap, Math.max(base, t));
  return (clamp(tMax) + clamp(tMin)) / 2 - base;
}
