// Unit definitions against NIST Special Publication 811 (2008), appendix B, and NIST Handbook 44 appendix C,
// where these factors are exact by definition.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  ACRE_M2, FL_OZ_PER_US_GALLON, FOOT_M, INCH_MM, MILE_M, POUND_KG, SHORT_TON_LB, SQ_FT_PER_ACRE, US_GALLON_L,
  acresToM2, acresToSqFt, cToF, deltaCToF, deltaFToC, flOzToGal, fToC, galToFlOz, galToL, inToMm, kgToLb, kmhToMph,
  kmhToMs, lbToKg, lToGal, m2ToAcres, mmToIn, mphToKmh, mphToMs, msToKmh, msToMph,
} from '@/lib/agronomy/units';

describe('exact definitions (NIST SP 811 / Handbook 44)', () => {
  it('international acre = 43,560 ft² = 4046.8564224 m²', () => {
    expect(ACRE_M2).toBe(4046.8564224); // NIST SP 811 B.8: acre (international, from the 0.3048 m foot)
    expect(acresToM2(1)).toBe(4046.8564224);
    expect(SQ_FT_PER_ACRE).toBe(43_560); // NIST Handbook 44 C: 1 acre = 43 560 ft²
    expect(SQ_FT_PER_ACRE * FOOT_M * FOOT_M).toBeCloseTo(ACRE_M2, 9); // foot = 0.3048 m exactly
    expect(acresToSqFt(2)).toBe(87_120);
  });

  it('US gallon = 231 in³ = 3.785411784 L', () => {
    expect(US_GALLON_L).toBe(3.785411784); // NIST SP 811 B.8
    expect(231 * (INCH_MM / 100) ** 3).toBeCloseTo(US_GALLON_L, 12); // Handbook 44: gallon = 231 in³; 1 in = 2.54 cm
    expect(galToL(10)).toBeCloseTo(37.85411784, 12);
    expect(lToGal(US_GALLON_L)).toBe(1);
  });

  it('pound (avoirdupois) = 0.45359237 kg', () => {
    expect(POUND_KG).toBe(0.45359237); // NIST SP 811 B.8
    expect(lbToKg(100)).toBeCloseTo(45.359237, 12);
    expect(kgToLb(POUND_KG)).toBe(1);
    expect(SHORT_TON_LB).toBe(2000); // Handbook 44 C: short ton = 2000 lb
  });

  it('inch = 25.4 mm, foot = 0.3048 m, mile = 1609.344 m', () => {
    expect(INCH_MM).toBe(25.4); // NIST SP 811 B.8
    expect(inToMm(1)).toBe(25.4);
    expect(mmToIn(25.4)).toBe(1);
    expect(FOOT_M).toBe(0.3048);
    expect(MILE_M).toBe(1609.344);
  });

  it('US fluid ounce = 1/128 US gallon = 29.5735295625 mL', () => {
    expect(FL_OZ_PER_US_GALLON).toBe(128); // Handbook 44 C: 1 gal = 128 fl oz
    expect(galToFlOz(1)).toBe(128);
    expect(flOzToGal(128)).toBe(1);
    expect(galToL(flOzToGal(1)) * 1000).toBeCloseTo(29.5735295625, 10); // NIST SP 811 B.8: 2.957 353 E−05 m³
  });

  it('°F ↔ °C at −40, 32 and 212', () => {
    expect(fToC(-40)).toBe(-40); // NIST SP 811 B.9: t/°C = (t/°F − 32)/1.8; the scales cross at −40
    expect(cToF(-40)).toBe(-40);
    expect(fToC(32)).toBe(0);
    expect(fToC(212)).toBe(100);
    expect(cToF(0)).toBe(32);
    expect(cToF(100)).toBe(212);
    expect(deltaFToC(18)).toBe(10); // a temperature interval: 1 °F = 5/9 K
    expect(deltaCToF(10)).toBe(18);
  });

  it('mph ↔ km/h ↔ m/s', () => {
    expect(mphToMs(1)).toBeCloseTo(0.44704, 15); // NIST SP 811 B.8: mile per hour = 4.4704 E−01 m/s exactly
    expect(mphToKmh(1)).toBeCloseTo(1.609344, 15); // NIST SP 811 B.8: 1.609 344 km/h exactly
    expect(kmhToMs(36)).toBe(10); // 1 km/h = 1000 m / 3600 s
    expect(msToKmh(10)).toBe(36);
    expect(msToMph(0.44704)).toBeCloseTo(1, 15);
    expect(kmhToMph(1.609344)).toBeCloseTo(1, 15);
  });
});

describe('round trips (fast-check)', () => {
  const x = fc.double({ min: -1e6, max: 1e6, noNaN: true });
  const close = (a: number, b: number) => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(b));
  it('every conversion and its inverse return the input', () => {
    fc.assert(fc.property(x, (v) =>
      close(cToF(fToC(v)), v) && close(m2ToAcres(acresToM2(v)), v) && close(kgToLb(lbToKg(v)), v) &&
      close(lToGal(galToL(v)), v) && close(mmToIn(inToMm(v)), v) && close(flOzToGal(galToFlOz(v)), v) &&
      close(msToKmh(kmhToMs(v)), v) && close(msToMph(mphToMs(v)), v) && close(kmhToMph(mphToKmh(v)), v) &&
      close(deltaCToF(deltaFToC(v)), v)));
  });
});
