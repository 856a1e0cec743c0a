import type { Design } from '@shared/contracts/design';
import { MAX_SWEEP_POINTS, sweepBudget, sweepValues, type SweepRequest } from '@shared/engine/index';
import { sweepRow, type SweepRow } from './sweep-figures';

/**
 * Evaluates a sweep one point at a time, so the caller can report progress between points.
 * Returns the rows, or the message when the request itself is wrong (a path the design lacks).
 */
export function evaluateSweep(design: Design, request: SweepRequest, progress: (done: number, total: number) => void): { ok: true; rows: SweepRow[] } | { ok: false; message: string } {
  if (!Number.isInteger(request.points) || request.points < 1 || request.points > MAX_SWEEP_POINTS) {
    return { ok: false, message: `Points must be a whole number from 1 to ${MAX_SWEEP_POINTS}` };
  }
  // One point checks the path and the ends the way the engine does.
  const check = sweepBudget(design, { ...request, points: 1 });
  if (!check.ok) return check;
  const values = sweepValues(request);
  const rows: SweepRow[] = [];
  values.forEach((value, index) => {
    const result = sweepBudget(design, { path: request.path, from: value, to: value, points: 1, scale: 'linear' });
    if (!result.ok) throw new Error(result.message);
    rows.push(sweepRow(result.points[0]));
    progress(index + 1, values.length);
  });
  return { ok: true, rows };
}
