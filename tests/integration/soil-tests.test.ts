import { readFileSync } from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addMember, createPlot, createProperty, signedInUser, type Client } from '../support/http';
import { testDb } from '../support/db';
import { fileExists, fileForm, orphanFiles, sendForm, uploadRowCount } from './upload-helpers';

// POST/GET /api/plots/[plotId]/soil-tests: a PDF or picture is stored as it is (type from its bytes, by
// file-type), a lab CSV is read for its values; every refusal leaves no row and no file.
const csv = (name: string) => readFileSync(path.resolve(__dirname, '../fixtures/soil-tests', name), 'utf8');
// The smallest well-formed PDF header and trailer file-type recognises (ISO 32000-1 §7.5.2: "%PDF-1.n").
const PDF = new TextEncoder().encode('%PDF-1.4\n1 0 obj << /Type /Catalog >> endobj\ntrailer << /Root 1 0 R >>\n%%EOF\n');
// A PNG header alone (ISO/IEC 15948 §5.2 signature and an IHDR chunk start): file-type calls it a PNG, but
// there is no picture in it to re-encode.
const PNG_HEADER_ONLY = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52, 0, 0, 0, 1, 0, 0, 0, 1, 8, 2, 0, 0, 0]);
const picture = (width: number, height: number) => sharp({ create: { width, height, channels: 3, background: { r: 240, g: 236, b: 220 } } });
const storedBytes = (storageKey: string) => new Uint8Array(readFileSync(path.join(process.env.SOWCAST_DATA_DIR!, 'uploads', storageKey)));
// A ZIP local file header (PKWARE APPNOTE §4.3.7), which file-type names application/zip.
const ZIP = new Uint8Array([0x50, 0x4b, 0x03, 0x04, 0x14, 0, 0, 0, 8, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 0]);

const db = testDb();
let owner: Client;
let viewer: Client;
let plotId: string;

beforeAll(async () => {
  owner = (await signedInUser('soil-owner')).client;
  const v = await signedInUser('soil-viewer');
  viewer = v.client;
  const property = await createProperty(owner);
  await addMember(owner, property.id, v, 'viewer');
  plotId = (await createPlot(owner, property.id)).id;
});

afterAll(async () => {
  await db.destroy();
});

