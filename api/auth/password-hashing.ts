import { availableParallelism } from 'node:os';
import { createWorkerPool } from '../workers/worker-pool';

/**
 * Password hashing and checking, off the main thread: a small pool of worker threads (one less than
 * the processor count, at least one, at most four) does the bcrypt work, so a burst of sign-ins
 * queues there instead of stalling the requests that only read.
 */
const workers = createWorkerPool({
  file: new URL('./password-worker.mjs', import.meta.url),
  maxThreads: Math.max(1, Math.min(4, availableParallelism() - 1)),
  timeoutMs: 30_000,
});

export function hashPassword(password: string, cost: number): Promise<string> {
  return workers.run<string>({ password, cost }, 'hash');
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return workers.run<boolean>({ password, hash }, 'compare');
}

/** Ends the worker threads (at shutdown); the next call starts new ones. */
export function closePasswordWorkers(): Promise<void> {
  return workers.close();
}
