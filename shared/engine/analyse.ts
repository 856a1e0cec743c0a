import { loadDesign } from '../contracts/design-loader';
import { createDesignSchema, designSchema, type Design } from '../contracts/design';
import type { Budget } from '../contracts/figures';
import type { FieldError } from '../contracts/problem';
import { evaluateBudget } from './budget/evaluate';
import { stageRegistry, type StageRegistry } from './stages/registry';

export type DesignAnalysis =
  | { ok: true; design: Design; budget: Budget; upgradedFrom: number | null }
  | { ok: false; errors: FieldError[]; upgradedFrom: number | null };

/** Loads (upgrading older versions), validates and evaluates a design document in one call. */
export function analyseDesign(document: unknown, registry: StageRegistry = stageRegistry): DesignAnalysis {
  const schema = registry === stageRegistry ? designSchema : createDesignSchema(registry);
  const loaded = loadDesign(document, schema);
  if (!loaded.ok) return loaded;
  return { ok: true, design: loaded.design, budget: evaluateBudget(loaded.design, { registry }), upgradedFrom: loaded.upgradedFrom };
}
