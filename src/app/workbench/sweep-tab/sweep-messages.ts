import type { Design } from '@shared/contracts/design';
import type { SweepRequest } from '@shared/engine/index';
import type { SweepRow } from './sweep-figures';

/** Main thread to the sweep worker: one sweep per message. */
export interface SweepJob {
  readonly design: Design;
  readonly request: SweepRequest;
}

/** The worker's answers: progress while it works, then the rows or the reason it could not start. */
export type SweepMessage =
  | { readonly kind: 'progress'; readonly done: number; readonly total: number }
  | { readonly kind: 'done'; readonly rows: readonly SweepRow[] }
  | { readonly kind: 'failed'; readonly message: string };
