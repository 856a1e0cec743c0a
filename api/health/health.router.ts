import { Router } from 'express';
import { sql, type Kysely } from 'kysely';
import type { Health } from '@shared/contracts/auth';
import type { Database } from '../db/database';
import type { Operation } from '../openapi/operation';
import { healthSchema } from '@shared/contracts/auth';

const PROBE_TIMEOUT_MS = 2000;

async function probeDatabase(db: Kysely<Database>): Promise<number | null> {
  const started = performance.now();
  let timer: NodeJS.Timeout | undefined;
  try {
    await Promise.race([
      sql`select 1`.execute(db),
      new Promise((_, reject) => {
        timer = setTimeout(() => reject(new Error('database probe timed out')), PROBE_TIMEOUT_MS);
      }),
    ]);
    return Math.round((performance.now() - started) * 100) / 100;
  } catch {
    return null;
  } finally {
    clearTimeout(timer);
  }
}

export function healthRouter(db: Kysely<Database>, version: string): Router {
  const router = Router();
  router.get('/health', async (_req, res) => {
    const latencyMs = await probeDatabase(db);
    const body: Health = {
      status: latencyMs === null ? 'degraded' : 'ok',
      version,
      database: { up: latencyMs !== null, latencyMs },
      time: new Date().toISOString(),
    };
    res.status(latencyMs === null ? 503 : 200).json(body);
  });
  return router;
}

export const healthOperations: Operation[] = [
  {
    method: 'get',
    path: '/api/health',
    summary: 'Is the API up, and can it reach the database?',
    tag: 'Service',
    access: 'public',
    responses: { 200: { description: 'Up', schema: healthSchema }, 503: { description: 'Database unreachable', schema: healthSchema } },
  },
];
