// Lime from a soil test, checked against the published methods:
// - NCDA&CS Agronomic Division, lime factor table (ncagr.gov/agronomi/bufftab1.htm): FACTOR = (target − pH) ÷
//   (6.6 − pH); LR = Ac × FACTOR; worked example pH 5.0, target 6.0, Ac 1.2 → 0.76 t/acre (the page multiplies
//   by its table factor 0.63; the formula's 0.625 gives 0.75). Ac = (6.6 − buffer pH) × 4.
// - Tri-State E-2567 (1995) SMP table as reprinted by MSU Extension 06039707: 8-inch depth, NV 90 %, one-half
//   for no-till and established forages; adjust other lime by × 0.90 ÷ NV. The table's numbers are from memory
//   (see SMP_LIME_TABLE's source) — the frame around them is quoted.
// - Target pH: Tri-State Table 1 (alfalfa 6.8 on acid subsoils) and the food plot guides' ranges.
import { describe, expect, it } from 'vitest';
import {
  LIME_REFERENCE,
  LimeInputError,
  SMP_LIME_TABLE,
  TARGET_PH_BY_SPECIES,
  blendTargetPh,
  limeProductTons,
  limeTonsFromEnp,
  limeForSoilTest,
  limeTonsPerAcre,
  mehlichAcidityFromBufferPh,
  targetPhFor,
} from '@/lib/agronomy/lime';
import { SPECIES } from '@/lib/agronomy/species';

describe('Mehlich buffer acidity (NCDA&CS)', () => {
  it('reproduces the published worked example: pH 5.0 → 6.0 with Ac 1.2 is about 0.76 t/acre', () => {
    const tons = limeTonsPerAcre({ method: 'mehlich-acidity', soilPh: 5.0, targetPh: 6.0, acidityMeq: 1.2 });
    expect(tons).toBeCloseTo(0.75, 6); // 1.2 × 1.0/1.6
    expect(Math.abs(tons - 0.76)).toBeLessThanOrEqual(0.01); // the page's 1.2 × 0.63 (its rounded factor)
  });

  it('follows the factor formula at other points of the table', () => {
    // pH 5.5 → 6.5 for a clover: factor (6.5 − 5.5)/(6.6 − 5.5) = 0.909; with Ac 2.0 → 1.82 t/acre.
    expect(limeTonsPerAcre({ method: 'mehlich-acidity', soilPh: 5.5, targetPh: 6.5, acidityMeq: 2.0 })).toBeCloseTo(1.818, 3);
    // The target 6.6 itself neutralizes all of Ac (factor 1).
    expect(limeTonsPerAcre({ method: 'mehlich-acidity', soilPh: 4.8, targetPh: 6.6, acidityMeq: 3.1 })).toBeCloseTo(3.1, 9);
  });

  it('turns the Mehlich buffer pH into acidity as the lab does: (6.6 − BpH) × 4', () => {
    expect(mehlichAcidityFromBufferPh(6.3)).toBeCloseTo(1.2, 9);
    expect(mehlichAcidityFromBufferPh(6.6)).toBe(0);
    expect(mehlichAcidityFromBufferPh(6.8)).toBe(0);
  });

  it('is 0 at or above the target pH', () => {
    expect(limeTonsPerAcre({ method: 'mehlich-acidity', soilPh: 6.5, targetPh: 6.5, acidityMeq: 2 })).toBe(0);
    expect(limeTonsPerAcre({ method: 'mehlich-acidity', soilPh: 6.8, targetPh: 6.5, acidityMeq: 2 })).toBe(0);
  });

  it('names the reference lime: standard agricultural lime (NCDA&CS)', () => {
    expect(LIME_REFERENCE['mehlich-acidity'].words).toContain('standard agricultural lime');
  });
});

