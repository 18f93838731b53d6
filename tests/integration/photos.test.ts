// Photos of a plot: the type is read from the bytes (file-type), the picture turned upright and stripped of
// its metadata (sharp), and only the property's people get the bytes back. Every refused upload writes
// nothing — no row and no file under $SOWCAST_DATA_DIR/uploads.
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addMember, baseUrl, Client, createPlot, createProperty, SESSION_COOKIE, signedInUser } from '../support/http';
import { testDb } from '../support/db';

const db = testDb();
type Person = Awaited<ReturnType<typeof signedInUser>>;
let owner: Person;
let member: Person;
let member2: Person;
let viewer: Person;
let outsider: Person;
let plotId: string;

beforeAll(async () => {
  [owner, member, member2, viewer, outsider] = await Promise.all(['ph-owner', 'ph-member', 'ph-member2', 'ph-viewer', 'ph-outsider'].map((p) => signedInUser(p)));
  const property = await createProperty(owner.client);
  plotId = (await createPlot(owner.client, property.id)).id;
  await addMember(owner.client, property.id, member, 'member');
  await addMember(owner.client, property.id, member2, 'member');
  await addMember(owner.client, property.id, viewer, 'viewer');
});

afterAll(async () => {
  await db.destroy();
});

async function send(client: Client, bytes: Uint8Array | string, name: string, type: string, fields: Record<string, string> = {}) {
  const form = new FormData();
  form.append('file', new Blob([bytes as BlobPart], { type }), name);
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  const headers: Record<string, string> = { accept: 'application/json' };
  if (client.address) headers['x-forwarded-for'] = client.address;
  const session = client.cookie(SESSION_COOKIE);
  if (session) headers.cookie = `${SESSION_COOKIE}=${session}`;
  const response = await fetch(`${baseUrl()}/api/plots/${plotId}/photos`, { method: 'POST', headers, body: form });
  const text = await response.text();
  return { status: response.status, body: text.startsWith('{') ? JSON.parse(text) : text };
}

async function fetchAs(client: Client, urlPath: string) {
  const headers: Record<string, string> = {};
  const session = client.cookie(SESSION_COOKIE);
  if (session) headers.cookie = `${SESSION_COOKIE}=${session}`;
  const response = await fetch(`${baseUrl()}${urlPath}`, { headers });
  return { status: response.status, headers: response.headers, bytes: new Uint8Array(await response.arrayBuffer()) };
}

const uploadsRoot = () => path.join(process.env.SOWCAST_DATA_DIR!, 'uploads');
function storedFiles(): string[] {
  if (!existsSync(uploadsRoot())) return [];
  return readdirSync(uploadsRoot(), { recursive: true, encoding: 'utf8' }).filter((f) => statSync(path.join(uploadsRoot(), f)).isFile());
}
const rowsOfPlot = async () =>
  Number((await db.selectFrom('uploads').select((eb) => eb.fn.countAll<string>().as('n')).where('plot_id', '=', plotId).executeTakeFirstOrThrow()).n);

/** Files no row names: what a refused or half-done upload would leave behind. Other test files upload at the same time, so a file must stay nameless for a while to count. */
async function orphanFiles(): Promise<string[]> {
  const nameless = async () => {
    const rows = await db.selectFrom('uploads').select(['storage_key', 'thumb_key']).execute();
    const keys = new Set(rows.flatMap((r) => [r.storage_key, r.thumb_key]).filter(Boolean));
    return storedFiles().filter((f) => !keys.has(f.split(path.sep).join('/')) && !f.endsWith('.part'));
  };
  const first = await nameless();
  if (!first.length) return [];
  await new Promise((r) => setTimeout(r, 1500));
  const again = new Set(await nameless());
  return first.filter((f) => again.has(f));
}

const image = (width: number, height: number) => sharp({ create: { width, height, channels: 3, background: '#3d7a3a' } });

