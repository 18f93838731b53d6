// `npm run bench`: runs the engine benchmark, prints a table with the machine, writes bench/results.json.
import { writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { runEngineBenchmark } from './engine.bench';

const machine = {
  cpus: os.cpus().length,
  cpuModel: os.cpus()[0]?.model ?? 'unknown',
  totalMemoryGiB: Number((os.totalmem() / 1024 ** 3).toFixed(1)),
  node: process.version,
  platform: `${os.platform()} ${os.release()}`,
};

const started = performance.now();
const rows = runEngineBenchmark();
const wallSeconds = (performance.now() - started) / 1000;

console.log(`Sowcast engine benchmark — ${machine.cpus} CPUs (${machine.cpuModel}), ${machine.totalMemoryGiB} GiB, Node ${machine.node}`);
console.table(
  rows.map((r) => ({
    run: r.name,
    plantings: r.plantings,
    forecasts: r.forecasts,
    'seconds': Number(r.seconds.toFixed(2)),
    'plantings/second': Math.round(r.plantingsPerSecond),
    moves: r.moves,
  })),
);
console.log(`Whole run (including first plans): ${wallSeconds.toFixed(1)} s`);

const out = path.join(import.meta.dirname, 'results.json');
writeFileSync(out, `${JSON.stringify({ ranAt: new Date().toISOString(), machine, rows, wallSeconds }, null, 2)}\n`);
console.log(`Wrote ${path.relative(process.cwd(), out)}`);
