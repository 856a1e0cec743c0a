import type { KeyFigures } from '@shared/contracts/designs-api';
import { formatQuantity } from '@shared/units/format';

/** Resolution of a saved version as a designer reads it: aF, and Pa or nL/s by the sensor's mode. */
export function resolutionText(figures: KeyFigures): string {
  const { farad, pascal, cubicMetrePerSecond } = figures.resolution;
  const parts: string[] = [];
  if (farad !== null) parts.push(formatQuantity(farad, 'capacitance'));
  if (cubicMetrePerSecond !== null) parts.push(formatQuantity(cubicMetrePerSecond, 'volumeFlow'));
  else if (pascal !== null) parts.push(formatQuantity(pascal, 'pressure'));
  return parts.length === 0 ? 'undefined' : parts.join(' · ');
}

export function noiseText(figures: KeyFigures): string {
  return `${formatQuantity(figures.outputNoiseRms, 'voltage')} rms`;
}

export function headroomText(figures: KeyFigures): string {
  const worst = figures.worstHeadroom;
  return worst === null ? 'no swing limits' : `${percent(worst.usedFraction)} at ${worst.node}`;
}

export function percent(fraction: number, digits = 0): string {
  return `${(fraction * 100).toFixed(digits)} %`;
}
