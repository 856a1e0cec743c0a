import { Injectable } from '@angular/core';
import type { Design } from '@shared/contracts/design';
import type { SweepRequest } from '@shared/engine/index';
import { Observable } from 'rxjs';
import { evaluateSweep } from './sweep-evaluation';
import type { SweepRow } from './sweep-figures';
import type { SweepJob, SweepMessage } from './sweep-messages';

/** Sweeps up to this many points run on the main thread; longer ones in a worker. */
export const MAIN_THREAD_SWEEP_POINTS = 100;

export type SweepEvent = { readonly kind: 'progress'; readonly fraction: number } | { readonly kind: 'done'; readonly rows: readonly SweepRow[] };

/**
 * Runs a sweep: short ones at once on the main thread, longer ones in a Web Worker with progress.
 * Unsubscribing cancels (the worker is terminated).
 */
@Injectable({ providedIn: 'root' })
export class SweepRunner {
  run(design: Design, request: SweepRequest): Observable<SweepEvent> {
    return request.points > MAIN_THREAD_SWEEP_POINTS ? this.inWorker(design, request) : this.onMainThread(design, request);
  }

  private onMainThread(design: Design, request: SweepRequest): Observable<SweepEvent> {
    return new Observable<SweepEvent>((subscriber) => {
      const result = evaluateSweep(design, request, () => undefined);
      if (!result.ok) {
        subscriber.error(new Error(result.message));
        return;
      }
      subscriber.next({ kind: 'done', rows: result.rows });
      subscriber.complete();
    });
  }

  private inWorker(design: Design, request: SweepRequest): Observable<SweepEvent> {
    return new Observable<SweepEvent>((subscriber) => {
      const worker = new Worker(new URL('./sweep.worker', import.meta.url), { type: 'module' });
      worker.onmessage = ({ data }: MessageEvent<SweepMessage>) => {
        if (data.kind === 'progress') subscriber.next({ kind: 'progress', fraction: data.done / data.total });
        else if (data.kind === 'done') {
          subscriber.next({ kind: 'done', rows: data.rows });
          subscriber.complete();
        } else subscriber.error(new Error(data.message));
      };
      worker.onerror = (event) => {
        event.preventDefault();
        subscriber.error(new Error(event.message || 'The sweep worker stopped'));
      };
      const job: SweepJob = { design, request };
      worker.postMessage(job);
      return () => worker.terminate();
    });
  }
}
