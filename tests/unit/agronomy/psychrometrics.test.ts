// Psychrometrics against FAO Irrigation and Drainage Paper 56 (Allen et al. 1998) chapter 3 worked examples,
// Alduchov & Eskridge (1996), Lawrence (2005) and Stull (2011).
// Tolerances: half a unit in the last digit the source prints, since FAO-56 rounds every printed value.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  actualVapourPressureFromDewPointKPa,
  actualVapourPressureFromRhMaxKPa,
  actualVapourPressureFromRhMaxMinKPa,
  actualVapourPressureFromRhMeanKPa,
  atmosphericPressureKPa,
  deltaTC,
  dewPointC,
  meanSaturationVapourPressureKPa,
  psychrometricConstantKPaPerC,
  saturationVapourPressureKPa,
  saturationVapourPressureSlopeKPaPerC,
  wetBulbC,
} from '@/lib/agronomy/psychrometrics';

/** |actual − expected| ≤ tolerance, with both numbers in the failure message. */
function expectWithin(actual: number, expected: number, tolerance: number) {
  expect(Math.abs(actual - expected), `${actual} vs ${expected} ± ${tolerance}`).toBeLessThanOrEqual(tolerance);
}

// Alduchov & Eskridge (1996) Magnus form, written out independently of the module: es = 0.61094 exp(17.625 T/(T + 243.04)) kPa.
const magnusKPa = (tempC: number) => 0.61094 * Math.exp((17.625 * tempC) / (tempC + 243.04));

// FAO-56 eq. 15–16 with the ventilated-psychrometer coefficient 0.000662 °C⁻¹ at 101.325 kPa, solved for the wet
// bulb by bisection — a reference built from the equation, not from Stull's fit (derived).
function psychrometricWetBulbC(tempC: number, rhPct: number): number {
  const vapourKPa = (rhPct / 100) * saturationVapourPressureKPa(tempC);
  const gammaPsy = 0.000662 * 101.325;
  let low = -60;
  let high = tempC;
  for (let i = 0; i < 100; i += 1) {
    const mid = (low + high) / 2;
    if (saturationVapourPressureKPa(mid) - gammaPsy * (tempC - mid) > vapourKPa) high = mid;
    else low = mid;
  }
  return (low + high) / 2;
}

describe('FAO-56 atmospheric parameters', () => {
  it('pressure and psychrometric constant at 1800 m', () => {
    expectWithin(atmosphericPressureKPa(1800), 81.8, 0.05); // FAO-56 Example 2: P = 81.8 kPa (eq. 7)
    expectWithin(psychrometricConstantKPaPerC(atmosphericPressureKPa(1800)), 0.054, 0.0005); // FAO-56 Example 2: γ = 0.054 kPa/°C (eq. 8)
  });

  it('pressure at sea level is the standard 101.3 kPa', () => {
    expect(atmosphericPressureKPa(0)).toBe(101.3); // FAO-56 eq. 7: P = 101.3 at z = 0 by construction
  });

  it('refuses an impossible elevation', () => {
    expect(() => atmosphericPressureKPa(Number.NaN)).toThrow(RangeError);
    expect(() => atmosphericPressureKPa(20_000)).toThrow(/elevation/i);
  });
});

describe('FAO-56 vapour pressure', () => {
  it('saturation vapour pressure at Tmax 24.5 °C and Tmin 15 °C', () => {
    expectWithin(saturationVapourPressureKPa(24.5), 3.075, 0.0005); // FAO-56 Example 3: e°(Tmax) = 3.075 kPa
    expectWithin(saturationVapourPressureKPa(15), 1.705, 0.0005); // FAO-56 Example 3: e°(Tmin) = 1.705 kPa
    expectWithin(meanSaturationVapourPressureKPa(24.5, 15), 2.39, 0.005); // FAO-56 Example 3: es = 2.39 kPa (eq. 12)
  });

  it('slope of the vapour pressure curve at 30.2 °C', () => {
    expectWithin(saturationVapourPressureSlopeKPaPerC(30.2), 0.246, 0.0005); // FAO-56 Example 17: Δ = 0.246 kPa/°C (eq. 13)
  });

  it('ea from relative humidity, Tmax 25 °C, Tmin 18 °C, RHmax 82 %, RHmin 54 %', () => {
    // FAO-56 Example 5 — inputs from memory; the printed results (e°(Tmin) 2.064, e°(Tmax) 3.168, ea 1.70 / 1.69 / 1.78)
    // are also quoted in PyETo's test suite (secondary).
    expectWithin(saturationVapourPressureKPa(18), 2.064, 0.0005);
    expectWithin(saturationVapourPressureKPa(25), 3.168, 0.0005);
    expectWithin(actualVapourPressureFromRhMaxMinKPa(25, 18, 82, 54), 1.7, 0.005); // eq. 17
    expectWithin(actualVapourPressureFromRhMaxKPa(18, 82), 1.69, 0.005); // eq. 18
    expectWithin(actualVapourPressureFromRhMeanKPa(25, 18, 68), 1.78, 0.005); // eq. 19, RHmean = (82 + 54)/2
  });

  it('eq. 17 averages its two terms (the paper prints it once without the "/2")', () => {
    // REFERENCES.md misprint note; without the /2 ea would exceed es, i.e. more than 100 % RH.
    const eaKPa = actualVapourPressureFromRhMaxMinKPa(25, 18, 82, 54);
    expect(eaKPa).toBeLessThan(meanSaturationVapourPressureKPa(25, 18));
    expect(actualVapourPressureFromRhMaxMinKPa(25, 18, 100, 100)).toBeCloseTo(meanSaturationVapourPressureKPa(25, 18), 12);
  });

  it('ea from dew point, Tdew ≈ Tmin = 14.8 °C', () => {
    expectWithin(actualVapourPressureFromDewPointKPa(14.8), 1.68, 0.005); // FAO-56 Example 20: ea = e°(14.8) = 1.68 kPa (eq. 14/48)
  });
});

