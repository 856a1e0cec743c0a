import type { Design } from '@shared/contracts/design';
import { createWorkerPool } from '../workers/worker-pool';
import type { ReportSpectrum } from './design-report';

/**
 * The report's spectrum comes from a half-second time-domain simulation with noise: it runs in a
 * worker thread, one report at a time, so drawing a report never holds up the other requests. A run
 * that takes longer than 30 s is abandoned (the report then says the simulation did not run).
 */
const workers = createWorkerPool({ file: new URL('./spectrum-worker.mjs', import.meta.url), maxThreads: 1, timeoutMs: 30_000, maxQueue: 16 });

export function simulateReportSpectrum(design: Design): Promise<ReportSpectrum | null> {
  return workers.run<ReportSpectrum | null>(design);
}

/** Ends the worker thread (at shutdown); the next report starts a new one. */
export function closeReportWorkers(): Promise<void> {
  return workers.close();
}
