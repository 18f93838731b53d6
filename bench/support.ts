// What the benchmarks share: the machine they ran on, a throwaway PostgreSQL cluster (the same one
// scripts/test.mjs starts), switching the data layer between databases, a seeded random source, and percentiles.
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';

// scripts/lib is plain JavaScript without type declarations; a computed specifier keeps tsc from looking for them.
const scriptLib = (name: string) => new URL(`../scripts/lib/${name}`, import.meta.url).href;

interface Cluster {
  bin: string;
  port: number;
  start(): void;
  stop(): void;
  ensureDatabase(name: string): void;
  psql(sql: string, database?: string): string;
}

export interface Machine {
  cores: number;
  cpuModel: string;
  totalMemoryGiB: number;
  node: string;
  platform: string;
}

export function machine(): Machine {
  return {
    cores: os.cpus().length,
    cpuModel: os.cpus()[0]?.model ?? 'unknown',
    totalMemoryGiB: Number((os.totalmem() / 1024 ** 3).toFixed(1)),
    node: process.version,
    platform: `${os.platform()} ${os.release()}`,
  };
}

export async function freePort(): Promise<number> {
  const { freePort: free } = (await import(scriptLib('common.mjs'))) as { freePort(): Promise<number> };
  return free();
}

export interface BenchPostgres {
  port: number;
  bin: string;
  url(database: string): string;
  createDatabase(name: string): string;
  stop(): void;
}

/** A cluster of its own under the system temp folder, fsync off like the test run's, on a free loopback port. */
export async function startPostgres(): Promise<BenchPostgres> {
  const { cluster } = (await import(scriptLib('postgres.mjs'))) as { cluster(o: { dir: string; port: number; fast: boolean }): Cluster };
  const dir = mkdtempSync(path.join(os.tmpdir(), 'sowcast-bench-'));
  // mkdtemp makes the folder 0700; run as root, the server runs as `postgres` and must get through it.
  chmodSync(dir, 0o755);
  const port = await freePort();
  const db = cluster({ dir: path.join(dir, 'pg'), port, fast: true });
  db.start();
  const url = (database: string) => `postgres://postgres@127.0.0.1:${port}/${database}`;
  return {
    port,
    bin: db.bin,
    url,
    createDatabase(name) {
      db.ensureDatabase(name);
      return url(name);
    },
    stop() {
      db.stop();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

/**
 * Points lib/data/* (through getDb()) at `url`, closing the connections to the database used before. The data
 * layer keeps one pool per process; each benchmark part has a database of its own.
 */
export async function useDatabase(url: string): Promise<void> {
  const g = globalThis as { sowcastPool?: unknown; sowcastDb?: { destroy(): Promise<void> } };
  if (g.sowcastDb) await g.sowcastDb.destroy();
  else if (g.sowcastPool) await (g.sowcastPool as { end(): Promise<void> }).end();
  g.sowcastDb = undefined;
  g.sowcastPool = undefined;
  process.env.DATABASE_URL = url;
}

/** Mulberry32: a small seeded PRNG, so every run builds the same clubs. */
export function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

/** Nearest-rank percentile: the smallest value with at least p % of the samples at or below it (common practice, no source). */
export function percentile(sorted: number[], p: number): number {
  if (!sorted.length) return NaN;
  const rank = Math.ceil((p / 100) * sorted.length);
  return sorted[Math.min(sorted.length, Math.max(1, rank)) - 1];
}

export function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid] : (sorted[mid - 1] + sorted[mid]) / 2;
}

/** Runs `fn` over `items` with at most `limit` at once (setup only: the timed parts say how they run). */
export async function eachLimit<T, R>(items: T[], limit: number, fn: (item: T, index: number) => Promise<R>): Promise<R[]> {
  const results: R[] = new Array(items.length);
  let next = 0;
  await Promise.all(
    Array.from({ length: Math.min(limit, items.length) }, async () => {
      for (let i = next++; i < items.length; i = next++) results[i] = await fn(items[i], i);
    }),
  );
  return results;
}

export const seconds = (ms: number) => Number((ms / 1000).toFixed(2));
