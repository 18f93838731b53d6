import { mkdtempSync, rmSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import S3rver from 's3rver';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { s3Storage } from '@/lib/storage';

// The S3 adapter against a local S3 stand-in that speaks the S3 REST protocol (s3rver, an npm fake of
// Amazon S3), through the real AWS SDK: what a deployment with SOWCAST_STORAGE=s3 would send.
let server: S3rver;
let dir: string;
let endpoint: string;

beforeAll(async () => {
  dir = mkdtempSync(path.join(os.tmpdir(), 'sowcast-s3-'));
  server = new S3rver({ address: '127.0.0.1', port: 0, silent: true, directory: dir, configureBuckets: [{ name: 'sowcast-test', configs: [] }] });
  const address = (await server.run()) as AddressInfo;
  endpoint = `http://127.0.0.1:${address.port}`;
});

afterAll(async () => {
  await server?.close();
  rmSync(dir, { recursive: true, force: true });
});

const env = () => ({
  SOWCAST_STORAGE: 's3',
  S3_BUCKET: 'sowcast-test',
  S3_ENDPOINT: endpoint,
  S3_REGION: 'us-east-1',
  // s3rver accepts these fixed development credentials (its documented defaults).
  AWS_ACCESS_KEY_ID: 'S3RVER',
  AWS_SECRET_ACCESS_KEY: 'S3RVER',
});

describe('S3-compatible storage', () => {
  it('stores, reads back byte for byte, and deletes', async () => {
    const saved = { id: process.env.AWS_ACCESS_KEY_ID, secret: process.env.AWS_SECRET_ACCESS_KEY };
    Object.assign(process.env, { AWS_ACCESS_KEY_ID: 'S3RVER', AWS_SECRET_ACCESS_KEY: 'S3RVER' });
    try {
      const store = s3Storage(env());
      const bytes = new Uint8Array(70_000).map((_, i) => (i * 31) % 256);
      const key = await store.put('photo', bytes, 'image/webp');
      expect(key).toMatch(/^photo\/[0-9a-f-]{36}$/);
      expect(Buffer.from((await store.get(key))!).equals(Buffer.from(bytes))).toBe(true);
      await store.delete(key);
      expect(await store.get(key)).toBeNull();
      // A key that is not ours is refused before any request is made.
      await expect(store.get('../etc/passwd')).rejects.toThrow(/Not a storage key/);
    } finally {
      process.env.AWS_ACCESS_KEY_ID = saved.id;
      process.env.AWS_SECRET_ACCESS_KEY = saved.secret;
    }
  });

  it('needs a bucket', () => {
    expect(() => s3Storage({ SOWCAST_STORAGE: 's3' })).toThrow(/S3_BUCKET/);
  });
});
