import { readFileSync } from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { boundaryAcres, parseBoundary } from '@/lib/geo/boundary';
import { addMember, createPlot, createProperty, signedInUser, type Client } from '../support/http';
import { testDb } from '../support/db';
import { fileExists, fileForm, orphanFiles, sendForm, uploadRowCount } from './upload-helpers';

// POST/GET/DELETE /api/plots/[plotId]/boundary over real HTTP: the outline and its acres are stored with the
// raw file, and every refused upload leaves no row and no file behind.
const FIXTURES = path.resolve(__dirname, '../fixtures/boundaries');
const fixture = (name: string) => readFileSync(path.join(FIXTURES, name), 'utf8');
const db = testDb();
let owner: Client;
let viewer: Client;
let plotId: string;

beforeAll(async () => {
  owner = (await signedInUser('boundary-owner')).client;
  const v = await signedInUser('boundary-viewer');
  viewer = v.client;
  const property = await createProperty(owner);
  await addMember(owner, property.id, v, 'viewer');
  plotId = (await createPlot(owner, property.id, { acres: 0.75 })).id;
});

afterAll(async () => {
  await db.destroy();
});

describe('plot boundary uploads', () => {
  it('stores a GPX track: the outline, its acres and the raw file; a viewer can read it', async () => {
    const rowsBefore = await uploadRowCount(db, plotId);
    const res = await sendForm(owner, `/api/plots/${plotId}/boundary`, fileForm('field.gpx', fixture('field.gpx'), 'application/gpx+xml'));
    expect(res.status, res.text).toBe(201);
    // The same module the unit tests check against @turf/area and a hand-worked rectangle.
    const expected = boundaryAcres(parseBoundary(fixture('field.gpx'), 'field.gpx'));
    expect(res.body.boundary.acres).toBeCloseTo(expected, 9);
    expect(res.body.boundary.plotAcres).toBe(0.75);
    expect(res.body.boundary.feature.geometry.type).toBe('Polygon');
    expect(await uploadRowCount(db, plotId)).toBe(rowsBefore + 1);

    const plot = await db.selectFrom('plots').selectAll().where('id', '=', plotId).executeTakeFirstOrThrow();
    expect(plot.boundary_acres).toBeCloseTo(expected, 9);
    const upload = await db.selectFrom('uploads').selectAll().where('id', '=', plot.boundary_upload_id!).executeTakeFirstOrThrow();
    expect(upload).toMatchObject({ kind: 'boundary', plot_id: plotId, filename: 'field.gpx', content_type: 'application/gpx+xml' });
    expect(fileExists(upload.storage_key)).toBe(true);

    const read = await viewer.get(`/api/plots/${plotId}/boundary`);
    expect(read.status).toBe(200);
    expect(read.body.boundary.acres).toBeCloseTo(expected, 9);
    expect(read.body.boundary.upload.filename).toBe('field.gpx');
  });

  it('replacing the outline keeps one file per plot; the KML of the same field gives the same acres within 0.01%', async () => {
    const first = (await owner.get(`/api/plots/${plotId}/boundary`)).body.boundary;
    const firstKey = (await db.selectFrom('uploads').select('storage_key').where('id', '=', first.upload.id).executeTakeFirstOrThrow()).storage_key;
    const rowsBefore = await uploadRowCount(db, plotId);
    const res = await sendForm(owner, `/api/plots/${plotId}/boundary`, fileForm('field.kml', fixture('field.kml')));
    expect(res.status, res.text).toBe(201);
    expect(Math.abs(res.body.boundary.acres - first.acres) / first.acres).toBeLessThan(1e-4);
    expect(await uploadRowCount(db, plotId)).toBe(rowsBefore);
    expect(fileExists(firstKey)).toBe(false);
  });

  it('offers the acres as the plot’s size through PATCH /api/plots/[plotId]', async () => {
    const { acres } = (await owner.get(`/api/plots/${plotId}/boundary`)).body.boundary;
    const rounded = Math.round(acres * 100) / 100;
    const res = await owner.patch(`/api/plots/${plotId}`, { acres: rounded });
    expect(res.status).toBe(200);
    expect((await owner.get(`/api/plots/${plotId}/boundary`)).body.boundary.plotAcres).toBe(rounded);
  });

  it('refuses every bad file with a message naming the file field, and writes nothing', async () => {
    const before = { rows: await uploadRowCount(db, plotId), orphans: await orphanFiles(db), plot: await db.selectFrom('plots').selectAll().where('id', '=', plotId).executeTakeFirstOrThrow() };
    const cases: [FormData, number, RegExp][] = [
      [fileForm('truncated.gpx', fixture('truncated.gpx')), 400, /not well-formed XML/],
      [fileForm('malformed.kml', fixture('malformed.kml')), 400, /not well-formed XML/],
      [fileForm('entity-bomb.gpx', fixture('entity-bomb.gpx')), 400, /DOCTYPE or XML entities/],
      [fileForm('self-crossing.geojson', fixture('self-crossing.geojson')), 400, /crosses itself/],
      [fileForm('two-points.gpx', fixture('two-points.gpx')), 400, /at least three/],
      [fileForm('empty.gpx', ''), 400, /empty/],
      [fileForm('not-geojson.json', fixture('not-geojson.json')), 400, /not GeoJSON/],
      [fileForm('field.png', new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0xff, 0xfe])), 400, /GPX \(\.gpx\), KML|not a text file/],
      [fileForm('huge.gpx', `<gpx>${' '.repeat(2 * 1024 * 1024 + 10)}</gpx>`), 413, /larger than 2 MB/],
      [new FormData(), 400, /Choose a file/],
    ];
    for (const [form, status, message] of cases) {
      const res = await sendForm(owner, `/api/plots/${plotId}/boundary`, form);
      expect(res.status, res.text).toBe(status);
      expect(res.body.error).toMatch(message);
      if (status !== 413 && res.body.fields) expect(res.body.fields.file).toBe(res.body.error);
    }
    // Not multipart at all.
    const json = await owner.post(`/api/plots/${plotId}/boundary`, { file: 'field.gpx' });
    expect(json.status).toBe(415);
    expect(await uploadRowCount(db, plotId)).toBe(before.rows);
    expect(await orphanFiles(db)).toEqual(before.orphans);
    const plot = await db.selectFrom('plots').selectAll().where('id', '=', plotId).executeTakeFirstOrThrow();
    expect(plot).toEqual(before.plot);
  });

  it('a viewer cannot upload or clear (403) and nothing is written', async () => {
    const rows = await uploadRowCount(db, plotId);
    const orphans = await orphanFiles(db);
    expect((await sendForm(viewer, `/api/plots/${plotId}/boundary`, fileForm('field.gpx', fixture('field.gpx')))).status).toBe(403);
    expect((await viewer.delete(`/api/plots/${plotId}/boundary`)).status).toBe(403);
    expect(await uploadRowCount(db, plotId)).toBe(rows);
    expect(await orphanFiles(db)).toEqual(orphans);
  });

  it('DELETE clears the outline and removes its file; the plot keeps its acres', async () => {
    const rows = await uploadRowCount(db, plotId);
    const { boundary } = (await owner.get(`/api/plots/${plotId}/boundary`)).body;
    const key = (await db.selectFrom('uploads').select('storage_key').where('id', '=', boundary.upload.id).executeTakeFirstOrThrow()).storage_key;
    const acresBefore = (await db.selectFrom('plots').select('acres').where('id', '=', plotId).executeTakeFirstOrThrow()).acres;
    expect((await owner.delete(`/api/plots/${plotId}/boundary`)).status).toBe(204);
    expect((await owner.get(`/api/plots/${plotId}/boundary`)).body).toEqual({ boundary: null });
    expect(await uploadRowCount(db, plotId)).toBe(rows - 1);
    expect(fileExists(key)).toBe(false);
    const plot = await db.selectFrom('plots').selectAll().where('id', '=', plotId).executeTakeFirstOrThrow();
    expect(plot).toMatchObject({ boundary: null, boundary_acres: null, boundary_upload_id: null, acres: acresBefore });
  });
});
