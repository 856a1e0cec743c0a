/**
 * Hysteresis and repeatability as ANSI/ISA-51.1 defines them, both in % of the readout span:
 * hysteresis is the largest difference between the upscale and downscale readouts at the same set
 * point (each the mean over the cell's runs, so run-to-run spread is left to repeatability);
 * repeatability is the largest spread between runs at the same set point and direction.
 */
import type { PercentFigure } from './figure';
import { mean } from './points';
import type { SetpointReadings } from './setpoints';

/** Largest |mean up - mean down| over the set points; null when no set point has both directions. */
export function hysteresis(setpoints: ReadonlyArray<SetpointReadings>, span: number): PercentFigure | null {
  let worst: PercentFigure | null = null;
  for (const setpoint of setpoints) {
    const up: number[] = [];
    const down: number[] = [];
    for (const entry of setpoint.byRun.values()) (entry.direction === 'up' ? up : down).push(...entry.readouts);
    if (up.length === 0 || down.length === 0) continue;
    const value = Math.abs(mean(up) - mean(down));
    if (worst === null || value > worst.value) {
      worst = { against: 'upscale and downscale readouts at the same set point', value, percentFullScale: (100 * value) / span, atReference: setpoint.reference };
    }
  }
  return worst;
}

/** Largest spread (max - min) of the runs' mean readouts at one set point and direction; null with fewer than two runs anywhere. */
export function repeatability(setpoints: ReadonlyArray<SetpointReadings>, span: number): PercentFigure | null {
  let worst: PercentFigure | null = null;
  for (const setpoint of setpoints) {
    for (const direction of ['up', 'down'] as const) {
      const runMeans = [...setpoint.byRun.values()].filter((entry) => entry.direction === direction).map((entry) => mean(entry.readouts));
      if (runMeans.length < 2) continue;
      const value = Math.max(...runMeans) - Math.min(...runMeans);
      if (worst === null || value > worst.value) {
        worst = { against: `runs at the same set point, ${direction}scale`, value, percentFullScale: (100 * value) / span, atReference: setpoint.reference };
      }
    }
  }
  return worst;
}
