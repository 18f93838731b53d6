// The one place uploaded bytes are kept. Local disk under the data folder by default; an S3-compatible
// bucket when SOWCAST_STORAGE=s3 (with S3_BUCKET, and S3_ENDPOINT / S3_REGION / AWS credentials as the AWS
// SDK reads them). Keys are opaque and made here, never from a user's file name.
import { randomUUID } from 'node:crypto';
import { mkdir, readFile, rename, rm, writeFile } from 'node:fs/promises';
import path from 'node:path';

export interface Storage {
  /** Stores the bytes under a new key and returns it. */
  put(prefix: string, bytes: Uint8Array, contentType: string): Promise<string>;
  /** The bytes, or null when nothing is stored under the key. */
  get(key: string): Promise<Uint8Array | null>;
  delete(key: string): Promise<void>;
}

const KEY = /^[a-z0-9-]+\/[0-9a-f-]{36}$/;

function checkKey(key: string) {
  // Keys come from our own rows, but a path must never escape the storage folder whatever is passed.
  if (!KEY.test(key)) throw new RangeError(`Not a storage key: ${key}`);
}

function newKey(prefix: string) {
  if (!/^[a-z0-9-]+$/.test(prefix)) throw new RangeError(`Not a storage prefix: ${prefix}`);
  return `${prefix}/${randomUUID()}`;
}

export function diskStorage(root: string): Storage {
  const file = (key: string) => {
    checkKey(key);
    return path.join(root, key);
  };
  return {
    async put(prefix, bytes) {
      const key = newKey(prefix);
      const target = file(key);
      await mkdir(path.dirname(target), { recursive: true });
      // Write then rename: a reader never sees half a file, a crash leaves no partial upload under the key.
      const temp = `${target}.part`;
      await writeFile(temp, bytes, { flag: 'wx' });
      await rename(temp, target);
      return key;
    },
    async get(key) {
      try {
        return new Uint8Array(await readFile(file(key)));
      } catch (error) {
        if ((error as NodeJS.ErrnoException).code === 'ENOENT') return null;
        throw error;
      }
    },
    async delete(key) {
      await rm(file(key), { force: true });
    },
  };
}

export function s3Storage(env: Record<string, string | undefined> = process.env): Storage {
  const bucket = env.S3_BUCKET;
  if (!bucket) throw new Error('SOWCAST_STORAGE=s3 needs S3_BUCKET');
  // Loaded on first use so local installs never load the SDK.
  const client = import('@aws-sdk/client-s3').then(
    (sdk) =>
      [
        sdk,
        new sdk.S3Client({
          region: env.S3_REGION || env.AWS_REGION || 'us-east-1',
          ...(env.S3_ENDPOINT ? { endpoint: env.S3_ENDPOINT, forcePathStyle: true } : {}),
          // Checksums only where S3 requires them: many S3-compatible services refuse the SDK's default
          // CRC32 trailers (aws-chunked uploads); the bytes are checked with our own SHA-256 anyway.
          requestChecksumCalculation: 'WHEN_REQUIRED',
          responseChecksumValidation: 'WHEN_REQUIRED',
        }),
      ] as const,
  );
  return {
    async put(prefix, bytes, contentType) {
      const [sdk, s3] = await client;
      const key = newKey(prefix);
      await s3.send(new sdk.PutObjectCommand({ Bucket: bucket, Key: key, Body: bytes, ContentType: contentType }));
      return key;
    },
    async get(key) {
      checkKey(key);
      const [sdk, s3] = await client;
      try {
        const answer = await s3.send(new sdk.GetObjectCommand({ Bucket: bucket, Key: key }));
        return answer.Body ? await answer.Body.transformToByteArray() : null;
      } catch (error) {
        if ((error as { name?: string }).name === 'NoSuchKey') return null;
        throw error;
      }
    },
    async delete(key) {
      checkKey(key);
      const [sdk, s3] = await client;
      await s3.send(new sdk.DeleteObjectCommand({ Bucket: bucket, Key: key }));
    },
  };
}

let current: Storage | null = null;

/** The storage the environment selects, made once per process. */
export function storage(env: Record<string, string | undefined> = process.env): Storage {
  if (!current) {
    current =
      env.SOWCAST_STORAGE === 's3'
        ? s3Storage(env)
        : diskStorage(path.resolve(/*turbopackIgnore: true*/ env.SOWCAST_DATA_DIR || '.data', 'uploads'));
  }
  return current;
}
