// Child processes of the benchmark and outage scripts: started with the project's loader, their
// stderr passed through with a label, and all stopped at the end (SIGTERM, SIGKILL after 5 s).
import { spawn, type ChildProcess } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { freePort } from '../lib/process.mjs';

export const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

const children: ChildProcess[] = [];

export { freePort };

export function startScript(label: string, script: string, env: Record<string, string>, nodeArgs: string[] = []): ChildProcess {
  const child = spawn(process.execPath, [...nodeArgs, '--import', 'tsx', script], { cwd: projectRoot, env: { ...process.env, ...env }, stdio: ['ignore', 'ignore', 'pipe'] });
  child.stderr!.on('data', (chunk: Buffer) => process.stderr.write(`[${label}] ${chunk.toString('utf8')}`));
  children.push(child);
  return child;
}

export async function waitForHttp(url: string, child: ChildProcess): Promise<void> {
  const deadline = Date.now() + 30_000;
  while (Date.now() < deadline) {
    if (child.exitCode !== null) throw new Error(`${url}: the process ended with ${child.exitCode}`);
    try {
      await fetch(url, { signal: AbortSignal.timeout(1000) });
      return;
    } catch {
      await new Promise((resolve) => setTimeout(resolve, 100));
    }
  }
  throw new Error(`${url} did not answer within 30 s`);
}

async function stopChild(child: ChildProcess): Promise<void> {
  if (child.exitCode !== null || child.signalCode !== null) return;
  const ended = new Promise((resolve) => child.once('exit', resolve));
  child.kill('SIGTERM');
  const timer = setTimeout(() => child.kill('SIGKILL'), 5000);
  await ended;
  clearTimeout(timer);
}

export async function stopScripts(): Promise<void> {
  await Promise.all(children.map(stopChild));
}

/**
 * Runs a script's main part bounded in time: Ctrl+C, SIGTERM or the deadline stop everything it
 * started (cleanUp) and end the process; an error is printed and sets exit code 1; cleanUp always runs.
 */
export async function runBounded(label: string, deadlineMs: number, main: () => Promise<void>, cleanUp: () => Promise<void>): Promise<void> {
  const deadline = setTimeout(() => {
    process.stderr.write(`[${label}] not done after ${deadlineMs / 1000} s: stopping everything\n`);
    void cleanUp().finally(() => process.exit(1));
  }, deadlineMs);
  deadline.unref();
  for (const signal of ['SIGINT', 'SIGTERM'] as const) {
    process.on(signal, () => void cleanUp().finally(() => process.exit(130)));
  }
  try {
    await main();
  } catch (error) {
    process.stderr.write(`[${label}] ${error instanceof Error ? error.stack : String(error)}\n`);
    process.exitCode = 1;
  } finally {
    await cleanUp();
    clearTimeout(deadline);
  }
}
