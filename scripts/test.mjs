// `npm test`: the whole suite on a fresh machine. Installs what is missing (npm packages, Debian's
// postgresql and chromium), starts a throwaway PostgreSQL cluster on a free loopback port, builds and
// starts Sowcast against it, runs vitest (unit, integration, end-to-end), then removes everything.
// Extra arguments go to vitest: `npm test -- tests/integration/plots.test.ts`.
import { chmodSync, existsSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import os from 'node:os';
import path from 'node:path';
import { spawn } from 'node:child_process';
import {
  aptInstall, ensureNodeModules, freePort, log, nodeBin, root, run, startService, stopService, waitForHttp,
} from './lib/common.mjs';
import { cluster } from './lib/postgres.mjs';
import { testServices } from './lib/services.mjs';

const args = process.argv.slice(2);
const unitOnly = args.length > 0 && args.every((a) => a.startsWith('tests/unit'));
const started = Date.now();
const children = [];
let db = null;
let workDir = null;

async function cleanup() {
  await Promise.all(children.map((child) => stopService(child)));
  if (db) db.stop();
  if (workDir) rmSync(workDir, { recursive: true, force: true });
}

async function main() {
  ensureNodeModules();
  const env = { ...process.env, NEXT_TELEMETRY_DISABLED: '1', TZ: 'UTC' };
  if (!unitOnly) {
    if (!existsSync('/usr/bin/chromium')) aptInstall(['chromium']);
    env.CHROMIUM_PATH = '/usr/bin/chromium';

    // A cluster of our own under the system temp folder, readable by the postgres user.
    workDir = mkdtempSync(path.join(os.tmpdir(), 'sowcast-test-'));
    // mkdtemp makes the folder 0700; run as root, the server runs as `postgres` and must get through it.
    chmodSync(workDir, 0o755);
    const pgPort = await freePort();
    db = cluster({ dir: path.join(workDir, 'pg'), port: pgPort, fast: true });
    db.start();
    db.ensureDatabase('sowcast_test');
    env.DATABASE_URL = `postgres://postgres@127.0.0.1:${pgPort}/sowcast_test`;
    env.TEST_PG_ADMIN_URL = `postgres://postgres@127.0.0.1:${pgPort}/postgres`;
    log('test', `PostgreSQL on 127.0.0.1:${pgPort}`);

    run(nodeBin('tsx'), ['db/migrate.ts'], { env });

    const webPort = await freePort();
    env.SOWCAST_BASE_URL = `http://127.0.0.1:${webPort}`;
    env.NEXTAUTH_URL = env.SOWCAST_BASE_URL;
    env.APP_BASE_URL = env.SOWCAST_BASE_URL;
    env.NEXTAUTH_SECRET = randomBytes(32).toString('base64url');
    // Another folder lets two runs share one checkout (Next then lists it in tsconfig.json: revert that).
    env.NEXT_DIST_DIR = process.env.SOWCAST_TEST_DIST_DIR || '.next-test';
    env.TEST_ARTIFACTS_DIR = path.join(root, '.test-artifacts');
    mkdirSync(env.TEST_ARTIFACTS_DIR, { recursive: true });

    for (const name of ['WEATHER', 'SMTP', 'INBOX', 'PUSH']) env[`TEST_PORT_${name}`] = String(await freePort());
    // The made-up push service API tests register devices with: a .test name never resolves (RFC 6761 §6.2),
    // so the public-address rule for push endpoints (lib/notify/push-endpoint.ts) would refuse it.
    env.PUSH_ENDPOINT_ALLOWED_ORIGINS = 'https://push.example.test';
    env.SOWCAST_DATA_DIR = path.join(workDir, 'data');
    mkdirSync(env.SOWCAST_DATA_DIR, { recursive: true });
    for (const service of testServices({ env, workDir, dataDir: env.SOWCAST_DATA_DIR })) {
      if (service.build) {
        log('test', service.build.label);
        run(service.build.command, service.build.args, { env });
      }
      const child = startService(service.name, service.command, service.args, { ...env, ...service.env }, {
        quiet: !process.env.SOWCAST_TEST_VERBOSE,
      });
      children.push(child);
      if (service.readyUrl) await waitForHttp(service.readyUrl, 90_000, child, service.insecureReady);
      Object.assign(env, service.exports ?? {});
    }
    log('test', `services ready after ${((Date.now() - started) / 1000).toFixed(0)} s`);
  }

  const code = await new Promise((resolve) => {
    const child = spawn(nodeBin('vitest'), ['run', ...args], { cwd: root, env, stdio: 'inherit' });
    child.on('exit', (c, signal) => resolve(c ?? (signal ? 1 : 0)));
  });
  log('test', `finished in ${((Date.now() - started) / 1000).toFixed(0)} s`);
  return code;
}

let exitCode = 1;
for (const signal of ['SIGINT', 'SIGTERM']) {
  process.on(signal, () => {
    void cleanup().then(() => process.exit(130));
  });
}
try {
  exitCode = await main();
} catch (error) {
  console.error(`\nthe test run could not start: ${error.message}`);
  exitCode = 1;
} finally {
  await cleanup();
}
process.exit(exitCode);
