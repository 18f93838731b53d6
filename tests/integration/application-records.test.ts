// Application records over real HTTP with real sessions: create, list with filters, corrections that keep the
// original (the database's own trigger refuses an UPDATE), refusals that write nothing, what a viewer may do,
// the draft a spray step suggests (plan + stored forecast), and the CSV export read back with papaparse.
// Sources: NIST SP 811 B.8–B.9 (1 mi = 1.609344 km; t/°F = 1.8 t/°C + 32); RFC 6266 (Content-Disposition);
// the local time of an instant from the runtime's ICU zone data (Intl), not project code.
import { randomInt } from 'node:crypto';
import { sql } from 'kysely';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { storeForecast } from '@/lib/data/forecasts';
import type { ForecastHour } from '@/lib/schedule/types';
import { gridCellKey } from '@/lib/weather/grid';
import { testDb } from '../support/db';
import { addMember, createPlot, createProperty, signedInUser, type Client } from '../support/http';

const TIME_ZONE = 'America/Chicago';
const HOUR_MS = 3_600_000;
const db = testDb();

let owner: Client;
let member: Client;
let viewer: Client;
let propertyId: string;
let plot: { id: string; name: string };
let otherPlot: { id: string; name: string };
let sprayStepId: string;

const localDate = (ms: number) => new Intl.DateTimeFormat('en-CA', { timeZone: TIME_ZONE, year: 'numeric', month: '2-digit', day: '2-digit' }).format(ms);
const localTime = (ms: number) => new Intl.DateTimeFormat('en-GB', { timeZone: TIME_ZONE, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).format(ms);
const plusDays = (date: string, days: number) => new Date(Date.parse(`${date}T12:00:00Z`) + days * 86_400_000).toISOString().slice(0, 10);

/** 48 hours around now: 16 °C, 60 % RH, wind 10 km/h at every hour. */
function flatHours(nowMs: number): ForecastHour[] {
  const start = Math.floor(nowMs / HOUR_MS) * HOUR_MS - 24 * HOUR_MS;
  return Array.from({ length: 48 }, (_, i) => ({
    time: new Date(start + i * HOUR_MS).toISOString(),
    rainMm: 0,
    rainProbabilityPct: 5,
    airTempC: 16,
    relativeHumidityPct: 60,
    windKmh: 10,
  }));
}

const record = (over: Record<string, unknown> = {}) => ({
  kind: 'herbicide',
  plotId: plot.id,
  appliedOn: '2026-05-04',
  appliedTime: '08:15',
  areaAcres: 0.5,
  site: 'Wildlife food plot',
  productName: 'Glyphosate 41% (generic)',
  epaRegNo: '524-445',
  activeIngredientPct: 41,
  rateValue: 48,
  rateUnit: 'fl oz/acre',
  totalProductValue: 24,
  totalProductUnit: 'fl oz',
  waterGal: 7.3125,
  sprayer: '25 gal tank at 15 gal/acre',
  applicatorName: 'Pat Field',
  windMph: 4.5,
  windDirection: 'SW',
  airTempF: 71.2,
  humidityPct: 58,
  weatherSource: 'entered',
  notes: 'Edges first, "careful" by the creek,\nthen the middle; café',
  ...over,
});

const countRecords = async () =>
  Number((await db.selectFrom('application_records').select((eb) => eb.fn.countAll<string>().as('n')).where('property_id', '=', propertyId).executeTakeFirstOrThrow()).n);

/** The stored row as PostgreSQL itself prints it: compared byte for byte. */
const rowText = async (id: string) =>
  (await sql<{ t: string }>`select row_to_json(r)::text as t from application_records r where id = ${id}`.execute(db)).rows[0]?.t;

beforeAll(async () => {
  const o = await signedInUser('records-owner');
  const m = await signedInUser('records-member');
  const v = await signedInUser('records-viewer');
  owner = o.client;
  member = m.client;
  viewer = v.client;
  const place = { latitude: 40 + randomInt(0, 800) / 100, longitude: -(95 + randomInt(0, 1000) / 100) };
  const property = await createProperty(owner, { ...place, timeZone: TIME_ZONE });
  propertyId = property.id;
  await addMember(owner, propertyId, m, 'member');
  await addMember(owner, propertyId, v, 'viewer');
  plot = await createPlot(owner, propertyId, { acres: 0.5 });
  otherPlot = await createPlot(owner, propertyId, { acres: 1.25 });
  const nowMs = Date.now();
  await storeForecast({
    gridKey: gridCellKey(place.latitude, place.longitude),
    ...place,
    provider: 'open-meteo',
    forecast: { timeZone: TIME_ZONE, fetchedAt: new Date(nowMs - HOUR_MS).toISOString(), hours: flatHours(nowMs) },
  });
  const planted = await owner.post(`/api/plots/${plot.id}/plantings`, {
    season: 'fall',
    method: 'spray-and-seed',
    blend: [{ speciesId: 'white-clover', share: 1 }],
    targetSeedDate: plusDays(localDate(nowMs), 20),
    herbicide: { productName: 'Glyphosate 41% (generic)', activeIngredientPct: 41, rateKind: 'fl-oz-per-acre', rate: 48 },
    sprayer: { tankGal: 25, carrierGalPerAcre: 15 },
  });
  expect(planted.status, planted.text).toBe(201);
  sprayStepId = planted.body.steps.find((s: { kind: string }) => s.kind === 'spray').id;
});

afterAll(async () => {
  await db.destroy();
});

describe('application records', () => {
  it('a member records an application; everyone on the property lists it; the filters narrow the list', async () => {
    const created = await member.post(`/api/properties/${propertyId}/records`, record());
    expect(created.status, created.text).toBe(201);
    const r = created.body.record;
    // 08:15 on 4 May in Chicago is daylight time, UTC−5 (IANA tz database): 13:15 UTC.
    expect(r).toMatchObject({ plotName: plot.name, appliedOn: '2026-05-04', appliedTime: '08:15', appliedAt: '2026-05-04T13:15:00.000Z', timeZone: TIME_ZONE, supersededBy: null });
    const lime = await owner.post(`/api/properties/${propertyId}/records`, record({
      kind: 'lime', plotId: otherPlot.id, appliedOn: '2026-04-10', productName: 'Agricultural lime', epaRegNo: undefined,
      activeIngredientPct: undefined, rateValue: 2, rateUnit: 'tons/acre', totalProductValue: 5000, totalProductUnit: 'lb', waterGal: undefined,
    }));
    expect(lime.status, lime.text).toBe(201);

    const all = await viewer.get(`/api/properties/${propertyId}/records`);
    expect(all.status).toBe(200);
    const ids = (res: { body: { records: { id: string }[] } }) => res.body.records.map((x) => x.id);
    expect(ids(all)).toEqual(expect.arrayContaining([r.id, lime.body.record.id]));
    expect(ids(await viewer.get(`/api/properties/${propertyId}/records?plot=${otherPlot.id}`))).toEqual([lime.body.record.id]);
    expect(ids(await viewer.get(`/api/properties/${propertyId}/records?kind=herbicide`))).not.toContain(lime.body.record.id);
    expect(ids(await viewer.get(`/api/properties/${propertyId}/records?product=GLYPHOSATE`))).toContain(r.id);
    expect(ids(await viewer.get(`/api/properties/${propertyId}/records?product=100%25`))).toEqual([]);
    expect(ids(await viewer.get(`/api/properties/${propertyId}/records?from=2026-05-01&to=2026-05-31`))).toContain(r.id);
    expect(ids(await viewer.get(`/api/properties/${propertyId}/records?from=2026-05-01&to=2026-05-31`))).not.toContain(lime.body.record.id);
    const bad = await viewer.get(`/api/properties/${propertyId}/records?from=2026-06-01&to=2026-05-01`);
    expect(bad.status).toBe(400);
    expect(bad.body.fields.from).toMatch(/from date/);

    const one = await viewer.get(`/api/records/${r.id}`);
    expect(one.status).toBe(200);
    expect(one.body.record.id).toBe(r.id);
  });

  it('a correction is a new record; the original stays byte for byte and is marked; the database refuses an UPDATE', async () => {
    const original = (await member.post(`/api/properties/${propertyId}/records`, record({ rateValue: 32, totalProductValue: 16 }))).body.record;
    const before = await rowText(original.id);
    const fixed = await member.post(`/api/records/${original.id}/corrections`, record({ correctionReason: 'The rate was 48 fl oz/acre, not 32' }));
    expect(fixed.status, fixed.text).toBe(201);
    expect(fixed.body.record).toMatchObject({ supersedesId: original.id, correctionReason: 'The rate was 48 fl oz/acre, not 32', rateValue: 48 });
    expect(await rowText(original.id)).toBe(before);
    const listed = (await viewer.get(`/api/properties/${propertyId}/records`)).body.records as { id: string; supersededBy: { id: string } | null }[];
    expect(listed.find((x) => x.id === original.id)?.supersededBy?.id).toBe(fixed.body.record.id);
    expect(listed.find((x) => x.id === fixed.body.record.id)?.supersededBy).toBeNull();

    await expect(sql`update application_records set notes = 'silently changed' where id = ${original.id}`.execute(db)).rejects.toThrow(/cannot be changed/);
    expect(await rowText(original.id)).toBe(before);

    const twice = await owner.post(`/api/records/${original.id}/corrections`, record({ correctionReason: 'again' }));
    expect(twice.status).toBe(409);
    expect(twice.body.error).toMatch(/already been corrected/);
    // The correction itself may be corrected in turn.
    const chain = await owner.post(`/api/records/${fixed.body.record.id}/corrections`, record({ correctionReason: 'Applicator was someone else', applicatorName: 'Sam Ridge' }));
    expect(chain.status, chain.text).toBe(201);
  });

  it('bad input is refused with the field named, and nothing is written', async () => {
    const before = await countRecords();
    const cases: [Record<string, unknown>, string, RegExp][] = [
      [record({ productName: '' }), 'productName', /Product name is required/],
      [record({ areaAcres: -1 }), 'areaAcres', /Area treated/],
      [record({ restrictedUse: true }), 'applicatorLicense', /certified applicator/],
      [record({ restrictedUse: true, applicatorLicense: 'C-1', epaRegNo: undefined }), 'epaRegNo', /EPA registration number/],
      [record({ plotId: '00000000-0000-4000-8000-000000000000' }), 'plotId', /one of this property/],
      [record({ appliedOn: plusDays(localDate(Date.now()), 3) }), 'appliedOn', /future/],
      [record({ stepId: sprayStepId, plotId: otherPlot.id }), 'stepId', /step of this plot/],
      [record({ stepId: sprayStepId, kind: 'lime', rateUnit: 'tons/acre', epaRegNo: undefined }), 'kind', /spray step/],
    ];
    for (const [body, field, message] of cases) {
      const res = await member.post(`/api/properties/${propertyId}/records`, body);
      expect(res.status, `${field}: ${res.text}`).toBe(400);
      expect(res.body.fields?.[field], field).toMatch(message);
    }
    const some = (await viewer.get(`/api/properties/${propertyId}/records`)).body.records[0];
    const noReason = await member.post(`/api/records/${some.id}/corrections`, record());
    expect(noReason.status).toBe(400);
    expect(noReason.body.fields.correctionReason).toBe('Reason for the correction is required');
    expect(await countRecords()).toBe(before);
  });

  it('a viewer reads and exports but may not record or correct', async () => {
    const some = (await viewer.get(`/api/properties/${propertyId}/records`)).body.records[0];
    const before = await countRecords();
    expect((await viewer.post(`/api/properties/${propertyId}/records`, record())).status).toBe(403);
    expect((await viewer.post(`/api/records/${some.id}/corrections`, record({ correctionReason: 'mine' }))).status).toBe(403);
    expect((await viewer.get(`/api/properties/${propertyId}/records/export`)).status).toBe(200);
    expect(await countRecords()).toBe(before);
  });

  it('a spray step suggests a record: the plan’s product, rate and totals, the plot’s acres, the forecast’s weather', async () => {
    expect((await viewer.get(`/api/steps/${sprayStepId}/record-draft`)).status).toBe(403);
    const at = new Date(Math.floor(Date.now() / HOUR_MS) * HOUR_MS - 2 * HOUR_MS);
    const res = await member.get(`/api/steps/${sprayStepId}/record-draft?at=${at.toISOString()}`);
    expect(res.status, res.text).toBe(200);
    const d = res.body.draft;
    // 0.5 acre × 48 fl oz/acre = 24 fl oz; 0.5 × 15 gal/acre = 7.5 gal of spray, less 24/128 gal of product
    // (128 fl oz = 1 US gal, NIST Handbook 44 Appendix C) = 7.3125 gal of water (arithmetic).
    expect(d).toMatchObject({
      kind: 'herbicide', plotId: plot.id, stepId: sprayStepId, areaAcres: 0.5, productName: 'Glyphosate 41% (generic)', activeIngredientPct: 41,
      rateValue: 48, rateUnit: 'fl oz/acre', totalProductValue: 24, totalProductUnit: 'fl oz', waterGal: 7.31, weatherSource: 'forecast',
      appliedOn: localDate(at.getTime()), appliedTime: localTime(at.getTime()),
    });
    // 10 km/h ÷ 1.609344 = 6.21 mph; 16 °C × 1.8 + 32 = 60.8 °F (NIST SP 811 B.8, B.9).
    expect([d.windMph, d.airTempF, d.humidityPct]).toEqual([6.2, 60.8, 60]);
    expect(res.body.cautions.map((c: { text: string }) => c.text).join(' ')).toMatch(/label is the law.*certified applicator/s);

    const far = await member.get(`/api/steps/${sprayStepId}/record-draft?at=${new Date(Date.now() - 5 * 86_400_000).toISOString()}`);
    expect(far.body.draft.weatherSource).toBeNull();
    expect(far.body.weather).toBeNull();
    expect((await member.get(`/api/steps/${sprayStepId}/record-draft?at=yesterday`)).status).toBe(400);

    // Saved as drafted, the record keeps its step and says its weather came from the forecast.
    const { plotName: _p, ...body } = d;
    const saved = await member.post(`/api/properties/${propertyId}/records`, { ...body, windDirection: undefined });
    expect(saved.status, saved.text).toBe(201);
    expect(saved.body.record).toMatchObject({ stepId: sprayStepId, weatherSource: 'forecast', windMph: 6.2 });
  });

  it('the CSV export round-trips through papaparse with every field equal to what is stored', async () => {
    const res = await viewer.get(`/api/properties/${propertyId}/records/export`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/csv/);
    // RFC 6266: an attachment with a file name.
    expect(res.headers.get('content-disposition')).toMatch(/^attachment; filename="sowcast-records-.+\.csv"$/);
    const parsed = Papa.parse<Record<string, string>>(res.text, { header: true, skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const rows = await db.selectFrom('application_records').selectAll().where('property_id', '=', propertyId).execute();
    expect(parsed.data).toHaveLength(rows.length);
    const correctedBy = new Map(rows.filter((r) => r.supersedes_id).map((r) => [r.supersedes_id!, r.id]));
    const users = new Map((await db.selectFrom('users').select(['id', 'name']).execute()).map((u) => [u.id, u.name]));
    const text = (v: string | null) => v ?? '';
    const number = (v: number | null) => (v === null ? '' : v);
    for (const row of rows) {
      const csv = parsed.data.find((c) => c.record_id === row.id)!;
      expect(csv, row.id).toBeDefined();
      const appliedMs = new Date(row.applied_at).getTime();
      const expected: Record<string, string | number> = {
        record_id: row.id,
        status: correctedBy.has(row.id) ? 'corrected' : 'current',
        supersedes_record_id: text(row.supersedes_id),
        correction_reason: text(row.correction_reason),
        corrected_by_record_id: correctedBy.get(row.id) ?? '',
        kind: row.kind,
        applied_at_utc: new Date(row.applied_at).toISOString(),
        applied_date_local: row.applied_on,
        applied_time_local: localTime(appliedMs),
        time_zone: row.time_zone,
        plot: row.plot_name,
        plot_id: text(row.plot_id),
        location: text(row.location),
        crop_or_site: text(row.site),
        area_acres: row.area_acres,
        product_name: row.product_name,
        epa_reg_no: text(row.epa_reg_no),
        restricted_use: String(row.restricted_use),
        active_ingredient_pct: number(row.active_ingredient_pct),
        rate_value: row.rate_value,
        rate_unit: row.rate_unit,
        total_product_value: row.total_product_value,
        total_product_unit: row.total_product_unit,
        water_gal: number(row.water_gal),
        sprayer: text(row.sprayer),
        applicator_name: row.applicator_name,
        applicator_certification_no: text(row.applicator_license),
        wind_mph: number(row.wind_mph),
        wind_direction: text(row.wind_direction),
        air_temp_f: number(row.air_temp_f),
        humidity_pct: number(row.humidity_pct),
        weather_source: text(row.weather_source),
        notes: text(row.notes),
        recorded_by: row.recorded_by ? users.get(row.recorded_by)! : '',
        recorded_at_utc: new Date(row.recorded_at).toISOString(),
      };
      const actual: Record<string, string | number> = {};
      for (const [key, value] of Object.entries(expected)) actual[key] = typeof value === 'number' ? Number(csv[key]) : csv[key];
      expect(actual, row.id).toEqual(expected);
      // The local ISO time with its offset names the same instant.
      expect(Date.parse(csv.applied_at_local)).toBe(appliedMs);
      expect(Object.keys(csv).sort()).toEqual([...Object.keys(expected), 'applied_at_local'].sort());
    }
    // A filtered export holds only what the same filter lists.
    const limed = Papa.parse<Record<string, string>>((await viewer.get(`/api/properties/${propertyId}/records/export?kind=lime`)).text, { header: true, skipEmptyLines: true });
    expect(limed.data.map((r) => r.kind)).toEqual(['lime']);
  });
});
