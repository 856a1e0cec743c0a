import { availableParallelism } from 'node:os';
import { createWorkerPool } from '../workers/worker-pool';

/**
 * Password hashing and checking, off the main thread: a small pool of worker threads (one less than
 * the processor count, at least one, at most four) does the bcrypt work, so a burst of sign-ins
 * queues there instead of stalling the requests that only read, and a flood of them is turned away
 * with 503 instead of queueing without end.
 */
const threads = Math.max(1, Math.min(4, availableParallelism() - 1));
const workers = createWorkerPool({
  file: new URL('./password-worker.mjs', import.meta.url),
  maxThreads: threads,
  timeoutMs: 30_000,
  // About 25 s of work at cost 12 per thread: more sign-ins than that at once get 503 and Retry-After.
  maxQueue: 64 * threads,
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
