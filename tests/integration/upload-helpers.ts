// Multipart uploads from a signed-in test client, and the counts a refused upload must leave unchanged:
// rows in uploads and files under $SOWCAST_DATA_DIR/uploads.
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import type { Kysely } from 'kysely';
import type { Database } from '@/db/database';
import { baseUrl, SESSION_COOKIE, type Client } from '../support/http';

export async function sendForm(client: Client, urlPath: string, form: FormData) {
  // A browser's form post names the page's origin; the server refuses other sites' pages.
  const headers: Record<string, string> = { accept: 'application/json', origin: baseUrl() };
  if (client.address) headers['x-forwarded-for'] = client.address;
  const session = client.cookie(SESSION_COOKIE);
  if (session) headers.cookie = `${SESSION_COOKIE}=${session}`;
  const response = await fetch(`${baseUrl()}${urlPath}`, { method: 'POST', headers, body: form });
  const text = await response.text();
  const body = (response.headers.get('content-type') ?? '').includes('application/json') && text ? JSON.parse(text) : text;
  return { status: response.status, body, text };
}

export function fileForm(name: string, content: string | Uint8Array, type = 'application/octet-stream', fields: Record<string, string> = {}) {
  const form = new FormData();
  form.append('file', new Blob([content as BlobPart], { type }), name);
  for (const [k, v] of Object.entries(fields)) form.append(k, v);
  return form;
}

function uploadsRoot(): string {
  const dir = process.env.SOWCAST_DATA_DIR;
  if (!dir) throw new Error('SOWCAST_DATA_DIR is not set: run integration tests through `npm test`');
  return path.join(dir, 'uploads');
}

/** Storage keys of the files on disk ('prefix/uuid'), leaving out half-written '.part' files. */
export function storedKeys(): string[] {
  const root = uploadsRoot();
  if (!existsSync(root)) return [];
  return readdirSync(root, { recursive: true, encoding: 'utf8' })
    .filter((f) => !f.endsWith('.part') && statSync(path.join(root, f)).isFile())
    .map((f) => f.split(path.sep).join('/'))
    .sort();
}

export const fileExists = (storageKey: string) => existsSync(path.join(uploadsRoot(), storageKey));

/**
 * Files with no uploads row. Other test files upload at the same time, and a good upload writes its file a
 * moment before its row, so the answer is taken once it holds still for a few readings.
 */
export async function orphanFiles(db: Kysely<Database>): Promise<string[]> {
  let last = '';
  for (let i = 0; i < 20; i++) {
    const keys = storedKeys();
    const rows = keys.length ? await db.selectFrom('uploads').select(['storage_key', 'thumb_key']).execute() : [];
    const known = new Set(rows.flatMap((r) => [r.storage_key, r.thumb_key]).filter(Boolean));
    const orphans = keys.filter((k) => !known.has(k));
    const now = JSON.stringify(orphans);
    if (now === last) return orphans;
    last = now;
    await new Promise((r) => setTimeout(r, 150));
  }
  return JSON.parse(last);
}

export async function uploadRowCount(db: Kysely<Database>, plotId: string): Promise<number> {
  const row = await db.selectFrom('uploads').select((eb) => eb.fn.countAll<number>().as('n')).where('plot_id', '=', plotId).executeTakeFirstOrThrow();
  return Number(row.n);
}
