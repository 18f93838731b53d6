// PostgreSQL from Debian's package, run by us on loopback: install when missing, create a cluster in a
// folder of ours, start, stop. As root the server runs as the `postgres` user (initdb refuses root).
import { createHash } from 'node:crypto';
import { chmodSync, existsSync, mkdirSync, readdirSync, realpathSync, rmSync, writeFileSync, chownSync } from 'node:fs';
import path from 'node:path';
import { aptInstall, capture, isRoot, log } from './common.mjs';

export function postgresBin() {
  const base = '/usr/lib/postgresql';
  const find = () => {
    if (!existsSync(base)) return null;
    const versions = readdirSync(base)
      .filter((v) => existsSync(path.join(base, v, 'bin', 'initdb')))
      .sort((a, b) => Number(a) - Number(b));
    return versions.length ? path.join(base, versions.at(-1), 'bin') : null;
  };
  let bin = find();
  if (!bin) {
    aptInstall(['postgresql']);
    bin = find();
    if (!bin) throw new Error('PostgreSQL server binaries not found under /usr/lib/postgresql after install');
  }
  return bin;
}

function postgresIds() {
  const passwd = capture('id', ['-u', 'postgres']);
  const group = capture('id', ['-g', 'postgres']);
  if (passwd.status !== 0) throw new Error('the postgres system user is missing (it comes with the postgresql package)');
  return { uid: Number(passwd.stdout.trim()), gid: Number(group.stdout.trim()) };
}

/**
 * Runs a server binary as the account that owns the cluster. The working folder is `/`: initdb and pg_ctl
 * change back into the folder they were started from, and as `postgres` a private checkout is out of reach.
 */
function asOwner(bin, args) {
  const result = isRoot ? capture('runuser', ['-u', 'postgres', '--', bin, ...args], { cwd: '/' }) : capture(bin, args);
  return result;
}

/** The postgres account's home (Debian: /var/lib/postgresql), which it owns and can always enter. */
function postgresHome() {
  const entry = capture('getent', ['passwd', 'postgres']);
  const home = entry.status === 0 ? entry.stdout.trim().split(':')[5] : '';
  if (!home || !existsSync(home)) throw new Error('the postgres system user has no home folder (it comes with the postgresql package)');
  return home;
}

/** True when the `postgres` account can read `file`, i.e. can pass every folder above it. */
function postgresCanRead(file) {
  return capture('runuser', ['-u', 'postgres', '--', 'test', '-r', file], { cwd: '/' }).status === 0;
}

/**
 * Where `npm start` keeps its cluster for the checkout at `checkout`. As an ordinary user the server runs
 * as that user: `.data/postgres` in the checkout. As root it runs as `postgres`, who cannot pass a private
 * (0700) home or `mktemp -d` folder, so the cluster lives in postgres's home instead,
 * `<home>/sowcast/<id>` where the id is a hash of the checkout's real path: two checkouts never share a
 * cluster and every start of one checkout finds the same one. A cluster an earlier version made in
 * `.data/postgres` is kept while postgres can still reach it.
 * Returns { dir, shown } (`shown`: the path for log lines) and writes `<dir>/checkout` naming the checkout.
 */
export function localClusterDir(checkout) {
  const inCheckout = path.join(checkout, '.data', 'postgres');
  if (!isRoot) return { dir: inCheckout, shown: '.data/postgres' };
  postgresBin(); // installs the package, and with it the postgres account, when missing
  const oldVersionFile = path.join(inCheckout, 'data', 'PG_VERSION');
  if (existsSync(oldVersionFile)) {
    if (postgresCanRead(oldVersionFile)) {
      log('postgres', 'using the cluster an earlier version made in .data/postgres (the postgres user can reach it)');
      return { dir: inCheckout, shown: '.data/postgres' };
    }
    log('postgres', 'ignoring the cluster in .data/postgres: the postgres user cannot reach it there');
  }
  const real = realpathSync(checkout);
  const id = createHash('sha256').update(real).digest('hex').slice(0, 16);
  const parent = path.join(postgresHome(), 'sowcast');
  ownedDir(parent, 0o755);
  const dir = path.join(parent, id);
  mkdirSync(dir, { recursive: true });
  writeFileSync(path.join(dir, 'checkout'), real + '\n');
  return { dir, shown: dir };
}