describe('soil-test uploads', () => {
  it('reads a lab CSV into a soil test and keeps the file', async () => {
    const res = await sendForm(owner, `/api/plots/${plotId}/soil-tests`, fileForm('lab-report.csv', csv('lab-report.csv'), 'text/csv'));
    expect(res.status, res.text).toBe(201);
    expect(res.body.soilTest).toMatchObject({
      plotId, sampledOn: '2027-03-14', labName: 'Prairie Soil Lab', ph: 5.6, bufferPh: 6.4, pPpm: 18, kPpm: 95, organicMatterPct: 3.1,
      limeTonsPerAcre: 2, nLbPerAcre: 40, p2o5LbPerAcre: 60, k2oLbPerAcre: 90, bufferMethod: 'smp', acidityMeq: null,
    });
    expect(res.body.soilTest.file).toMatchObject({ filename: 'lab-report.csv', contentType: 'text/csv' });
    expect(res.body.soilTest.file.url).toBe(`/api/uploads/${res.body.soilTest.file.uploadId}`);
    const upload = await db.selectFrom('uploads').selectAll().where('id', '=', res.body.soilTest.file.uploadId).executeTakeFirstOrThrow();
    expect(upload).toMatchObject({ kind: 'soil-test', plot_id: plotId });
    expect(fileExists(upload.storage_key)).toBe(true);
  });

  it('stores a PDF as it is, with the values typed beside it, and a PNG', async () => {
    const pdf = await sendForm(
      owner,
      `/api/plots/${plotId}/soil-tests`,
      fileForm('report.pdf', PDF, 'application/octet-stream', { ph: '6.2', limeTonsPerAcre: '1', sampledOn: '2028-02-01', labName: 'Ridge lab', bufferPh: '6.3', bufferMethod: 'mehlich', acidityMeq: '1.2' }),
    );
    expect(pdf.status, pdf.text).toBe(201);
    expect(pdf.body.soilTest).toMatchObject({ ph: 6.2, limeTonsPerAcre: 1, sampledOn: '2028-02-01', pPpm: null, bufferPh: 6.3, bufferMethod: 'mehlich', acidityMeq: 1.2 });
    // The type comes from the bytes, not from the browser's claim.
    expect(pdf.body.soilTest.file.contentType).toBe('application/pdf');
    const png = await sendForm(owner, `/api/plots/${plotId}/soil-tests`, fileForm('photo-of-report.png', new Uint8Array(await picture(40, 30).png().toBuffer()), 'image/png'));
    expect(png.status, png.text).toBe(201);
    expect(png.body.soilTest.file.contentType).toBe('image/png');
    // A PDF is not rewritten: the stored bytes are the lab's.
    const pdfRow = await db.selectFrom('uploads').select('storage_key').where('id', '=', pdf.body.soilTest.file.uploadId).executeTakeFirstOrThrow();
    expect(Buffer.from(storedBytes(pdfRow.storage_key)).equals(Buffer.from(PDF))).toBe(true);
  });

  it('drops the EXIF of a photographed report (GPS position of the field), as photos do, and keeps it legible', async () => {
    // EXIF GPS IFD (CIPA DC-008, "GPS Info IFD"): latitude as three rationals; Orientation 6 = rotated 90° clockwise.
    const sent = await picture(120, 60)
      .jpeg()
      .withExif({ IFD0: { Artist: 'Field phone' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '36/1 24/1 36/1' } })
      .withMetadata({ orientation: 6 })
      .toBuffer();
    const before = await sharp(sent).metadata();
    expect(before.exif).toBeDefined();
    expect(sent.includes(Buffer.from('Field phone'))).toBe(true);
    const res = await sendForm(owner, `/api/plots/${plotId}/soil-tests`, fileForm('IMG_0420.JPG', new Uint8Array(sent), 'image/jpeg', { ph: '6.0' }));
    expect(res.status, res.text).toBe(201);
    expect(res.body.soilTest.file.contentType).toBe('image/jpeg');
    const row = await db.selectFrom('uploads').select(['storage_key', 'size_bytes', 'sha256']).where('id', '=', res.body.soilTest.file.uploadId).executeTakeFirstOrThrow();
    const kept = storedBytes(row.storage_key);
    const meta = await sharp(kept).metadata();
    expect(meta.format).toBe('jpeg');
    expect(meta.exif).toBeUndefined();
    expect(meta.orientation).toBeUndefined();
    expect(Buffer.from(kept).includes(Buffer.from('Field phone'))).toBe(false);
    // Full size, turned upright: the report stays readable.
    expect([meta.width, meta.height]).toEqual([60, 120]);
    expect(Number(row.size_bytes)).toBe(kept.byteLength);
  });

  it('lists the plot’s soil tests for a viewer, newest sample first', async () => {
    const res = await viewer.get(`/api/plots/${plotId}/soil-tests`);
    expect(res.status).toBe(200);
    const dated = res.body.soilTests.filter((t: { sampledOn: string | null }) => t.sampledOn).map((t: { sampledOn: string }) => t.sampledOn);
    expect(dated).toEqual(['2028-02-01', '2027-03-14']);
    expect(res.body.soilTests).toHaveLength(4);
  });

  it('refuses bad uploads with a message, and writes nothing', async () => {
    const rows = await uploadRowCount(db, plotId);
    const tests = await db.selectFrom('soil_tests').select('id').where('plot_id', '=', plotId).execute();
    const orphans = await orphanFiles(db);
    const cases: [FormData, number, RegExp][] = [
      [fileForm('archive.csv', ZIP), 415, /ZIP/],
      [fileForm('notes.txt', 'pH 6'), 415, /PDF, a JPEG or PNG picture, or the lab’s CSV/],
      [fileForm('lab.csv', 'pH,K (ppm)\n6.0,120'), 400, /no phosphorus \(P\) column/],
      [fileForm('lab.csv', 'pH,P,K\nsix,20,120'), 400, /“pH” value “six” is not a number/],
      [fileForm('lab.csv', 'pH,P,K\n12,20,120'), 400, /Soil pH must be at most 10/],
      [fileForm('report.pdf', PDF, 'application/pdf', { ph: 'acid' }), 400, /Soil pH must be a number/],
      [fileForm('report.pdf', PDF, 'application/pdf', { sampledOn: '2027-02-30' }), 400, /Sample date must be a real date/],
      [fileForm('empty.csv', ''), 400, /empty/],
      [fileForm('cut-short.png', PNG_HEADER_ONLY, 'image/png'), 400, /could not be read as a picture/],
      [fileForm('big.pdf', new Uint8Array(10 * 1024 * 1024 + 1)), 413, /larger than 10 MB/],
    ];
    for (const [form, status, message] of cases) {
      const res = await sendForm(owner, `/api/plots/${plotId}/soil-tests`, form);
      expect(res.status, res.text).toBe(status);
      expect(res.body.error).toMatch(message);
    }
    const typed = await sendForm(owner, `/api/plots/${plotId}/soil-tests`, fileForm('report.pdf', PDF, 'application/pdf', { ph: '11' }));
    expect(typed.body.fields.ph).toMatch(/Soil pH must be at most 10/);
    const method = await sendForm(owner, `/api/plots/${plotId}/soil-tests`, fileForm('report.pdf', PDF, 'application/pdf', { bufferMethod: 'woodruff' }));
    expect(method.status).toBe(400);
    expect(method.body.fields.bufferMethod).toMatch(/Buffer method: choose SMP or Mehlich/);
    expect((await sendForm(viewer, `/api/plots/${plotId}/soil-tests`, fileForm('lab-report.csv', csv('lab-report.csv')))).status).toBe(403);
    expect(await uploadRowCount(db, plotId)).toBe(rows);
    expect(await db.selectFrom('soil_tests').select('id').where('plot_id', '=', plotId).execute()).toEqual(tests);
    expect(await orphanFiles(db)).toEqual(orphans);
  });
});
