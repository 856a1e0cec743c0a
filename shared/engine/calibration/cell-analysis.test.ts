import { describe, expect, it } from 'vitest';
import { analyseCell } from './cell-analysis';
import { compareDegrees } from './degree-comparison';
import type { CalibrationPoint, TraverseDirection } from './points';

function point(reference: number, readout: number, run = 'r1', direction: TraverseDirection = 'up'): CalibrationPoint {
  return { reference, readout, cell: 'A', run, direction };
}

describe('nonlinearity of y = x^2 on [0, 1] (ENGINE.md section 8 check case, ANSI/ISA-51.1 terms)', () => {
  const x = Array.from({ length: 2001 }, (_, i) => i / 2000);
  const points = x.map((value) => point(value, value * value));
  const analysis = analyseCell(points, { direction: 'characteristic', degree: 1, setpointTolerance: 0 });
  const byLine = Object.fromEntries(analysis.nonlinearity.map((figure) => [figure.against, figure.percentFullScale]));

  it('deviates 25 %FS from the terminal-based line', () => {
    expect(byLine['terminal-based line']).toBeCloseTo(25, 10);
  });

  it('deviates 16.67 %FS from the least-squares line (2001 points: within 0.01 %FS of the continuous 100/6)', () => {
    expect(Math.abs(byLine['least-squares line'] - 100 / 6)).toBeLessThan(0.01);
  });

  it('deviates 12.5 %FS from the minimax line', () => {
    expect(byLine['minimax line']).toBeCloseTo(12.5, 10);
  });

  it('names the fitted curve alone for a higher degree', () => {
    const quadratic = analyseCell(points, { direction: 'characteristic', degree: 2, setpointTolerance: 0 });
    expect(quadratic.nonlinearity.map((figure) => figure.against)).toEqual(['least-squares quadratic']);
    expect(quadratic.nonlinearity[0].percentFullScale).toBeLessThan(1e-9);
  });
});

/**
 * Hand-computed case: set points 0, 50, 100; runs r1 and r2, each up and down.
 * Readout span = mean at 100 (100.1) - mean at 0 (1.3) = 98.8.
 * Hysteresis: at 50, mean down 52.3 - mean up 51.2 = 1.1, the largest (0.4 at 0, 0 at 100): 1.1 / 98.8 = 1.11336 %FS.
 * Repeatability: at 50 downscale the runs read 52.0 and 52.6: 0.6, the largest: 0.6 / 98.8 = 0.60729 %FS.
 */
const benchCase: CalibrationPoint[] = [
  point(0, 1.0, 'r1', 'up'),
  point(50, 51.0, 'r1', 'up'),
  point(100, 100.0, 'r1', 'up'),
  point(100, 100.0, 'r1', 'down'),
  point(50, 52.0, 'r1', 'down'),
  point(0, 1.4, 'r1', 'down'),
  point(0, 1.2, 'r2', 'up'),
  point(50, 51.4, 'r2', 'up'),
  point(100, 100.2, 'r2', 'up'),
  point(100, 100.2, 'r2', 'down'),
  point(50, 52.6, 'r2', 'down'),
  point(0, 1.6, 'r2', 'down'),
];

describe('hysteresis and repeatability (hand-computed case, ANSI/ISA-51.1 definitions)', () => {
  const analysis = analyseCell(benchCase, { direction: 'characteristic', degree: 1 });

  it('finds the readout span between the end set points', () => {
    expect(analysis.readoutSpan).toBeCloseTo(98.8, 12);
    expect(analysis.referenceSpan).toBe(100);
  });

  it('gives hysteresis as the largest up/down difference at one set point', () => {
    expect(analysis.hysteresis?.value).toBeCloseTo(1.1, 12);
    expect(analysis.hysteresis?.percentFullScale).toBeCloseTo((100 * 1.1) / 98.8, 10);
    expect(analysis.hysteresis?.atReference).toBe(50);
  });

  it('gives repeatability as the largest spread between runs at one set point and direction', () => {
    expect(analysis.repeatability?.value).toBeCloseTo(0.6, 12);
    expect(analysis.repeatability?.percentFullScale).toBeCloseTo((100 * 0.6) / 98.8, 10);
    expect(analysis.repeatability?.against).toBe('runs at the same set point, downscale');
  });

  it('leaves hysteresis and repeatability out when one run in one direction cannot show them', () => {
    const single = analyseCell(
      benchCase.filter((entry) => entry.run === 'r1' && entry.direction === 'up'),
      { direction: 'characteristic', degree: 1 },
    );
    expect(single.hysteresis).toBeNull();
    expect(single.repeatability).toBeNull();
    expect(single.resolution).toBeNull();
  });

  it('turns a noise figure into resolution through the local slope (computed: 0.5 / slope 2 = 0.25)', () => {
    const line = [0, 10, 20, 30].map((reference) => point(reference, 2 * reference + 1));
    const result = analyseCell(line, { direction: 'characteristic', degree: 1, noiseRms: 0.5 });
    expect(result.resolution?.source).toBe('noise figure');
    expect(result.resolution?.value).toBeCloseTo(0.25, 12);
    expect(result.resolution?.percentFullScale).toBeCloseTo((100 * 0.25) / 30, 12);
    const inverse = analyseCell(line, { direction: 'calibration', degree: 1, noiseRms: 0.5 });
    expect(inverse.resolution?.value).toBeCloseTo(0.25, 12);
  });

  it('takes the measured spread as the pooled standard deviation at each set point and direction (computed)', () => {
    // Every (set point, direction) pair has two readings differing by d: the pooled SD is sqrt(sum (d/2)^2 * 2 / 6).
    const differences = [0.2, 0.2, 0.4, 0.6, 0.2, 0.2];
    const pooled = Math.sqrt(differences.reduce((sum, d) => sum + (d * d) / 2, 0) / 6);
    const slope = analysis.fit.coefficients[1];
    expect(analysis.resolution?.source).toBe('measured spread');
    expect(analysis.resolution?.noiseRms).toBeCloseTo(pooled, 12);
    expect(analysis.resolution?.value).toBeCloseTo(pooled / slope, 12);
  });
});

describe('degree comparison', () => {
  it('lists degrees 1-5 and explains the ones the data cannot carry (computed)', () => {
    const rows = compareDegrees(
      [0, 1, 2, 3, 4].map((reference) => point(reference, reference ** 3)),
      { direction: 'characteristic', setpointTolerance: 0 },
    );
    expect(rows.map((row) => row.degree)).toEqual([1, 2, 3, 4, 5]);
    expect(rows[2].nonlinearityPercentFullScale).toBeLessThan(1e-10);
    expect(rows[0].nonlinearityPercentFullScale).toBeGreaterThan(rows[1].nonlinearityPercentFullScale ?? Infinity);
    expect(rows[3].problem).toMatch(/needs at least 6 points/);
    expect(rows[4].residualSd).toBeNull();
  });
});