describe('SMP buffer (Tri-State)', () => {
  const row = (bufferPh: number) => SMP_LIME_TABLE.value.find((r) => r.bufferPh === bufferPh)!;

  it('reads the table rows for the three target columns', () => {
    expect(limeTonsPerAcre({ method: 'smp-buffer', soilPh: 5.6, bufferPh: 6.5, targetPh: 6.8 })).toBe(row(6.5).tons[6.8]);
    expect(limeTonsPerAcre({ method: 'smp-buffer', soilPh: 5.6, bufferPh: 6.5, targetPh: 6.5 })).toBe(row(6.5).tons[6.5]);
    expect(limeTonsPerAcre({ method: 'smp-buffer', soilPh: 5.6, bufferPh: 6.5, targetPh: 6.0 })).toBe(row(6.5).tons[6]);
    // From memory (see the header): buffer 6.8 → 1.4 / 1.2 / 1.0; buffer 6.0 → 9.6 / 8.1 / 6.7.
    expect(row(6.8).tons).toEqual({ 6.8: 1.4, 6.5: 1.2, 6: 1.0 });
    expect(row(6.0).tons).toEqual({ 6.8: 9.6, 6.5: 8.1, 6: 6.7 });
  });

  it('interpolates between rows and between target columns', () => {
    // Halfway between buffer 6.5 (3.8) and 6.4 (4.7) to pH 6.5.
    expect(limeTonsPerAcre({ method: 'smp-buffer', soilPh: 5.5, bufferPh: 6.45, targetPh: 6.5 })).toBeCloseTo(4.25, 9);
    // Target 6.25 at buffer 6.6: halfway between the 6.0 (2.4) and 6.5 (2.9) columns.
    expect(limeTonsPerAcre({ method: 'smp-buffer', soilPh: 5.5, bufferPh: 6.6, targetPh: 6.25 })).toBeCloseTo(2.65, 9);
  });

  it('gives none above a lime index of 70 (MSU Extension) and halves the rate for a 0–4 in no-till depth', () => {
    expect(limeTonsPerAcre({ method: 'smp-buffer', soilPh: 6.2, bufferPh: 7.0, targetPh: 6.5 })).toBe(0);
    const tilled = limeTonsPerAcre({ method: 'smp-buffer', soilPh: 5.6, bufferPh: 6.2, targetPh: 6.5 });
    expect(limeTonsPerAcre({ method: 'smp-buffer', soilPh: 5.6, bufferPh: 6.2, targetPh: 6.5, depth: 'no-till' })).toBeCloseTo(tilled / 2, 9);
  });

  it('is 0 at or above the target pH, and refuses input outside the table with the field named', () => {
    expect(limeTonsPerAcre({ method: 'smp-buffer', soilPh: 6.5, bufferPh: 6.6, targetPh: 6.5 })).toBe(0);
    expect(() => limeTonsPerAcre({ method: 'smp-buffer', soilPh: 5.0, bufferPh: 5.2, targetPh: 6.5 })).toThrow(/bufferPh/);
    expect(() => limeTonsPerAcre({ method: 'smp-buffer', soilPh: 5.0, bufferPh: 6.2, targetPh: 7.0 })).toThrow(/targetPh/);
    try {
      limeTonsPerAcre({ method: 'mehlich-acidity', soilPh: Number.NaN, targetPh: 6, acidityMeq: 1 });
      throw new Error('expected a LimeInputError');
    } catch (error) {
      expect(error).toBeInstanceOf(LimeInputError);
      expect((error as LimeInputError).field).toBe('soilPh');
    }
  });
});

describe('lime quality', () => {
  it('adjusts by neutralizing value as Tri-State says: × 0.90 ÷ NV (the bulletin’s NV 80 % example)', () => {
    expect(limeProductTons(2, { referencePct: 90, productPct: 80 })).toBeCloseTo(2.25, 9);
  });

  it('adjusts by CCE as Penn State’s lab says: × 100 ÷ CCE (its example: 5 lb at CCE 70 → about 7 lb)', () => {
    expect(limeProductTons(5, { referencePct: 100, productPct: 70 })).toBeCloseTo(7.14, 2);
  });

  it('turns Ohio’s ENP recommendation into tons of a product from the label’s ENP per ton', () => {
    expect(limeTonsFromEnp(1500, 1000)).toBeCloseTo(1.5, 9);
    expect(() => limeTonsFromEnp(1500, 0)).toThrow(/enpLbPerTon/);
  });
});

