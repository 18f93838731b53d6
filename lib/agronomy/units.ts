// Exact unit definitions, NIST SP 811 (2008) appendix B and NIST Handbook 44 appendix C. Every conversion
// in Sowcast goes through this module.

export const INCH_MM = 25.4; // exact
export const FOOT_M = 0.3048; // exact
export const POUND_KG = 0.45359237; // exact (avoirdupois)
export const US_GALLON_L = 3.785411784; // exact: 231 cubic inches
export const FL_OZ_PER_US_GALLON = 128; // US fluid ounce = 1/128 US gallon
export const SQ_FT_PER_ACRE = 43_560; // international acre = 43,560 ft²
// 43,560 × 0.3048² = 4046.8564224 m² exactly; written out because the floating-point product ends in …0006.
export const ACRE_M2 = 4_046.856_422_4;
export const SHORT_TON_LB = 2_000; // US short ton, as soil-test lime recommendations give it
export const MILE_M = 1609.344; // exact: 5,280 ft

export const fToC = (tempF: number) => ((tempF - 32) * 5) / 9;
export const cToF = (tempC: number) => (tempC * 9) / 5 + 32;
/** A temperature difference (degree days, Delta T): no offset. */
export const deltaFToC = (deltaF: number) => (deltaF * 5) / 9;
export const deltaCToF = (deltaC: number) => (deltaC * 9) / 5;

export const inToMm = (inches: number) => inches * INCH_MM;
export const mmToIn = (mm: number) => mm / INCH_MM;

export const acresToM2 = (acres: number) => acres * ACRE_M2;
export const m2ToAcres = (m2: number) => m2 / ACRE_M2;
export const acresToSqFt = (acres: number) => acres * SQ_FT_PER_ACRE;

export const lbToKg = (lb: number) => lb * POUND_KG;
export const kgToLb = (kg: number) => kg / POUND_KG;

export const galToL = (gal: number) => gal * US_GALLON_L;
export const lToGal = (litres: number) => litres / US_GALLON_L;
export const galToFlOz = (gal: number) => gal * FL_OZ_PER_US_GALLON;
export const flOzToGal = (flOz: number) => flOz / FL_OZ_PER_US_GALLON;

export const msToKmh = (ms: number) => ms * 3.6;
export const kmhToMs = (kmh: number) => kmh / 3.6;
export const mphToMs = (mph: number) => (mph * MILE_M) / 3600;
export const msToMph = (ms: number) => (ms * 3600) / MILE_M;
export const mphToKmh = (mph: number) => mph * (MILE_M / 1000);
export const kmhToMph = (kmh: number) => kmh / (MILE_M / 1000);
