import { describe, expect, it } from 'vitest';
import { sweepBudget, sweepValues } from './sweep';
import { numberAt, parseDesignPath, withNumberAt } from './design-path';
import { demoDesign } from '../../../test/fixtures/engine/designs';

describe('design paths', () => {
  it('reads the paths validation messages use, and stage ids', () => {
    expect(parseDesignPath('chain[2].corner')).toEqual(['chain', 2, 'corner']);
    expect(parseDesignPath('chain[lp].corner')).toEqual(['chain', '#lp', 'corner']);
    expect(parseDesignPath('excitation.amplitude')).toEqual(['excitation', 'amplitude']);
    expect(parseDesignPath('chain[2')).toBeNull();
    const design = demoDesign();
    expect(numberAt(design, ['chain', '#lp', 'corner'])).toBe(500);
    expect(numberAt(design, ['chain', '#nope', 'corner'])).toBeNull();
  });

  it('copies only along the path and leaves the original alone', () => {
    const design = demoDesign();
    const changed = withNumberAt(design, ['chain', 4, 'corner'], 300);
    expect(changed?.chain[4]).toMatchObject({ corner: 300 });
    expect(design.chain[4]).toMatchObject({ corner: 500 });
    expect(changed?.sensor).toBe(design.sensor);
  });
});

describe('sweeps', () => {
  it('spaces values linearly or in log', () => {
    expect(sweepValues({ path: 'x', from: 1, to: 3, points: 3, scale: 'linear' })).toEqual([1, 2, 3]);
    const log = sweepValues({ path: 'x', from: 10, to: 1000, points: 3, scale: 'log' });
    expect(log[1]).toBeCloseTo(100, 10);
  });

  it('returns every figure per point over 1000 points', () => {
    const result = sweepBudget(demoDesign(), { path: 'chain[lp].corner', from: 50, to: 5000, points: 1000, scale: 'log' });
    expect(result.ok).toBe(true);
    if (!result.ok) return;
    expect(result.points).toHaveLength(1000);
    const noise = result.points.map((p) => p.budget?.noise.outputRms ?? Number.NaN);
    // A higher low-pass corner lets more noise through: the output noise rises along the sweep.
    expect(noise[999]).toBeGreaterThan(noise[0]);
    expect(result.points[500].budget?.levels).toHaveLength(6);
  });

  it('gives the errors of a point the design cannot take instead of a budget', () => {
    const result = sweepBudget(demoDesign(), { path: 'excitation.trim', from: 1, to: 3, points: 3, scale: 'linear' });
    expect(result.ok && result.points.map((p) => p.errors?.[0]?.path ?? null)).toEqual([null, null, 'excitation.trim']);
  });

  it('refuses a request it cannot run, with the reason', () => {
    const design = demoDesign();
    expect(sweepBudget(design, { path: 'chain[9].corner', from: 1, to: 2, points: 2, scale: 'linear' })).toEqual({ ok: false, message: 'The design has no number at chain[9].corner' });
    expect(sweepBudget(design, { path: 'chain[4].corner', from: 1, to: 2, points: 1001, scale: 'linear' })).toEqual({ ok: false, message: 'Points must be a whole number from 1 to 1000' });
    expect(sweepBudget(design, { path: 'chain[4].corner', from: -1, to: 2, points: 3, scale: 'log' })).toEqual({ ok: false, message: 'A log sweep needs both ends above 0' });
  });
});