describe('accepted photos', () => {
  it('JPEG, PNG and WebP are kept as upright 1280 px and 320 px WebP copies with a row each', async () => {
    const samples: [string, string, Uint8Array][] = [
      ['plot.jpg', 'image/jpeg', new Uint8Array(await image(1600, 1200).jpeg().toBuffer())],
      ['plot.png', 'image/png', new Uint8Array(await image(400, 300).png().toBuffer())],
      ['plot.webp', 'image/webp', new Uint8Array(await image(300, 200).webp().toBuffer())],
    ];
    for (const [name, type, bytes] of samples) {
      const res = await send(member.client, bytes, name, type, { caption: `A ${type}` });
      expect(res.status, JSON.stringify(res.body)).toBe(201);
      const row = await db.selectFrom('uploads').selectAll().where('id', '=', res.body.upload.id).executeTakeFirstOrThrow();
      expect(row).toMatchObject({ kind: 'photo', plot_id: plotId, content_type: 'image/webp', caption: `A ${type}`, uploaded_by: member.user.id });
      expect(row.filename).toBe(name.replace(/\.\w+$/, '.webp'));
      const served = await fetchAs(viewer.client, `/api/uploads/${row.id}`);
      expect(served.status).toBe(200);
      expect(served.bytes.byteLength).toBe(row.size_bytes);
      // SHA-256 (FIPS 180-4) of the served bytes is the row's.
      const { createHash } = await import('node:crypto');
      expect(createHash('sha256').update(served.bytes).digest('hex')).toBe(row.sha256);
      const meta = await sharp(served.bytes).metadata();
      expect(meta.format).toBe('webp');
      expect([meta.width, meta.height]).toEqual([row.width, row.height]);
      expect(Math.max(meta.width!, meta.height!)).toBeLessThanOrEqual(1280);
      const thumb = await fetchAs(viewer.client, `/api/uploads/${row.id}/thumb`);
      expect(thumb.status).toBe(200);
      const tmeta = await sharp(thumb.bytes).metadata();
      expect(tmeta.format).toBe('webp');
      expect(Math.max(tmeta.width!, tmeta.height!)).toBeLessThanOrEqual(320);
    }
    // 1600 × 1200 fits inside 1280 as 1280 × 960 (aspect kept); small pictures are not enlarged.
    const big = await db.selectFrom('uploads').select(['width', 'height']).where('plot_id', '=', plotId).where('filename', '=', 'plot.webp').execute();
    expect(big.some((r) => r.width === 300 && r.height === 200)).toBe(true);
    const jpg = await db.selectFrom('uploads').select(['width', 'height']).where('plot_id', '=', plotId).where('caption', '=', 'A image/jpeg').executeTakeFirstOrThrow();
    expect([jpg.width, jpg.height]).toEqual([1280, 960]);
  });

  it('applies the EXIF orientation and drops the EXIF block (a phone photo carries the GPS position)', async () => {
    // EXIF Orientation 6 (CIPA DC-008 / TIFF 6.0): the stored rows are shown rotated 90° clockwise.
    const sent = await image(80, 40)
      .jpeg()
      .withExif({ IFD0: { Artist: 'Trail camera' }, IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '36/1 24/1 36/1' } })
      .withMetadata({ orientation: 6 })
      .toBuffer();
    const before = await sharp(sent).metadata();
    expect(before.orientation).toBe(6);
    expect(before.exif).toBeDefined();
    expect(sent.includes(Buffer.from('Trail camera'))).toBe(true);
    const res = await send(member.client, new Uint8Array(sent), 'IMG_0001.JPG', 'image/jpeg');
    expect(res.status).toBe(201);
    expect([res.body.upload.width, res.body.upload.height]).toEqual([40, 80]);
    for (const p of [`/api/uploads/${res.body.upload.id}`, `/api/uploads/${res.body.upload.id}/thumb`]) {
      const served = await fetchAs(member.client, p);
      const meta = await sharp(served.bytes).metadata();
      expect(meta.exif).toBeUndefined();
      expect(meta.orientation).toBeUndefined();
      expect(Buffer.from(served.bytes).includes(Buffer.from('Trail camera'))).toBe(false);
    }
  });
});

