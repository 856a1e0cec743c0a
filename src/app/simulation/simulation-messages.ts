import type { SimulationOptionsInput } from '@shared/contracts/simulation';
import type { SimulationResult } from '@shared/engine/simulation/result';

/** What the page sends the simulation worker: a design document and the run's options. */
export interface SimulationRequest {
  design: unknown;
  options: SimulationOptionsInput;
}

/** What the worker sends back: progress after each slice, then the result or an error. */
export type SimulationMessage =
  | { type: 'progress'; fraction: number }
  | { type: 'result'; result: SimulationResult }
  | { type: 'error'; message: string };
