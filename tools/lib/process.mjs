// Helpers for the project's own commands (start, test, dev). No dependencies: they run before `npm ci`.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, statSync } from 'node:fs';
import { createServer } from 'node:net';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export const projectRoot = resolve(dirname(fileURLToPath(import.meta.url)), '..', '..');
export const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

export function say(tag, message) {
  process.stdout.write(`[${tag}] ${message}\n`);
}

/** Keeps Chromium's, Karma's and tsx's temporary folders inside the project's ignored .tmp/. */
export function projectTmpDir() {
  const dir = join(projectRoot, '.tmp');
  mkdirSync(dir, { recursive: true });
  return dir;
}

/** Runs a command to completion in the project folder; returns its exit status. */
export function run(command, args, options = {}) {
  const result = spawnSync(command, args, { cwd: projectRoot, stdio: 'inherit', env: options.env ?? process.env });
  if (result.error) throw result.error;
  return result.status ?? 1;
}

export function runOrThrow(command, args, options = {}) {
  const status = run(command, args, options);
  if (status !== 0) throw new Error(`${command} ${args.join(' ')} failed with exit status ${status}`);
}

/** Installs the npm packages when node_modules is missing or older than the lock file. */
export function ensureDependencies() {
  const marker = join(projectRoot, 'node_modules', '.package-lock.json');
  const lock = join(projectRoot, 'package-lock.json');
  const stale = !existsSync(marker) || (existsSync(lock) && statSync(lock).mtimeMs > statSync(marker).mtimeMs + 1000);
  if (!stale) return;
  say('setup', 'installing npm packages (npm ci)...');
  runOrThrow('npm', ['ci', '--no-audit', '--no-fund']);
}

/** Debian's Chromium for the browser suites: installed with apt-get when missing and running as root. */
export function ensureChromium() {
  if (existsSync('/usr/bin/chromium')) return;
  if (!isRoot) throw new Error('Chromium not found at /usr/bin/chromium: install it with `sudo apt-get install -y chromium`.');
  say('setup', 'installing Debian package chromium (apt-get)...');
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  if (run('apt-get', ['install', '-y', 'chromium'], { env }) !== 0) {
    runOrThrow('apt-get', ['update'], { env });
    runOrThrow('apt-get', ['install', '-y', 'chromium'], { env });
  }
}

export function nodeScript(script, args = [], env = process.env) {
  return run(process.execPath, ['--import', 'tsx', script, ...args], { env });
}

export function ng(args, env = process.env) {
  return run(process.execPath, [join(projectRoot, 'node_modules', '@angular', 'cli', 'bin', 'ng.js'), ...args], { env });
}

/** Starts the API server as a child process (one process: node --import tsx, not npx tsx). */
export function startServer(env, { watch = false } = {}) {
  const args = ['--import', 'tsx', ...(watch ? ['--watch'] : []), 'api/main.ts'];
  return spawn(process.execPath, args, { cwd: projectRoot, stdio: 'inherit', env });
}

/** Polls /api/health until the database is reported up, the child exits or the time runs out. */
export async function waitForHealth(url, child, timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    if (child && child.exitCode !== null) throw new Error(`the server exited with status ${child.exitCode}`);
    try {
      const response = await fetch(`${url}/api/health`);
      if (response.ok) return await response.json();
    } catch {
      // not listening yet
    }
    await new Promise((resolvePoll) => setTimeout(resolvePoll, 250));
  }
  throw new Error(`the server did not report healthy at ${url}/api/health within ${timeoutMs / 1000} s`);
}

/** The range the kernel takes the source ports of outgoing connections from (Linux), or its default. */
function ephemeralRange() {
  try {
    const [low, high] = readFileSync('/proc/sys/net/ipv4/ip_local_port_range', 'utf8').trim().split(/\s+/).map(Number);
    if (low && high) return [low, high];
  } catch {
    // not Linux: the IANA dynamic range
  }
  return [49152, 65535];
}

/**
 * A loopback port nobody listens on right now, chosen below the ephemeral range: a port the kernel
 * handed out for listen(0) can be taken a moment later as the source port of an outgoing connection
 * (a database client, say) before the process it was meant for binds it.
 */
export async function freePort() {
  const [ephemeralLow] = ephemeralRange();
  const low = 10000;
  const high = Math.max(low + 1000, ephemeralLow - 1);
  for (let attempt = 0; attempt < 200; attempt += 1) {
    const port = low + Math.floor(Math.random() * (high - low));
    const probe = createServer();
    const free = await new Promise((resolve) => {
      probe.once('error', () => resolve(false));
      probe.listen(port, '127.0.0.1', () => resolve(true));
    });
    if (free) {
      await new Promise((resolve) => probe.close(resolve));
      return port;
    }
  }
  throw new Error('no free loopback port found below the ephemeral range');
}
