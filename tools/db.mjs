#!/usr/bin/env node
// The project's own PostgreSQL cluster on loopback: start | stop | status | reset.
// Plain JavaScript with no dependencies, because `npm start` runs it before anything is installed.
import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, rmSync, appendFileSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import os from 'node:os';

const projectRoot = resolve(dirname(fileURLToPath(import.meta.url)), '..');
export const DEFAULT_PORT = 54329;
export const DATABASE_NAME = 'quietbridge';
export const DATABASE_USER = 'app';

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

function log(message) {
  process.stdout.write(`[db] ${message}\n`);
}

/** The newest /usr/lib/postgresql/<version>/bin that holds the server binaries, or null. */
export function findServerBin() {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = readdirSync(base)
    .filter((name) => existsSync(join(base, name, 'bin', 'initdb')) && existsSync(join(base, name, 'bin', 'pg_ctl')))
    .sort((a, b) => Number(b) - Number(a));
  return versions.length > 0 ? join(base, versions[0], 'bin') : null;
}

/** Finds the server binaries, installing Debian's postgresql package when running as root. */
export function ensureServerBin() {
  let bin = findServerBin();
  if (bin) return bin;
  if (!isRoot) {
    throw new Error(
      'PostgreSQL server binaries not found (looked in /usr/lib/postgresql/*/bin). ' +
        'Install them with: sudo apt-get install -y postgresql — then run this command again.',
    );
  }
  log('PostgreSQL server not found: installing Debian package postgresql (apt-get)...');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  const install = () => spawnSync('apt-get', ['install', '-y', 'postgresql'], { stdio: 'inherit', env });
  if (install().status !== 0) {
    spawnSync('apt-get', ['update'], { stdio: 'inherit', env });
    if (install().status !== 0) throw new Error('apt-get install -y postgresql failed; see the output above.');
  }
  bin = findServerBin();
  if (!bin) throw new Error('apt-get installed postgresql but no server binaries were found under /usr/lib/postgresql.');
  return bin;
}

function ownerName() {
  return isRoot ? 'postgres' : os.userInfo().username;
}

/** Runs a server binary as the cluster's owner (initdb and postgres refuse to run as root). */
function runAsOwner(bin, command, args, options = {}) {
  const file = join(bin, command);
  const [exe, argv] = isRoot ? ['runuser', ['-u', 'postgres', '--', file, ...args]] : [file, args];
  return execFileSync(exe, argv, { stdio: options.stdio ?? 'pipe', encoding: 'utf8', cwd: '/' });
}

function ownerCanTraverse(dir) {
  if (!isRoot) return true;
  const probe = spawnSync('runuser', ['-u', 'postgres', '--', 'test', '-x', dir]);
  return probe.status === 0;
}

/**
 * Where a cluster lives. `name` separates the user's cluster ("pg") from throwaway test clusters.
 * As root the postgres user must reach the folder; when a parent is private we fall back to TMPDIR.
 */
export function clusterPaths(name = 'pg', port = Number(process.env.PGPORT ?? DEFAULT_PORT)) {
  let dataRoot = join(projectRoot, '.data');
  mkdirSync(dataRoot, { recursive: true });
  let fellBack = false;
  if (isRoot && !ownerCanTraverse(dataRoot)) {
    dataRoot = join(process.env.TMPDIR ?? os.tmpdir(), 'quietbridge-data');
    mkdirSync(dataRoot, { recursive: true, mode: 0o755 });
    fellBack = true;
  }
  return {
    dataRoot,
    fellBack,
    dataDir: join(dataRoot, name),
    socketDir: join(dataRoot, `${name}-socket`),
    logFile: join(dataRoot, `${name}.log`),
    port,
  };
}

export function databaseUrl(port = Number(process.env.PGPORT ?? DEFAULT_PORT), database = DATABASE_NAME) {
  return `postgres://${DATABASE_USER}@127.0.0.1:${port}/${database}`;
}

function installDir(dir, mode) {
  mkdirSync(dir, { recursive: true });
  if (isRoot) execFileSync('install', ['-d', '-m', mode, '-o', 'postgres', '-g', 'postgres', dir]);
}

function isRunning(bin, paths) {
  if (!existsSync(join(paths.dataDir, 'PG_VERSION'))) return false;
  const file = join(bin, 'pg_ctl');
  const args = ['-D', paths.dataDir, 'status'];
  const [exe, argv] = isRoot ? ['runuser', ['-u', 'postgres', '--', file, ...args]] : [file, args];
  return spawnSync(exe, argv, { cwd: '/' }).status === 0;
}

function databaseExists(bin, paths, database) {
  const out = spawnSync(
    join(bin, 'psql'),
    ['-h', '127.0.0.1', '-p', String(paths.port), '-U', DATABASE_USER, '-d', 'postgres', '-tAc', `select 1 from pg_database where datname = '${database}'`],
    { encoding: 'utf8' },
  );
  return out.status === 0 && out.stdout.trim() === '1';
}

