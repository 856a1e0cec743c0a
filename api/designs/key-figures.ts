import type { Design } from '@shared/contracts/design';
import type { KeyFigures } from '@shared/contracts/designs-api';
import type { Budget } from '@shared/contracts/figures';
import { evaluateBudget } from '@shared/engine/budget/evaluate';

/** The figures a version keeps, from the shared engine's budget of its document. */
export function keyFiguresOf(budget: Budget): KeyFigures {
  const worst = budget.levels.reduce<{ node: string; usedFraction: number } | null>((found, level) => {
    if (level.usedFraction === null) return found;
    return found === null || level.usedFraction > found.usedFraction ? { node: level.node, usedFraction: level.usedFraction } : found;
  }, null);
  const counts = { error: 0, warning: 0, note: 0 };
  for (const finding of budget.findings) counts[finding.severity] += 1;
  return {
    voltsPerFarad: budget.sensitivity.voltsPerFarad,
    resolution: {
      farad: budget.resolution.farad,
      pascal: budget.resolution.pascal,
      cubicMetrePerSecond: budget.resolution.cubicMetrePerSecond,
      bandLow: budget.resolution.bandLow,
      bandHigh: budget.resolution.bandHigh,
    },
    outputNoiseRms: budget.noise.outputRms,
    worstHeadroom: worst,
    ripplePeak: budget.ripple.outputPeak,
    findings: counts,
  };
}

export function computeKeyFigures(design: Design): KeyFigures {
  return keyFiguresOf(evaluateBudget(design));
}
