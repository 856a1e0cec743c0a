import { describe, expect, it } from 'vitest';
import { HttpProblem } from '../http/problem';
import { createWorkerPool } from './worker-pool';

const fixture = (name: string) => new URL(`../../test/fixtures/workers/${name}`, import.meta.url);

describe('worker pool', () => {
  it('runs the default and named tasks of the worker module', async () => {
    const pool = createWorkerPool({ file: fixture('echo.mjs'), maxThreads: 2, timeoutMs: 10_000 });
    try {
      expect(await pool.run({ a: [1, 2] })).toEqual({ echoed: { a: [1, 2] } });
      expect(await Promise.all([1, 2, 3].map((n) => pool.run<number>(n, 'twice')))).toEqual([2, 4, 6]);
    } finally {
      await pool.close();
    }
  });

  it('rejects at once, without waiting for the timeout, when the worker cannot load, and tries again on the next task', async () => {
    const pool = createWorkerPool({ file: fixture('broken.mjs'), maxThreads: 1, timeoutMs: 60_000 });
    try {
      const started = Date.now();
      await expect(pool.run(1)).rejects.toThrow(/cannot load/);
      expect(Date.now() - started).toBeLessThan(30_000);
      await expect(pool.run(2)).rejects.toThrow(/cannot load/);
    } finally {
      await pool.close();
    }
  });

  it('refuses a task beyond the queue limit with a 503 problem and Retry-After', async () => {
    const pool = createWorkerPool({ file: fixture('stuck.mjs'), maxThreads: 1, timeoutMs: 2000, maxQueue: 1 });
    try {
      const running = pool.run(1).catch((error: unknown) => error);
      const waiting = pool.run(2).catch((error: unknown) => error);
      await new Promise((resolve) => setTimeout(resolve, 200));
      const refused = await pool.run(3).catch((error: unknown) => error);
      expect(refused).toBeInstanceOf(HttpProblem);
      expect(refused).toMatchObject({ status: 503, headers: { 'Retry-After': '5' } });
      expect(await running).toBeInstanceOf(Error);
      expect(await waiting).toBeInstanceOf(Error);
    } finally {
      await pool.close();
    }
  });

  it('abandons a task that takes longer than the timeout', async () => {
    const pool = createWorkerPool({ file: fixture('stuck.mjs'), maxThreads: 1, timeoutMs: 300 });
    try {
      await expect(pool.run(1)).rejects.toThrow(/longer than 300 ms/);
    } finally {
      await pool.close();
    }
  });
});
