import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseSoilTestCsv, SoilTestCsvError } from '@/lib/soil-tests/csv';
import { soilTestValuesSchema } from '@/lib/validations/soil-test';

const fixture = (name: string) => readFileSync(path.resolve(__dirname, '../../fixtures/soil-tests', name), 'utf8');

function refusal(text: string): string {
  try {
    parseSoilTestCsv(text);
  } catch (error) {
    expect(error).toBeInstanceOf(SoilTestCsvError);
    return (error as Error).message;
  }
  throw new Error('the CSV was accepted');
}

describe('parseSoilTestCsv', () => {
  it('reads a header row over one sample, with units stated in the headers', () => {
    const values = parseSoilTestCsv(fixture('lab-report.csv'));
    expect(values).toEqual({
      sampledOn: '2027-03-14',
      labName: 'Prairie Soil Lab',
      ph: 5.6,
      bufferPh: 6.4,
      bufferMethod: 'smp', // the header says "Buffer pH (SMP)"
      pPpm: 18,
      kPpm: 95,
      organicMatterPct: 3.1,
      limeTonsPerAcre: 2,
      nLbPerAcre: 40,
      p2o5LbPerAcre: 60,
      k2oLbPerAcre: 90,
      recommendation: 'Lime to pH 6.5, then topdress.',
    });
    // What the parser gives passes the same schema the form and the route use.
    expect(soilTestValuesSchema.safeParse(values).success).toBe(true);
  });

  it('converts lb/acre and lb/1000 sq ft to the stored units', () => {
    const values = parseSoilTestCsv(fixture('lab-report-lb.csv'));
    // lb/acre of P or K = ppm × 2: the 2,000,000-lb acre furrow slice US reports assume (common practice, no source).
    expect(values.pPpm).toBe(22);
    expect(values.kPpm).toBe(130);
    // 1 acre = 43,560 ft² (NIST HB 44 App. C); 1 short ton = 2,000 lb. 92 lb/1000 ft² × 43.56 = 4,007.52 lb/acre = 2.00376 t/acre.
    expect(values.limeTonsPerAcre).toBeCloseTo(2.00376, 6);
    expect(values.nLbPerAcre).toBeCloseTo(43.56, 6);
    expect(values).toMatchObject({ ph: 6.1, bufferPh: 6.8, organicMatterPct: 2.4, p2o5LbPerAcre: 30, k2oLbPerAcre: 45 });
  });

  it('reads two columns of name and value', () => {
    expect(parseSoilTestCsv(fixture('lab-report-vertical.csv'))).toEqual({ ph: 6.3, pPpm: 31, kPpm: 140, organicMatterPct: 4, limeTonsPerAcre: 0 });
  });

  it('accepts common header spellings', () => {
    const values = parseSoilTestCsv('Water pH,Mehlich 3 P,Exch K,Organic Matter,Aglime (t/ac),Potash\n5.9,12,88,2.2,1.5,120');
    expect(values).toEqual({ ph: 5.9, pPpm: 12, kPpm: 88, organicMatterPct: 2.2, limeTonsPerAcre: 1.5, k2oLbPerAcre: 120 });
  });

  it('reads the North Carolina lab’s acidity (Ac) and which buffer the buffer pH came from', () => {
    // NCDA&CS reports Ac in meq/100 cm³ beside a Mehlich buffer pH; Ac = (6.6 − 6.3) × 4 = 1.2 for this sample.
    const nc = parseSoilTestCsv('pH,Mehlich buffer pH,Ac,P,K\n5.2,6.3,1.2,40,80');
    expect(nc).toEqual({ ph: 5.2, bufferPh: 6.3, bufferMethod: 'mehlich', acidityMeq: 1.2, pPpm: 40, kPpm: 80 });
    expect(soilTestValuesSchema.safeParse(nc).success).toBe(true);
    expect(parseSoilTestCsv('pH,SMP buffer pH,P,K\n5.6,6.4,20,100')).toMatchObject({ bufferMethod: 'smp' });
    expect(parseSoilTestCsv('pH,Buffer pH,P,K\n5.6,6.4,20,100').bufferMethod).toBeUndefined();
  });

  it('names a missing column', () => {
    expect(refusal('pH,K (ppm)\n6.0,120')).toMatch(/no phosphorus \(P\) column/);
    expect(refusal('P,K\n20,120')).toMatch(/no soil pH column .*“pH”/);
  });

  it('names a bad value, a unit it does not read, a doubled column and an empty value', () => {
    expect(refusal('pH,P,K\nsix,20,120')).toMatch(/“pH” value “six” is not a number/);
    expect(refusal('pH,P (kg/ha),K\n6,20,120')).toMatch(/“P \(kg\/ha\)” column is in kg\/ha/);
    expect(refusal('pH,P (%),K\n6,20,120')).toMatch(/“P \(%\)” column is in %; phosphorus \(P\) must be in ppm/);
    expect(refusal('pH,Soil pH,P,K\n6,6.1,20,120')).toMatch(/two soil pH columns/);
    expect(refusal('pH,P,K\n,20,120')).toMatch(/“pH” column has no value/);
    expect(refusal('pH,P,K,Date sampled\n6,20,120,14 March')).toMatch(/“Date sampled” value “14 March” is not a date/);
  });

  it('refuses an empty file, a header alone and several samples', () => {
    expect(refusal('')).toMatch(/empty/);
    expect(refusal('pH,P,K\n')).toMatch(/header row and a row of results/);
    expect(refusal('pH,P,K\n6,20,120\n6.2,22,130')).toMatch(/holds 2 samples/);
  });
});