function ownedDir(dir, mode) {
  mkdirSync(dir, { recursive: true });
  chmodSync(dir, mode);
  if (isRoot) {
    const { uid, gid } = postgresIds();
    chownSync(dir, uid, gid);
  }
}

/**
 * A cluster under `dir`: `dir/data` (the cluster) and `dir/run` (socket and log).
 * Returns { bin, dataDir, runDir, port, start(), stop(), psql(sql, db) }.
 */
export function cluster({ dir, port, password = null, fast = false }) {
  const bin = postgresBin();
  const dataDir = path.join(dir, 'data');
  const runDir = path.join(dir, 'run');
  const logFile = path.join(runDir, 'postgres.log');

  function init() {
    if (existsSync(path.join(dataDir, 'PG_VERSION'))) return false;
    mkdirSync(dir, { recursive: true });
    chmodSync(dir, 0o755);
    ownedDir(dataDir, 0o700);
    ownedDir(runDir, 0o755);
    const args = ['-D', dataDir, '-U', 'postgres', '-E', 'UTF8', '--locale=C.UTF-8'];
    if (password) {
      const pwfile = path.join(runDir, 'initdb-password');
      writeFileSync(pwfile, password + '\n', { mode: 0o600 });
      if (isRoot) {
        const { uid, gid } = postgresIds();
        chownSync(pwfile, uid, gid);
      }
      args.push('--auth=scram-sha-256', `--pwfile=${pwfile}`);
    } else {
      args.push('--auth=trust');
    }
    const result = asOwner(path.join(bin, 'initdb'), args);
    // The password stays in the caller's file; initdb has stored its hash, so this copy is not kept.
    rmSync(path.join(runDir, 'initdb-password'), { force: true });
    if (result.status !== 0) throw new Error(`initdb failed:\n${result.stdout}\n${result.stderr}`);
    return true;
  }

  function isRunning() {
    return asOwner(path.join(bin, 'pg_ctl'), ['-D', dataDir, 'status']).status === 0;
  }

  function start() {
    const created = init();
    if (isRunning()) {
      log('postgres', `already running (${dataDir})`);
      return { created };
    }
    ownedDir(runDir, 0o755);
    const options = [
      '-c listen_addresses=127.0.0.1',
      `-p ${port}`,
      `-k ${runDir}`,
      '-c max_connections=200',
      ...(fast ? ['-c fsync=off', '-c synchronous_commit=off', '-c full_page_writes=off'] : []),
    ].join(' ');
    const result = asOwner(path.join(bin, 'pg_ctl'), ['-D', dataDir, '-l', logFile, '-w', '-t', '30', '-o', options, 'start']);
    if (result.status !== 0) {
      throw new Error(`PostgreSQL did not start (see ${logFile}):\n${result.stdout}\n${result.stderr}`);
    }
    return { created };
  }

  function stop() {
    if (!existsSync(path.join(dataDir, 'PG_VERSION'))) return;
    asOwner(path.join(bin, 'pg_ctl'), ['-D', dataDir, '-m', 'fast', '-w', '-t', '30', 'stop']);
  }

  /** Runs SQL through psql over TCP on loopback; returns trimmed stdout. */
  function psql(sql, database = 'postgres') {
    const env = { ...process.env, PGPASSWORD: password ?? '' };
    const result = capture(
      path.join(bin, 'psql'),
      ['-h', '127.0.0.1', '-p', String(port), '-U', 'postgres', '-d', database, '-v', 'ON_ERROR_STOP=1', '-tAc', sql],
      { env },
    );
    if (result.status !== 0) throw new Error(`psql failed: ${result.stderr}`);
    return result.stdout.trim();
  }

  function ensureDatabase(name) {
    if (!/^[a-z_][a-z0-9_]*$/.test(name)) throw new Error(`unsafe database name ${name}`);
    const exists = psql(`select 1 from pg_database where datname = '${name}'`);
    if (exists !== '1') {
      psql(`create database ${name}`);
      log('postgres', `created database ${name}`);
    }
  }

  return { bin, dataDir, runDir, logFile, port, start, stop, psql, ensureDatabase, isRunning };
}