describe('dew point (Magnus form, Alduchov & Eskridge 1996)', () => {
  it('is the air temperature itself at 100 % RH (inverting es)', () => {
    for (const tempC of [-30, -5, 0, 12.5, 20, 35, 49]) expect(dewPointC(tempC, 100)).toBeCloseTo(tempC, 10);
  });

  it('inverts the Magnus es: e°(Td) = RH · e°(T)', () => {
    // Alduchov & Eskridge (1996) form as quoted in REFERENCES.md (secondary), re-implemented above.
    for (const [tempC, rhPct] of [[20, 50], [5, 80], [35, 15], [-10, 60]]) {
      expect(magnusKPa(dewPointC(tempC, rhPct))).toBeCloseTo((rhPct / 100) * magnusKPa(tempC), 10);
    }
  });

  it('20 °C at 50 % RH gives a dew point of 9.3 °C', () => {
    expectWithin(dewPointC(20, 50), 9.3, 0.05); // from memory: the usual Magnus-calculator value
  });

  it('agrees with inverting FAO-56 eq. 11 to within 0.15 °C for dew points from −20 to 40 °C', () => {
    // Derived: FAO-56 eq. 11 (17.27 / 237.3) is a different Magnus fit, so the two dew points must nearly agree
    // where both are fitted; they part further below −20 °C, where Alduchov & Eskridge's constants are the better.
    const fromFaoC = (tempC: number, rhPct: number) => {
      const x = Math.log(((rhPct / 100) * saturationVapourPressureKPa(tempC)) / 0.6108);
      return (237.3 * x) / (17.27 - x);
    };
    let checked = 0;
    for (let tempC = 0; tempC <= 40; tempC += 5) {
      for (let rhPct = 10; rhPct <= 100; rhPct += 10) {
        const faoC = fromFaoC(tempC, rhPct);
        if (faoC < -20) continue;
        expectWithin(dewPointC(tempC, rhPct), faoC, 0.15);
        checked += 1;
      }
    }
    expect(checked).toBeGreaterThan(70);
  });

  it('follows the rule of thumb: 1 °C lower per 5 % RH drop above 50 % RH', () => {
    // Lawrence (2005), BAMS 86, 225–233: Td ≈ T − (100 − RH)/5 for RH > 50 %, "about 1 °C" (secondary). The rule is
    // checked where it is meant for, moderate temperatures: 10–20 °C from 50 % RH, 10–30 °C from 60 % RH.
    for (let tempC = 10; tempC <= 30; tempC += 2.5) {
      for (let rhPct = tempC <= 20 ? 50 : 60; rhPct <= 100; rhPct += 5) {
        expectWithin(dewPointC(tempC, rhPct), tempC - (100 - rhPct) / 5, 1);
      }
    }
  });

  it('refuses nonsense humidity and temperature with a readable message', () => {
    expect(() => dewPointC(20, 150)).toThrow(RangeError);
    expect(() => dewPointC(20, 150)).toThrow(/between 0 and 100 %/);
    expect(() => dewPointC(20, -1)).toThrow(RangeError);
    expect(() => dewPointC(20, Number.NaN)).toThrow(/relative humidity/i);
    expect(() => dewPointC(20, 0)).toThrow(/dry air/);
    expect(() => dewPointC(Number.NaN, 50)).toThrow(/temperature/i);
    expect(() => dewPointC(300, 50)).toThrow(/°F or kelvin/);
  });
});

