import { Injectable } from '@angular/core';
import { Observable } from 'rxjs';
import type { SpectrumJob, SpectrumKind, SpectrumMessage } from './spectrum-messages';

export interface Spectrum {
  /** Bin frequencies [Hz]. */
  readonly frequencies: Float64Array;
  /** Per bin: [unit/rtHz] for a density, [unit peak] for an amplitude spectrum. */
  readonly values: Float64Array;
}

/**
 * Welch spectra in a Web Worker: a record of a million samples takes longer than a frame, so the
 * page only copies the samples over. Unsubscribing terminates the worker.
 */
@Injectable({ providedIn: 'root' })
export class SpectrumRunner {
  spectrum(samples: Float64Array, sampleRate: number, segmentLength: number, kind: SpectrumKind): Observable<Spectrum> {
    return new Observable<Spectrum>((subscriber) => {
      const worker = new Worker(new URL('./spectrum.worker', import.meta.url), { type: 'module' });
      worker.onmessage = ({ data }: MessageEvent<SpectrumMessage>) => {
        if (data.kind === 'done') {
          subscriber.next({ frequencies: data.frequencies, values: data.values });
          subscriber.complete();
        } else subscriber.error(new Error(data.message));
      };
      worker.onerror = (event) => {
        event.preventDefault();
        subscriber.error(new Error(event.message || 'The spectrum worker stopped'));
      };
      // The simulation result keeps its own samples: the worker gets a copy it may own.
      const copy = samples.slice();
      const job: SpectrumJob = { samples: copy, sampleRate, segmentLength, kind };
      worker.postMessage(job, [copy.buffer]);
      return () => worker.terminate();
    });
  }
}
