import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { validateDesign } from '../../contracts/design';
import { evaluateBudget } from './evaluate';
import { demoDocument } from '../../../test/fixtures/engine/designs';

/** Random designs around the demo: every number the schema allows within a few decades, chains with and without the optional stages. */
const designArbitrary = fc
  .record({
    mode: fc.constantFrom('pressure', 'flow'),
    c1: fc.double({ min: 1e-20, max: 1e-17, noNaN: true }),
    c2: fc.double({ min: -1e-24, max: 1e-24, noNaN: true }),
    mismatch: fc.double({ min: -0.1, max: 0.1, noNaN: true }),
    amplitude: fc.double({ min: 0.1, max: 3, noNaN: true }),
    frequency: fc.double({ min: 1e3, max: 1e6, noNaN: true }),
    trim: fc.double({ min: 0, max: 2, noNaN: true }),
    trimBits: fc.integer({ min: 1, max: 16 }),
    cf: fc.double({ min: 1e-14, max: 1e-10, noNaN: true }),
    rf: fc.double({ min: 1e6, max: 1e13, noNaN: true }),
    gbw: fc.double({ min: 1e5, max: 1e9, noNaN: true }),
    noise: fc.double({ min: 0, max: 1e-7, noNaN: true }),
    flicker: fc.double({ min: 0, max: 1e5, noNaN: true }),
    gain: fc.double({ min: 1, max: 1000, noNaN: true }),
    withGain: fc.boolean(),
    withHighPass: fc.boolean(),
    highPassOrder: fc.integer({ min: 1, max: 4 }),
    highPassCorner: fc.double({ min: 1, max: 1e5, noNaN: true }),
    response: fc.constantFrom('butterworth', 'bessel', 'critical'),
    lowPassOrder: fc.integer({ min: 1, max: 4 }),
    lowPassCorner: fc.double({ min: 1, max: 1e5, noNaN: true }),
    phase: fc.double({ min: -360, max: 360, noNaN: true }),
    withAdc: fc.boolean(),
    bits: fc.integer({ min: 4, max: 32 }),
    sampleRate: fc.double({ min: 10, max: 1e7, noNaN: true }),
    bandHigh: fc.option(fc.double({ min: 1, max: 1e6, noNaN: true })),
    temperature: fc.double({ min: 1, max: 500, noNaN: true }),
  })
  .map((r) => {
    const d = demoDocument(r.mode as 'pressure' | 'flow');
    d.sensor.cellA.coefficients = [r.c1, r.c2];
    d.sensor.cellB.coefficients = [r.c1 * (1 + r.mismatch)];
    d.excitation = { ...d.excitation, amplitude: r.amplitude, frequency: r.frequency, trim: r.trim, trimBits: r.trimBits };
    d.environment.temperature = r.temperature;
    const [ca, g1, hp, dm, lp, adc] = d.chain;
    Object.assign(ca, { feedbackCapacitance: r.cf, feedbackResistance: r.rf, gainBandwidth: r.gbw, voltageNoise: r.noise, flickerCorner: r.flicker });
    Object.assign(g1, { gain: r.gain, gainBandwidth: r.gbw });
    Object.assign(hp, { order: r.highPassOrder, corner: r.highPassCorner, response: r.response });
    Object.assign(dm, { phase: r.phase });
    Object.assign(lp, { order: r.lowPassOrder, corner: r.lowPassCorner, response: r.response });
    Object.assign(adc, { bits: r.bits, sampleRate: r.sampleRate });
    d.chain = [ca, ...(r.withGain ? [g1] : []), ...(r.withHighPass ? [hp] : []), dm, lp, ...(r.withAdc ? [adc] : [])];
    d.analysis.bandHigh = r.bandHigh !== null && r.bandHigh > d.analysis.bandLow ? r.bandHigh : null;
    return d;
  });

function nonFiniteNumbers(value: unknown, path: string, out: string[]): string[] {
  if (typeof value === 'number' && !Number.isFinite(value)) out.push(path);
  else if (Array.isArray(value)) value.forEach((v, i) => nonFiniteNumbers(v, `${path}[${i}]`, out));
  else if (typeof value === 'object' && value !== null) for (const [k, v] of Object.entries(value)) nonFiniteNumbers(v, `${path}.${k}`, out);
  return out;
}

describe('budget properties over random valid designs (fast-check)', () => {
  it('never puts NaN or Infinity in any figure, and the shares sum to 100 %', () => {
    fc.assert(
      fc.property(designArbitrary, (document) => {
        const validation = validateDesign(document);
        if (!validation.ok) throw new Error(JSON.stringify(validation.errors));
        const budget = evaluateBudget(validation.design);
        expect(nonFiniteNumbers(budget, 'budget', [])).toEqual([]);
        const shares = budget.noise.contributions.reduce((sum, c) => sum + c.share, 0);
        expect(shares).toBeCloseTo(1, 9);
        for (const c of budget.noise.contributions) expect(c.share).toBeGreaterThanOrEqual(0);
      }),
      { numRuns: 200, seed: 20261201 },
    );
  });
});
