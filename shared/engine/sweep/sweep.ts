import { createDesignSchema, designSchema, validateDesign, type Design } from '../../contracts/design';
import type { Budget } from '../../contracts/figures';
import type { FieldError } from '../../contracts/problem';
import { evaluateBudget, type BudgetOptions } from '../budget/evaluate';
import { numberAt, parseDesignPath, withNumberAt } from './design-path';

export const MAX_SWEEP_POINTS = 1000;

export interface SweepRequest {
  /** Path of the swept number, e.g. "chain[4].corner" or "excitation.amplitude". */
  path: string;
  from: number;
  to: number;
  points: number;
  scale: 'linear' | 'log';
}

/** One point of a sweep: the budget, or the validation errors the value caused. */
export type SweepPoint = { value: number; budget: Budget; errors: null } | { value: number; budget: null; errors: FieldError[] };

export type SweepResult = { ok: true; path: string; scale: 'linear' | 'log'; points: SweepPoint[] } | { ok: false; message: string };

/** The values of a sweep: linear, or evenly spaced in log (both ends positive). */
export function sweepValues(request: SweepRequest): number[] {
  const { from, to, points, scale } = request;
  if (points === 1) return [from];
  return Array.from({ length: points }, (_, i) => {
    const t = i / (points - 1);
    return scale === 'log' ? from * Math.pow(to / from, t) : from + (to - from) * t;
  });
}

function checkRequest(design: Design, request: SweepRequest): string | null {
  if (!Number.isInteger(request.points) || request.points < 1 || request.points > MAX_SWEEP_POINTS) return `Points must be a whole number from 1 to ${MAX_SWEEP_POINTS}`;
  if (!Number.isFinite(request.from) || !Number.isFinite(request.to)) return 'Sweep ends must be finite numbers';
  if (request.scale === 'log' && (request.from <= 0 || request.to <= 0)) return 'A log sweep needs both ends above 0';
  const parts = parseDesignPath(request.path);
  if (parts === null) return `"${request.path}" is not a path like chain[2].corner or excitation.amplitude`;
  if (numberAt(design, parts) === null) return `The design has no number at ${request.path}`;
  return null;
}

/**
 * Evaluates the budget over one parameter's range. Every point is validated, so a value the design
 * cannot take (a negative corner) gives that point's errors instead of a budget.
 */
export function sweepBudget(design: Design, request: SweepRequest, options: BudgetOptions = {}): SweepResult {
  const problem = checkRequest(design, request);
  if (problem !== null) return { ok: false, message: problem };
  const parts = parseDesignPath(request.path) ?? [];
  const schema = options.registry === undefined ? designSchema : createDesignSchema(options.registry);
  const points = sweepValues(request).map((value): SweepPoint => {
    const changed = withNumberAt(design, parts, value);
    const validation = validateDesign(changed, schema);
    if (!validation.ok) return { value, budget: null, errors: validation.errors };
    return { value, budget: evaluateBudget(validation.design, options), errors: null };
  });
  return { ok: true, path: request.path, scale: request.scale, points };
}
