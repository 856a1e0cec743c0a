// The API as its own process (`node --import tsx api/main.ts`), for tests of what only a real
// process shows: surviving a database outage, and a graceful shutdown on SIGTERM.
import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { freePort } from '../../tools/lib/process.mjs';

const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

export { freePort };

export interface ApiProcess {
  url: string;
  child: ChildProcess;
  /** Resolves with the exit code (null when killed by a signal) once the process has ended. */
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
  /** Everything the process wrote to stderr and stdout, for failure messages. */
  output(): string;
  /** SIGTERM, then SIGKILL after the grace period; resolves when it has ended. */
  stop(graceMs?: number): Promise<void>;
}

export async function startApiProcess(databaseUrl: string, env: Record<string, string> = {}): Promise<ApiProcess> {
  const port = await freePort();
  const smtpPort = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', 'api/main.ts'], {
    cwd: projectRoot,
    stdio: ['ignore', 'pipe', 'pipe'],
    env: {
      PATH: process.env.PATH ?? '',
      TMPDIR: process.env.TMPDIR ?? '',
      NODE_ENV: 'test',
      HOST: '127.0.0.1',
      PORT: String(port),
      DATABASE_URL: databaseUrl,
      SESSION_SECRET: 'test-secret-that-is-long-enough-0123456789',
      BCRYPT_COST: '10',
      LOG_LEVEL: 'warn',
      STATIC_DIR: 'no-static-dir-in-api-tests',
      SMTP_URL: `smtp://127.0.0.1:${smtpPort}`,
      SIGN_IN_LIMIT_PER_ADDRESS: '10000',
      SIGN_IN_LIMIT_PER_ACCOUNT: '10000',
      ...env,
    },
  });
  let output = '';
  child.stdout!.on('data', (chunk: Buffer) => (output += chunk.toString('utf8')));
  child.stderr!.on('data', (chunk: Buffer) => (output += chunk.toString('utf8')));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) => child.once('exit', (code, signal) => resolve({ code, signal })));
  const url = `http://127.0.0.1:${port}`;

  const deadline = Date.now() + 30_000;
  let ended = false;
  void exited.then(() => (ended = true));
  for (;;) {
    if (ended) throw new Error(`the API process ended before it served:\n${output}`);
    try {
      await fetch(`${url}/api/health`, { signal: AbortSignal.timeout(2000) });
      break;
    } catch {
      if (Date.now() > deadline) {
        child.kill('SIGKILL');
        throw new Error(`the API process did not answer within 30 s:\n${output}`);
      }
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
  }

  return {
    url,
    child,
    exited,
    output: () => output,
    async stop(graceMs = 10_000) {
      if (ended) return;
      child.kill('SIGTERM');
      const timer = setTimeout(() => child.kill('SIGKILL'), graceMs);
      await exited;
      clearTimeout(timer);
    },
  };
}
