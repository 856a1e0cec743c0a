/** The engine's public face: what the workbench, the API and the CLI call. */
export { evaluateBudget, type BudgetOptions } from './budget/evaluate';
export { analyseDesign, type DesignAnalysis } from './analyse';
export { sweepBudget, sweepValues, MAX_SWEEP_POINTS, type SweepPoint, type SweepRequest, type SweepResult } from './sweep/sweep';
export { parseDesignPath, numberAt, withNumberAt } from './sweep/design-path';
export { createStageRegistry, stageRegistry, type StageRegistry } from './stages/registry';
export type { StageModule, PreparedStage, NoiseSource, StageContext, StageCheckView, BlockProcessor } from './stages/stage';
export { hagenPoiseuilleResistance, reynoldsNumber } from './stages/sensor';