describe('refused uploads write nothing', () => {
  const elf = new Uint8Array(4100);
  elf.set([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1, 0]); // ELF magic (System V ABI): a Linux executable
  const cases: [string, Uint8Array | string, string, string, number, RegExp][] = [
    ['a renamed executable', elf, 'photo.jpg', 'image/jpeg', 415, /ELF|must be JPEG, PNG or WebP/],
    ['a text file named .jpg', 'These are not the pixels you are looking for.\n'.repeat(20), 'photo.jpg', 'image/jpeg', 415, /must be JPEG, PNG or WebP/],
    ['a PDF named .png', `%PDF-1.4\n${'x'.repeat(2000)}`, 'scan.png', 'image/png', 415, /PDF/],
    ['an empty file', new Uint8Array(0), 'empty.jpg', 'image/jpeg', 400, /empty/],
  ];

  for (const [what, bytes, name, type, status, message] of cases) {
    it(`${what} → ${status}`, async () => {
      const rows = await rowsOfPlot();
      const res = await send(member.client, bytes, name, type);
      expect(res.status, JSON.stringify(res.body)).toBe(status);
      expect(res.body.error).toMatch(message);
      expect(res.body.fields.file).toBeTruthy();
      expect(await rowsOfPlot()).toBe(rows);
      expect(await orphanFiles()).toEqual([]);
    });
  }

  it('a JPEG cut short → 400, readable message', async () => {
    const full = await image(400, 300).jpeg().toBuffer();
    const rows = await rowsOfPlot();
    const res = await send(member.client, new Uint8Array(full.subarray(0, 300)), 'cut.jpg', 'image/jpeg');
    expect(res.status).toBe(400);
    expect(res.body.error).toMatch(/could not be read/);
    expect(await rowsOfPlot()).toBe(rows);
  });

  it('a photo over 15 MB → 413 before it is read in full', async () => {
    const big = new Uint8Array(16 * 1024 * 1024);
    big.set([0xff, 0xd8, 0xff, 0xe0]);
    const rows = await rowsOfPlot();
    const files = storedFiles().length;
    const res = await send(member.client, big, 'huge.jpg', 'image/jpeg');
    expect(res.status).toBe(413);
    expect(res.body.error).toMatch(/15 MB/);
    expect(await rowsOfPlot()).toBe(rows);
    expect(await orphanFiles()).toEqual([]);
    expect(storedFiles().length).toBeLessThanOrEqual(files + 6); // other files' concurrent uploads at most
  });

  it('a body that is not multipart → 415; a form without a file → 400', async () => {
    const json = await member.client.post(`/api/plots/${plotId}/photos`, { file: 'x' });
    expect(json.status).toBe(415);
    const headers: Record<string, string> = { cookie: `${SESSION_COOKIE}=${member.client.cookie(SESSION_COOKIE)}` };
    const form = new FormData();
    form.append('caption', 'no file');
    const res = await fetch(`${baseUrl()}/api/plots/${plotId}/photos`, { method: 'POST', headers, body: form });
    expect(res.status).toBe(400);
    expect((await res.json()).fields.file).toMatch(/Attach the photo/);
  });

  it('a viewer may not upload (403) and an outsider learns nothing (404)', async () => {
    const png = new Uint8Array(await image(10, 10).png().toBuffer());
    const rows = await rowsOfPlot();
    expect((await send(viewer.client, png, 'v.png', 'image/png')).status).toBe(403);
    const out = await send(outsider.client, png, 'o.png', 'image/png');
    expect(out.status).toBe(404);
    expect(out.body).toEqual({ error: 'Not found' });
    expect(await rowsOfPlot()).toBe(rows);
  });
});

describe('serving and removing', () => {
  let id: string;
  beforeAll(async () => {
    const res = await send(member.client, new Uint8Array(await image(64, 48).jpeg().toBuffer()), 'Nordecke "ü".jpg', 'image/jpeg');
    id = res.body.upload.id;
  });

  it('serves the bytes to the property’s people with private, no-sniff, inline headers', async () => {
    for (const person of [owner, member, viewer]) {
      const res = await fetchAs(person.client, `/api/uploads/${id}`);
      expect(res.status).toBe(200);
      expect(res.headers.get('content-type')).toBe('image/webp');
      expect(res.headers.get('cache-control')).toMatch(/^private/);
      expect(res.headers.get('x-content-type-options')).toBe('nosniff');
      // RFC 6266 with the RFC 8187 UTF-8 form for the non-ASCII name; quotes never break the header.
      expect(res.headers.get('content-disposition')).toBe(`inline; filename="Nordecke ___.webp"; filename*=UTF-8''${encodeURIComponent('Nordecke _ü_.webp')}`);
    }
  });

  it('a non-member gets 404 for the file and the thumbnail; signed out 401', async () => {
    for (const p of [`/api/uploads/${id}`, `/api/uploads/${id}/thumb`]) {
      const res = await fetchAs(outsider.client, p);
      expect(res.status).toBe(404);
      expect(new TextDecoder().decode(res.bytes)).toBe('{"error":"Not found"}');
      expect((await fetchAs(new Client(), p)).status).toBe(401);
    }
    expect((await fetchAs(member.client, '/api/uploads/00000000-0000-4000-8000-000000000000')).status).toBe(404);
    expect((await fetchAs(member.client, '/api/uploads/not-a-uuid')).status).toBe(404);
  });

  it('another member may not remove it (403); its uploader may, and the row and both files go', async () => {
    const row = await db.selectFrom('uploads').selectAll().where('id', '=', id).executeTakeFirstOrThrow();
    expect((await member2.client.delete(`/api/uploads/${id}`)).status).toBe(403);
    expect((await viewer.client.delete(`/api/uploads/${id}`)).status).toBe(403);
    expect((await outsider.client.delete(`/api/uploads/${id}`)).status).toBe(404);
    expect(storedFiles().map((f) => f.split(path.sep).join('/'))).toEqual(expect.arrayContaining([row.storage_key, row.thumb_key]));
    expect((await member.client.delete(`/api/uploads/${id}`)).status).toBe(204);
    expect(await db.selectFrom('uploads').select('id').where('id', '=', id).executeTakeFirst()).toBeUndefined();
    const left = storedFiles().map((f) => f.split(path.sep).join('/'));
    expect(left).not.toContain(row.storage_key);
    expect(left).not.toContain(row.thumb_key);
    expect((await fetchAs(member.client, `/api/uploads/${id}`)).status).toBe(404);
  });
});
