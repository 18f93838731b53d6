// The disk storage: bytes round-trip, keys are made by the module (never from a user's name) and no key —
// whatever is passed — reaches outside the storage folder (path traversal, CWE-22).
import { mkdtempSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { diskStorage } from '@/lib/storage';

const base = mkdtempSync(path.join(tmpdir(), 'sowcast-storage-'));
const root = path.join(base, 'uploads');
const outside = path.join(base, 'secret.txt');
writeFileSync(outside, 'not yours');
const store = diskStorage(root);

afterAll(() => rmSync(base, { recursive: true, force: true }));

function filesUnder(dir: string): string[] {
  try {
    return readdirSync(dir, { recursive: true, withFileTypes: true })
      .filter((e) => e.isFile())
      .map((e) => path.relative(dir, path.join(e.parentPath, e.name)));
  } catch {
    return [];
  }
}

describe('disk storage', () => {
  it('puts, gets and deletes bytes under a key of its own making', async () => {
    const bytes = new Uint8Array([0, 1, 2, 250, 255]);
    const key = await store.put('photos', bytes, 'image/webp');
    // RFC 9562 UUID (version 4 from randomUUID) after the prefix.
    expect(key).toMatch(/^photos\/[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
    expect(await store.get(key)).toEqual(bytes);
    expect(filesUnder(root)).toEqual([key]);
    await store.delete(key);
    expect(await store.get(key)).toBeNull();
    expect(filesUnder(root)).toEqual([]);
    // Deleting what is gone is not an error (a retry after a crash).
    await expect(store.delete(key)).resolves.toBeUndefined();
  });

  it('never reuses a key', async () => {
    const a = await store.put('photos', new Uint8Array([1]), 'image/webp');
    const b = await store.put('photos', new Uint8Array([1]), 'image/webp');
    expect(a).not.toBe(b);
    await Promise.all([store.delete(a), store.delete(b)]);
  });

  it('refuses keys and prefixes that could leave the folder, and touches nothing outside it', async () => {
    const bad = [
      '../secret.txt',
      'photos/../../secret.txt',
      `photos/${'0'.repeat(8)}-0000-4000-8000-${'0'.repeat(12)}/../../../secret.txt`,
      '/etc/passwd',
      outside,
      'photos\\..\\..\\secret.txt',
      'photos/%2e%2e%2fsecret',
      '',
      'Photos/00000000-0000-4000-8000-000000000000',
    ];
    for (const key of bad) {
      await expect(store.get(key), key).rejects.toThrow(/Not a storage key/);
      await expect(store.delete(key), key).rejects.toThrow(/Not a storage key/);
    }
    for (const prefix of ['..', '../x', 'a/b', '', 'UP']) {
      await expect(store.put(prefix, new Uint8Array([1]), 'text/plain'), prefix).rejects.toThrow(/Not a storage prefix/);
    }
    expect(filesUnder(base)).toEqual(['secret.txt']);
  });

  it('a missing key reads as null', async () => {
    expect(await store.get('photos/00000000-0000-4000-8000-000000000000')).toBeNull();
  });
});