describe('target pH by species', () => {
  it('has a sourced target pH for every catalog species', () => {
    for (const species of SPECIES) {
      const target = TARGET_PH_BY_SPECIES[species.id];
      expect(target, species.id).toBeDefined();
      expect(target.source.length, species.id).toBeGreaterThan(10);
      expect(target.targetPh).toBeGreaterThanOrEqual(target.rangePh[0]);
      expect(target.targetPh).toBeLessThanOrEqual(target.rangePh[1]);
    }
  });

  it('matches the published ranges: clovers 6.5–7.0, brassicas and grains 6.0–6.5, alfalfa limed to 6.8 (Tri-State)', () => {
    expect(targetPhFor('white-clover').rangePh).toEqual([6.5, 7.0]);
    expect(targetPhFor('turnip').rangePh).toEqual([6.0, 6.5]);
    expect(targetPhFor('winter-wheat').rangePh).toEqual([6.0, 6.5]);
    expect(targetPhFor('alfalfa').targetPh).toBe(6.8);
  });

  it('limes a blend for its strictest member', () => {
    const blend = [
      { speciesId: 'cereal-rye', share: 0.5 },
      { speciesId: 'crimson-clover', share: 0.3 },
      { speciesId: 'turnip', share: 0.2 },
    ];
    expect(blendTargetPh(blend)).toMatchObject({ targetPh: 6.5, speciesId: 'crimson-clover' });
    expect(blendTargetPh([...blend, { speciesId: 'alfalfa', share: 0.1 }]).targetPh).toBe(6.8);
    expect(blendTargetPh([{ speciesId: 'oats', share: 1 }]).targetPh).toBe(6.0);
  });
});

describe('a soil test’s numbers → lime for the blend', () => {
  const clover = [{ speciesId: 'white-clover', share: 1 }];
  it('uses the NCDA&CS acidity when the report has Ac, aiming at the blend’s target (clover 6.5)', () => {
    // (6.5 − 5.0)/(6.6 − 5.0) × 1.2 = 1.125 t/acre of standard lime.
    const r = limeForSoilTest({ soilPh: 5.0, acidityMeq: 1.2 }, clover);
    expect(r).toMatchObject({ ok: true, method: 'mehlich-acidity', targetPh: 6.5 });
    expect(r.ok && r.tonsPerAcre).toBeCloseTo(1.125, 9);
  });

  it('turns a Mehlich buffer pH into Ac, and reads any other buffer pH as SMP (halved when the ground is not worked)', () => {
    const mehlich = limeForSoilTest({ soilPh: 5.0, bufferPh: 6.3, bufferMethod: 'mehlich' }, clover);
    expect(mehlich.ok && mehlich.tonsPerAcre).toBeCloseTo(1.125, 9);
    const smp = limeForSoilTest({ soilPh: 5.6, bufferPh: 6.5, bufferMethod: 'smp' }, clover, { noTill: true });
    expect(smp).toMatchObject({ ok: true, method: 'smp-buffer', tonsPerAcre: 1.9 }); // 3.8 ÷ 2
  });

  it('says what is missing instead of guessing', () => {
    expect(limeForSoilTest({ soilPh: 5.4 }, clover)).toMatchObject({ ok: false, reason: expect.stringContaining('no buffer pH or acidity') });
    expect(limeForSoilTest({ soilPh: null, bufferPh: 6.4 }, clover)).toMatchObject({ ok: false, reason: expect.stringContaining('no soil pH') });
    expect(limeForSoilTest({ soilPh: 5.4, bufferPh: 6.4 }, [{ speciesId: '', share: 1 }])).toMatchObject({ ok: false, reason: expect.stringContaining('choose the blend') });
    expect(limeForSoilTest({ soilPh: 6.7 }, clover)).toMatchObject({ ok: true, tonsPerAcre: 0 });
  });
});