/**
 * Initialises (once) and starts a cluster on 127.0.0.1, then creates the database.
 * `fast` turns off fsync: only for throwaway test clusters.
 */
export function startCluster({ name = 'pg', port, database = DATABASE_NAME, fast = false } = {}) {
  const bin = ensureServerBin();
  const paths = clusterPaths(name, port);
  if (paths.fellBack) log(`the postgres user cannot reach the project folder; keeping the cluster in ${paths.dataDir}`);
  if (!existsSync(join(paths.dataDir, 'PG_VERSION'))) {
    installDir(paths.dataDir, '700');
    installDir(paths.socketDir, '755');
    log(`initialising a new cluster in ${paths.dataDir}`);
    runAsOwner(bin, 'initdb', ['-D', paths.dataDir, '-U', DATABASE_USER, '--auth=trust', '--no-locale', '-E', 'UTF8']);
    const settings = [
      '',
      '# Quietbridge: loopback only, project port, socket inside the data folder',
      "listen_addresses = '127.0.0.1'",
      `port = ${paths.port}`,
      `unix_socket_directories = '${paths.socketDir}'`,
      'max_connections = 200',
      ...(fast ? ['fsync = off', 'synchronous_commit = off', 'full_page_writes = off'] : []),
      '',
    ].join('\n');
    if (isRoot) {
      spawnSync('runuser', ['-u', 'postgres', '--', 'sh', '-c', `cat >> '${join(paths.dataDir, 'postgresql.conf')}'`], { input: settings });
    } else {
      appendFileSync(join(paths.dataDir, 'postgresql.conf'), settings);
    }
  }
  if (!isRunning(bin, paths)) {
    installDir(paths.socketDir, '755');
    if (isRoot && !existsSync(paths.logFile)) {
      appendFileSync(paths.logFile, '');
      execFileSync('chown', ['postgres:postgres', paths.logFile]);
    }
    runAsOwner(bin, 'pg_ctl', ['-D', paths.dataDir, '-l', paths.logFile, '-o', `-p ${paths.port}`, '-w', '-t', '60', 'start']);
    log(`PostgreSQL started on 127.0.0.1:${paths.port}`);
  } else {
    log(`PostgreSQL already running on 127.0.0.1:${paths.port}`);
  }
  if (!databaseExists(bin, paths, database)) {
    execFileSync(join(bin, 'createdb'), ['-h', '127.0.0.1', '-p', String(paths.port), '-U', DATABASE_USER, database]);
    log(`created database ${database}`);
  }
  return { ...paths, url: databaseUrl(paths.port, database) };
}

export function stopCluster({ name = 'pg', port } = {}) {
  const bin = findServerBin();
  const paths = clusterPaths(name, port);
  if (!bin || !isRunning(bin, paths)) {
    log('PostgreSQL is not running');
    return;
  }
  runAsOwner(bin, 'pg_ctl', ['-D', paths.dataDir, '-m', 'fast', '-w', 'stop']);
  log('PostgreSQL stopped');
}

export function clusterStatus({ name = 'pg', port } = {}) {
  const bin = findServerBin();
  const paths = clusterPaths(name, port);
  const initialised = existsSync(join(paths.dataDir, 'PG_VERSION'));
  const running = Boolean(bin) && isRunning(bin, paths);
  return { serverInstalled: Boolean(bin), initialised, running, ...paths, url: databaseUrl(paths.port) };
}

/** Stops the cluster and deletes its data folder: everything stored is gone. */
export function removeCluster({ name = 'pg', port } = {}) {
  stopCluster({ name, port });
  const paths = clusterPaths(name, port);
  rmSync(paths.dataDir, { recursive: true, force: true });
  rmSync(paths.socketDir, { recursive: true, force: true });
  rmSync(paths.logFile, { force: true });
}

function main() {
  const command = process.argv[2];
  try {
    switch (command) {
      case 'start':
        startCluster();
        break;
      case 'stop':
        stopCluster();
        break;
      case 'status': {
        const status = clusterStatus();
        log(`server binaries: ${status.serverInstalled ? 'installed' : 'missing (apt-get install -y postgresql)'}`);
        log(`cluster: ${status.initialised ? status.dataDir : 'not initialised'}`);
        log(`running: ${status.running ? `yes, on 127.0.0.1:${status.port} (${status.url})` : 'no'}`);
        process.exitCode = status.running ? 0 : 3;
        break;
      }
      case 'reset':
        removeCluster();
        startCluster();
        log('cluster reset: empty database created; run `npm run migrate` and `npm run seed` (or `npm start`)');
        break;
      default:
        process.stderr.write('usage: node tools/db.mjs start | stop | status | reset\n');
        process.exitCode = 2;
    }
  } catch (error) {
    process.stderr.write(`[db] ${error instanceof Error ? error.message : String(error)}\n`);
    process.exitCode = 1;
  }
}

if (process.argv[1] && resolve(process.argv[1]) === fileURLToPath(import.meta.url)) main();
