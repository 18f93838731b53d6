// Growing degree days against university extension worked values (Iowa State University Agronomy; Ohio State
// University Extension, 86/50 °F method). Exact arithmetic in the sources, so exact comparisons here.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { growingDegreeDays } from '@/lib/agronomy/gdd';
import { deltaFToC, fToC } from '@/lib/agronomy/units';

describe('simple average method', () => {
  it('70 °F / 50 °F at base 50 °F is 10 GDD', () => {
    expect(growingDegreeDays(70, 50, { base: 50 })).toBe(10); // Iowa State University Agronomy: (70 + 50)/2 − 50 = 10
  });

  it('is never negative on a cold day', () => {
    expect(growingDegreeDays(45, 30, { base: 50 })).toBe(0); // Iowa State: days below base add nothing
  });

  it('gives the same heat in °C with a 10 °C base, scaled by 5/9', () => {
    // Derived: 50 °F = 10 °C; a degree-day is a temperature difference (NIST SP 811 °F↔°C).
    expect(growingDegreeDays(fToC(70), fToC(50), { base: 10 })).toBeCloseTo(deltaFToC(10), 12);
  });
});

describe('modified (86/50 °F) method', () => {
  it('87 °F / 63 °F counts Tmax as 86: 24.5 GDD', () => {
    expect(growingDegreeDays(87, 63, { base: 50, upperCap: 86 })).toBe(24.5); // Ohio State University Extension: (86 + 63)/2 − 50
  });

  it('raises a minimum below base to the base', () => {
    // Iowa State / Ohio State: Tmin below 50 °F counts as 50 — (75 + 50)/2 − 50 = 12.5 (derived from the rule).
    expect(growingDegreeDays(75, 40, { base: 50, upperCap: 86 })).toBe(12.5);
    expect(growingDegreeDays(75, 40, { base: 50 })).toBe(7.5); // the simple method does not: (75 + 40)/2 − 50
  });

  it('is zero, not negative, when the whole day is below base', () => {
    expect(growingDegreeDays(48, 30, { base: 50, upperCap: 86 })).toBe(0); // both raised to 50: (50 + 50)/2 − 50
  });

  it('caps a hot day at the upper limit', () => {
    expect(growingDegreeDays(100, 90, { base: 50, upperCap: 86 })).toBe(36); // both counted as 86: 86 − 50 (derived)
  });

  it('refuses nonsense', () => {
    expect(() => growingDegreeDays(60, 70, { base: 50 })).toThrow(/above the maximum/);
    expect(() => growingDegreeDays(70, 60, { base: 50, upperCap: 40 })).toThrow(/upper cap/i);
    expect(() => growingDegreeDays(Number.NaN, 60, { base: 50 })).toThrow(RangeError);
    expect(() => growingDegreeDays(70, 60, { base: Number.NaN })).toThrow(RangeError);
  });
});

describe('properties (fast-check)', () => {
  const temp = fc.double({ min: -40, max: 120, noNaN: true });
  const cap = fc.option(fc.constant(86), { nil: undefined });

  it('never negative, and within the cap with the modified method', () => {
    fc.assert(fc.property(temp, temp, cap, (a, b, upperCap) => {
      const [tMin, tMax] = a < b ? [a, b] : [b, a];
      const gdd = growingDegreeDays(tMax, tMin, { base: 50, upperCap });
      return gdd >= 0 && (upperCap === undefined || gdd <= upperCap - 50);
    }));
  });

  it('monotonic (non-decreasing) in tMax', () => {
    fc.assert(fc.property(temp, temp, fc.double({ min: 0, max: 40, noNaN: true }), cap, (a, b, extra, upperCap) => {
      const [tMin, tMax] = a < b ? [a, b] : [b, a];
      return growingDegreeDays(tMax + extra, tMin, { base: 50, upperCap }) >= growingDegreeDays(tMax, tMin, { base: 50, upperCap });
    }));
  });
});
