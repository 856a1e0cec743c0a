// Child processes of the benchmark and outage scripts: started with the project's loader, their
// stderr passed through with a label, and all stopped at the end (SIGTERM, SIGKILL after 5 s).
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer } from 'node:net';
import { fileURLToPath } from 'node:url';

export const projectRoot = fileURLToPath(new URL('../..', import.meta.url));

const children: ChildProcess[] = [];

/** A loopback port nobody listens on right now. */
export async function freePort(): Promise<number> {
  const probe = createServer();
  await new Promise<void>((resolve) => probe.listen(0, '127.0.0.1', resolve));
  const { port } = probe.address() as { port: number };
  await new Promise((resolve) => probe.close(resolve));
  return port;
}

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