describe('wet bulb (Stull 2011)', () => {
  it('T 20 °C, RH 50 % → Tw ≈ 13.7 °C', () => {
    expectWithin(wetBulbC(20, 50), 13.7, 0.1); // Stull (2011) check value, secondary (REFERENCES.md)
  });

  it('stays close to the psychrometric equation over the fitted range', () => {
    // Stull (2011) states −1…+0.65 °C against his reference over RH 5–99 %, T −20…50 °C, except when cold and dry
    // together. Our reference is FAO-56 eq. 15–16 (derived, a ventilated psychrometer rather than his adiabatic
    // solution), so the band is widened by 0.4 °C on each side; a wrong coefficient lands several degrees off.
    for (let tempC = 0; tempC <= 50; tempC += 2.5) {
      for (let rhPct = 5; rhPct <= 99; rhPct += 2) {
        const errorC = wetBulbC(tempC, rhPct) - psychrometricWetBulbC(tempC, rhPct);
        expect(errorC, `T ${tempC} RH ${rhPct}`).toBeGreaterThanOrEqual(-1.4);
        expect(errorC, `T ${tempC} RH ${rhPct}`).toBeLessThanOrEqual(1.05);
      }
    }
  });

  it('outside the fitted range falls back to the psychrometric equation', () => {
    // FAO-56 eq. 15–16 at 101.325 kPa (derived) for desert-dry air and deep cold.
    expectWithin(wetBulbC(40, 3), psychrometricWetBulbC(40, 3), 1e-9);
    expectWithin(wetBulbC(-30, 70), psychrometricWetBulbC(-30, 70), 1e-9);
  });

  it('approaches the dry bulb as RH → 100 % and equals it when saturated', () => {
    // Physics: saturated air cannot be cooled by evaporation; Stull's fit is within 0.32 °C at 99 % over −20…50 °C.
    for (let tempC = -20; tempC <= 50; tempC += 5) {
      expect(wetBulbC(tempC, 100)).toBe(tempC);
      expect(tempC - wetBulbC(tempC, 99)).toBeLessThanOrEqual(0.32);
      expect(tempC - wetBulbC(tempC, 90)).toBeGreaterThan(tempC - wetBulbC(tempC, 99));
    }
  });

  it('refuses RH 150 and NaN', () => {
    expect(() => wetBulbC(20, 150)).toThrow(RangeError);
    expect(() => wetBulbC(Number.NaN, 50)).toThrow(RangeError);
  });
});

describe('Delta T for spraying', () => {
  // Bands: Bureau of Meteorology / GRDC Spray Application Manual, secondary (REFERENCES.md): 2–8 °C preferred,
  // up to 10 °C with care, above 10 °C avoid, below 2 °C beware inversions and drift.
  it('25 °C at 50 % RH is about 7 °C, inside the preferred band', () => {
    expectWithin(deltaTC(25, 50), 7, 0.3); // Delta T chart reading, secondary
  });

  it('humid, mild air falls below 2 °C and hot, dry air above 10 °C', () => {
    expect(deltaTC(18, 92)).toBeLessThan(2);
    expect(deltaTC(35, 20)).toBeGreaterThan(10);
  });
});

describe('properties (fast-check)', () => {
  const tempC = fc.double({ min: -40, max: 50, noNaN: true });
  const rhPct = fc.double({ min: 1, max: 100, noNaN: true });

  it('wet bulb never exceeds dry bulb, so Delta T ≥ 0', () => {
    fc.assert(fc.property(tempC, rhPct, (t, rh) => wetBulbC(t, rh) <= t && deltaTC(t, rh) >= 0));
  });

  it('dew point never exceeds the air temperature', () => {
    fc.assert(fc.property(tempC, rhPct, (t, rh) => dewPointC(t, rh) <= t + 1e-9));
  });

  it('dew point rises with humidity', () => {
    fc.assert(
      fc.property(tempC, rhPct, rhPct, (t, a, b) => {
        const [low, high] = a < b ? [a, b] : [b, a];
        return dewPointC(t, low) <= dewPointC(t, high) + 1e-9;
      }),
    );
  });

  it('dew point stays at or below the wet bulb, within Stull’s 1 °C error', () => {
    // Physics: Td ≤ Tw ≤ T; the fit may cross by at most its stated error.
    fc.assert(fc.property(tempC, rhPct, (t, rh) => dewPointC(t, rh) <= wetBulbC(t, rh) + 1));
  });
});
