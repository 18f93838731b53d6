// `npm run bench`: every benchmark, a table per part with the machine, and bench/results.json.
// `npm run bench -- engine` (or worker, api, page; several allowed) runs only those parts.
// Environment: SOWCAST_BENCH_SKIP_BUILD=1 reuses .next-bench when it exists; SOWCAST_BENCH_SECONDS (default 10)
// is each autocannon run's length; SOWCAST_BENCH_PROPERTIES (default 1000) sizes the worker cycle.
import { writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { runEngineBenchmark } from './engine.bench';
import { machine, startPostgres, seconds, type BenchPostgres } from './support';

const PARTS = ['engine', 'worker', 'api', 'page'] as const;
type Part = (typeof PARTS)[number];

const asked = process.argv.slice(2).filter((a) => a !== '--');
const unknown = asked.filter((a) => !PARTS.includes(a as Part));
if (unknown.length) {
  console.error(`Unknown part ${unknown.join(', ')}: choose from ${PARTS.join(', ')} (none runs them all).`);
  process.exit(2);
}
const parts = new Set<Part>(asked.length ? (asked as Part[]) : PARTS);
const host = machine();
// Other work on the machine slows every number here: the load average is kept beside them.
const results: Record<string, unknown> = { ranAt: new Date().toISOString(), machine: host, parts: [...parts], loadAverageAtStart: os.loadavg() };
const started = performance.now();

console.log(`Sowcast benchmarks — ${host.cores} cores (${host.cpuModel}), ${host.totalMemoryGiB} GiB, Node ${host.node}, ${host.platform}; load average ${os.loadavg().map((l) => l.toFixed(1)).join(' ')}`);

function engine() {
  const rows = runEngineBenchmark();
  // The engine is synchronous JavaScript on one thread: its rate is one core's.
  results.engine = rows.map((r) => ({ ...r, plantingsPerSecondPerCore: r.plantingsPerSecond }));
  console.log('\nEngine (one thread, so the rate is per core)');
  console.table(
    rows.map((r) => ({
      run: r.name,
      plantings: r.plantings,
      forecasts: r.forecasts,
      seconds: seconds(r.seconds * 1000),
      'plantings/s per core': Math.round(r.plantingsPerSecond),
      moves: r.moves,
    })),
  );
}

async function worker(pg: BenchPostgres) {
  const { runPgbench, runWorkerCycle } = await import('./worker-cycle.bench');
  const properties = Number(process.env.SOWCAST_BENCH_PROPERTIES ?? 1_000);
  const cycle = await runWorkerCycle(pg, { properties });
  const pgbench = runPgbench(pg);
  results.worker = { cycle, pgbench };
  console.log(`\nWorker cycle (${cycle.properties} properties, ${cycle.plantings} plantings; setup through lib/data ${cycle.setupSeconds.toFixed(1)} s, not counted)`);
  console.table({
    'forecast refresh': { seconds: seconds(cycle.phases.refreshSeconds * 1000), what: `${cycle.refresh.stored} forecasts stored, ${cycle.refresh.failed} failed, ${cycle.refresh.replans} replans queued` },
    replans: { seconds: seconds(cycle.phases.replanSeconds * 1000), what: `${cycle.replans.done} done (${cycle.replans.moved} moved), ${cycle.replans.failed} failed` },
    'reminders run': { seconds: seconds(cycle.phases.remindersSeconds * 1000), what: `${cycle.reminders.created} reminders made, ${cycle.reminders.queued} sends queued` },
    'whole cycle (worker code)': { seconds: seconds(cycle.workerSeconds * 1000), what: `${(cycle.plantings / cycle.workerSeconds).toFixed(0)} plantings/s` },
    'same rows, bulk INSERT floor': { seconds: seconds(cycle.floorSeconds * 1000), what: Object.entries(cycle.rows).map(([t, n]) => `${t} ${n}`).join(', ') },
    'ratio worker / floor': { seconds: Number(cycle.workerOverFloor.toFixed(1)), what: 'times the floor (lower is better)' },
  });
  console.log(
    `The worker as configured (jobs/worker.ts: replans ${4} per fetch, polled every 2 s) would need at least ${cycle.pollBoundReplanSeconds.toFixed(0)} s for these replans.`,
  );
  console.log(`pgbench on the same server (scale ${pgbench.scale}, ${pgbench.clients} clients, ${pgbench.seconds} s each)`);
  console.table({ 'select-only (-S)': { tps: Math.round(pgbench.selectOnlyTps) }, 'default TPC-B-like': { tps: Math.round(pgbench.tpcbLikeTps) } });
}

async function webParts(pg: BenchPostgres) {
  const { startWeb } = await import('./web');
  const web = await startWeb(pg);
  try {
    if (parts.has('api')) {
      const { runApiBenchmark } = await import('./api.bench');
      const rows = await runApiBenchmark(web, { seconds: Number(process.env.SOWCAST_BENCH_SECONDS ?? 10) });
      results.api = rows;
      console.log('\nAPI under autocannon (req/s per core = req/s ÷ cores; latency in ms; web, PostgreSQL and autocannon share the machine)');
      console.table(
        rows.map((r) => ({
          route: r.route,
          club: r.club,
          conns: r.connections,
          'req/s': Math.round(r.requestsPerSecond),
          'req/s/core': Math.round(r.requestsPerSecond / host.cores),
          p50: r.p50Ms,
          p95: r.p95Ms,
          p99: r.p99Ms,
          errors: r.errors,
          'non-2xx': r.non2xx,
        })),
      );
    }
    if (parts.has('page')) {
      const { runPageBenchmark } = await import('./page.bench');
      const rows = await runPageBenchmark(web);
      results.page = rows;
      console.log('\nSeason calendar in headless Chromium (median of runs, each with an empty cache)');
      console.table(
        rows.map((r) => ({
          club: r.club,
          runs: r.runs,
          'first event ms': Math.round(r.firstEventMs),
          'events shown': r.events,
          'JS KiB (transferred)': Math.round(r.scriptBytes / 1024),
          'JS files': r.scripts,
        })),
      );
    }
  } finally {
    await web.stop();
  }
}

let exitCode = 0;
let pg: BenchPostgres | null = null;
const stopAll = () => {
  pg?.stop();
  pg = null;
};
for (const signal of ['SIGINT', 'SIGTERM'] as const) process.on(signal, () => (stopAll(), process.exit(130)));
try {
  if (parts.has('engine')) engine();
  if (parts.has('worker') || parts.has('api') || parts.has('page')) {
    pg = await startPostgres();
    console.log(`\nPostgreSQL (fsync off, as in the test run) on 127.0.0.1:${pg.port}`);
    if (parts.has('worker')) await worker(pg);
    if (parts.has('api') || parts.has('page')) await webParts(pg);
  }
} catch (error) {
  console.error(`\nthe benchmark failed: ${(error as Error).stack ?? error}`);
  exitCode = 1;
} finally {
  const { useDatabase } = await import('./support');
  await useDatabase('postgres://closed').catch(() => {});
  stopAll();
}
results.wallSeconds = (performance.now() - started) / 1000;
results.loadAverageAtEnd = os.loadavg();
console.log(`\nWhole run: ${(results.wallSeconds as number).toFixed(0)} s; load average ${os.loadavg().map((l) => l.toFixed(1)).join(' ')}`);
if (!exitCode) {
  const out = path.join(import.meta.dirname, 'results.json');
  writeFileSync(out, `${JSON.stringify(results, null, 2)}\n`);
  console.log(`Wrote ${path.relative(process.cwd(), out)}`);
}
process.exit(exitCode);
