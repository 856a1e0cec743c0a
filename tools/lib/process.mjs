// Helpers for the project's own commands (start, test, dev). No dependencies: they run before `npm ci`.
import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, statSync } from 'node:fs';
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
