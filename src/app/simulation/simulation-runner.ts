import { Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { SimulationOptionsInput } from '@shared/contracts/simulation';
import type { SimulationResult } from '@shared/engine/simulation/result';
import type { SimulationMessage, SimulationRequest } from './simulation-messages';

/** Progress (fraction of the work done, 0 to 1) while the run goes, then its result. */
export type SimulationEvent = { type: 'progress'; fraction: number } | { type: 'result'; result: SimulationResult };

/**
 * Runs time-domain simulations in a Web Worker, one worker per run, so the page never waits on
 * them. Unsubscribing or cancel() terminates the worker at once; the result's waveforms arrive as
 * transferred typed arrays (no copy).
 */
@Injectable({ providedIn: 'root' })
export class SimulationRunner {
  private readonly running = new Set<() => void>();

  /** @param design a design document (validated again in the worker). */
  run(design: unknown, options: SimulationOptionsInput): Observable<SimulationEvent> {
    return new Observable<SimulationEvent>((subscriber) => {
      const worker = new Worker(new URL('./simulation.worker', import.meta.url), { type: 'module' });
      const stop = () => {
        worker.terminate();
        this.running.delete(stop);
      };
      const cancel = () => {
        stop();
        subscriber.complete();
      };
      this.running.add(cancel);
      worker.onmessage = ({ data }: MessageEvent<SimulationMessage>) => {
        if (data.type === 'progress') subscriber.next(data);
        else if (data.type === 'result') {
          subscriber.next(data);
          stop();
          subscriber.complete();
        } else {
          stop();
          subscriber.error(new Error(data.message));
        }
      };
      worker.onerror = (event) => {
        event.preventDefault();
        stop();
        subscriber.error(new Error(event.message || 'The simulation worker failed'));
      };
      const request: SimulationRequest = { design, options };
      worker.postMessage(request);
      return stop;
    });
  }

  /** Stops every run in progress; their observables complete without a result. */
  cancel(): void {
    for (const cancel of [...this.running]) cancel();
  }
}
