// Shared helpers for scripts/start.mjs and scripts/test.mjs. Plain Node (no npm packages): these run
// before `npm ci` has installed anything.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, readFileSync, statSync } from 'node:fs';
import https from 'node:https';
import net from 'node:net';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..', '..');
export const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

export function log(scope, message) {
  process.stdout.write(`[${scope}] ${message}\n`);
}

/** Runs a command to completion, inheriting output; throws with a clear message when it fails. */
export function run(command, args, options = {}) {
  const result = spawnSync(command, args, { stdio: 'inherit', cwd: root, ...options });
  if (result.error) throw new Error(`${command} could not start: ${result.error.message}`);
  if (result.status !== 0) {
    throw new Error(`${command} ${args.join(' ')} exited with ${result.status ?? result.signal}`);
  }
  return result;
}

export function capture(command, args, options = {}) {
  const result = spawnSync(command, args, { encoding: 'utf8', cwd: root, ...options });
  return { status: result.status, stdout: result.stdout ?? '', stderr: result.stderr ?? '' };
}

/** Root runs apt-get directly; an ordinary user goes through sudo. */
function aptGet(args) {
  const [command, prefix] = isRoot ? ['apt-get', []] : ['sudo', ['-n', 'apt-get']];
  return spawnSync(command, [...prefix, ...args], {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  }).status;
}

export function aptInstall(packages) {
  log('setup', `installing Debian packages: ${packages.join(' ')}`);
  if (aptGet(['install', '-y', ...packages]) === 0) return;
  log('setup', 'install failed; refreshing the package lists once and trying again');
  aptGet(['update']);
  if (aptGet(['install', '-y', ...packages]) !== 0) {
    throw new Error(
      `could not install ${packages.join(' ')} with apt-get` + (isRoot ? '' : ' (is passwordless sudo available?)'),
    );
  }
}

/** Installs npm packages when node_modules is missing or older than package-lock.json. */
export function ensureNodeModules() {
  const marker = path.join(root, 'node_modules', '.package-lock.json');
  const lock = path.join(root, 'package-lock.json');
  const fresh = existsSync(marker) && (!existsSync(lock) || statSync(marker).mtimeMs >= statSync(lock).mtimeMs);
  if (fresh) return;
  log('setup', 'installing npm packages (npm ci)');
  run('npm', [existsSync(lock) ? 'ci' : 'install', '--no-audit', '--no-fund'], {
    env: { ...process.env, NEXT_TELEMETRY_DISABLED: '1' },
  });
}

export function freePort() {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.unref();
    server.on('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address();
      server.close(() => resolve(port));
    });
  });
}

export function portIsFree(port) {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once('error', () => resolve(false));
    server.listen(port, '127.0.0.1', () => server.close(() => resolve(true)));
  });
}

/** One GET; for our own self-signed fakes (`insecure`) the certificate is not checked. */
function probe(url, insecure) {
  if (!insecure) return fetch(url, { signal: AbortSignal.timeout(2_000) }).then((r) => r.status);
  return new Promise((resolve, reject) => {
    const request = https.get(url, { rejectUnauthorized: false, timeout: 2_000 }, (response) => {
      response.resume();
      resolve(response.statusCode ?? 0);
    });
    request.on('error', reject);
    request.on('timeout', () => request.destroy(new Error('timeout')));
  });
}

export async function waitForHttp(url, timeoutMs = 60_000, child, insecure = false) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child && child.exitCode !== null) throw new Error(`${url}: the process exited with ${child.exitCode}`);
    try {
      if ((await probe(url, insecure)) < 500) return;
    } catch {
      // not up yet
    }
    await new Promise((r) => setTimeout(r, 250));
  }
  throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
}

/**
 * Starts a long-running child in its own process group (so stopping it stops its children too), with
 * its output prefixed by a name.
 */
export function startService(name, command, args, env, { quiet = false } = {}) {
  const child = spawn(command, args, {
    cwd: root,
    env: { ...process.env, ...env },
    detached: true,
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  const prefix = (stream, target) => {
    let buffered = '';
    stream.on('data', (chunk) => {
      buffered += chunk.toString();
      const lines = buffered.split('\n');
      buffered = lines.pop() ?? '';
      if (quiet) return;
      for (const line of lines) target.write(`[${name}] ${line}\n`);
    });
  };
  prefix(child.stdout, process.stdout);
  prefix(child.stderr, process.stderr);
  child.serviceName = name;
  return child;
}

export function stopService(child, signal = 'SIGTERM') {
  if (!child || child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((resolve) => {
    const timer = setTimeout(() => {
      try {
        process.kill(-child.pid, 'SIGKILL');
      } catch {}
      resolve();
    }, 8_000);
    child.once('exit', () => {
      clearTimeout(timer);
      resolve();
    });
    try {
      process.kill(-child.pid, signal);
    } catch {
      clearTimeout(timer);
      resolve();
    }
  });
}

export function nodeBin(name) {
  return path.join(root, 'node_modules', '.bin', name);
}

export function readIfExists(file) {
  return existsSync(file) ? readFileSync(file, 'utf8').trim() : null;
}
