import Tinypool from 'tinypool';
import { HttpProblem } from '../http/problem';

export interface WorkerPoolOptions {
  /** The worker module (plain JavaScript: worker threads do not inherit the server's loader). */
  file: URL;
  maxThreads: number;
  /** A task not done after this long is abandoned and its promise rejected. */
  timeoutMs: number;
  /** Tasks that may wait for a thread; one more is refused with 503 and Retry-After (unbounded when not given). */
  maxQueue?: number;
}

export interface WorkerPool {
  run<T>(task: unknown, name?: string): Promise<T>;
  /** Ends the worker threads (at shutdown); a later run starts new ones. */
  close(): Promise<void>;
}

/**
 * Worker threads for CPU-heavy work, started on first use and ended when idle for a minute. A
 * worker that fails (its module does not load, it runs out of memory) rejects the tasks waiting on
 * the pool at once and the next task gets fresh workers; nothing waits longer than the timeout.
 */
export function createWorkerPool(options: WorkerPoolOptions): WorkerPool {
  let pool: Tinypool | null = null;
  const pending = new Set<AbortController>();

  function current(): Tinypool {
    if (pool) return pool;
    const created = new Tinypool({
      filename: options.file.href,
      minThreads: 0,
      maxThreads: options.maxThreads,
      idleTimeout: 60_000,
      execArgv: [],
      maxQueue: options.maxQueue ?? Number.POSITIVE_INFINITY,
    });
    created.on('error', (error: unknown) => {
      for (const controller of pending) controller.abort(error);
      pending.clear();
      if (pool === created) pool = null;
      void created.destroy().catch(() => undefined);
    });
    pool = created;
    return created;
  }

  return {
    async run<T>(task: unknown, name?: string): Promise<T> {
      const controller = new AbortController();
      const timer = setTimeout(() => controller.abort(new Error(`the worker task took longer than ${options.timeoutMs} ms`)), options.timeoutMs);
      pending.add(controller);
      try {
        return (await current().run(task, { name: name ?? 'default', signal: controller.signal })) as T;
      } catch (error) {
        if (error instanceof Error && /queue is at limit/i.test(error.message)) {
          throw new HttpProblem(503, 'Server busy', 'The server has too much of this work queued right now; try again in a few seconds.', [], { 'Retry-After': '5' });
        }
        throw controller.signal.aborted ? controller.signal.reason : error;
      } finally {
        clearTimeout(timer);
        pending.delete(controller);
      }
    },
    async close() {
      const closing = pool;
      pool = null;
      await closing?.destroy();
    },
  };
}
