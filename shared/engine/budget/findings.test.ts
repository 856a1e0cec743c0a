import { describe, expect, it } from 'vitest';
import { evaluateBudget } from './evaluate';
import { demoDesign } from '../../../test/fixtures/engine/designs';

const codes = (budget: ReturnType<typeof evaluateBudget>) => budget.findings.map((f) => `${f.severity} ${f.code} ${f.path}`);

describe('findings name the stage, the field and a change', () => {
  it('reports clipping at the node that clips, with the numbers behind it', () => {
    const budget = evaluateBudget(demoDesign('pressure', (d) => (d.chain[1].gain = 400)));
    const clipping = budget.findings.find((f) => f.code === 'clipping' && f.stage === 'g1');
    expect(clipping?.path).toBe('chain[1].outputSwing');
    expect(clipping?.numbers.find((n) => n.name === 'used fraction')?.value).toBeGreaterThan(1);
    expect(clipping?.suggestion).toMatch(/lower the gain/);
    expect(budget.closestToClipping).not.toBeNull();
  });

  it('reports carrier ripple above the noise with a corner that clears it', () => {
    const budget = evaluateBudget(demoDesign('pressure', (d) => (d.chain[4].corner = 20000)));
    const ripple = budget.findings.find((f) => f.code === 'carrier-ripple');
    expect(ripple?.path).toBe('chain[4].corner');
    expect(ripple?.suggestion).toMatch(/raise the order to 3 or lower the corner below/);
    expect(budget.ripple.outputPeak).toBeGreaterThan(budget.noise.outputRms);
    expect(codes(budget)).toContain('warning ripple-aliases chain[5].sampleRate');
  });

  it('reports a high-pass corner that eats the carrier', () => {
    const budget = evaluateBudget(demoDesign('pressure', (d) => (d.chain[2].corner = 30000)));
    expect(codes(budget)).toContain('warning high-pass-attenuates-carrier chain[2].corner');
  });

  it('reports a carrier too close to the Rf Cf corner', () => {
    const budget = evaluateBudget(demoDesign('pressure', (d) => (d.chain[0].feedbackResistance = 1e7)));
    expect(codes(budget)).toContain('warning charge-amplifier-corner chain[0].feedbackResistance');
  });

  it('reports slow settling against the resolution', () => {
    const budget = evaluateBudget(demoDesign('pressure', (d) => (d.chain[0].gainBandwidth = 1e6)));
    expect(codes(budget)).toContain('warning charge-amplifier-settling chain[0].gainBandwidth');
  });

  it('reports a trim outside the DAC range with a counter-pulse capacitor that brings it back', () => {
    const budget = evaluateBudget(demoDesign('pressure', (d) => (d.excitation.referenceCapacitanceB = 1e-12)));
    const trim = budget.findings.find((f) => f.code === 'trim-out-of-range');
    expect(trim?.path).toBe('excitation.referenceCapacitanceB');
    expect(trim?.suggestion).toBe('set Cr_B near 3.38 pF so that the ideal trim is close to 1');
  });

  it('reports turbulent flow above Re = 2000 (laminar limit, any fluid mechanics text)', () => {
    const budget = evaluateBudget(demoDesign('flow', (d) => (d.sensor.fullScale = 4e-6)));
    expect(codes(budget)).toContain('warning turbulent-flow sensor.capillary');
  });

  it('reports a reference phase that loses the signal', () => {
    const budget = evaluateBudget(demoDesign('pressure', (d) => (d.chain[3].phase = 90 + evaluateBudget(demoDesign()).bestDemodulatorPhase)));
    expect(budget.findings[0].severity).toBe('error');
    expect(codes(budget)).toContain('error demodulator-no-gain chain[3].phase');
  });

  it('leaves the resolution in Pa null with a finding when cell A has no slope', () => {
    const budget = evaluateBudget(demoDesign('pressure', (d) => (d.sensor.cellA.coefficients = [0, 1e-25])));
    expect(budget.resolution.pascal).toBeNull();
    expect(budget.resolution.farad).not.toBeNull();
    expect(codes(budget)).toContain('error no-pressure-slope sensor.cellA.coefficients');
  });

  it('reports noise folding in from above half the sample rate', () => {
    const budget = evaluateBudget(demoDesign('pressure', (d) => (d.chain[5].sampleRate = 800)));
    expect(codes(budget)).toContain('warning noise-aliases chain[5].sampleRate');
  });

  it('suggests the DAC code when the trim is off its best code', () => {
    const budget = evaluateBudget(demoDesign('pressure', (d) => (d.excitation.trim = 1)));
    expect(budget.findings.find((f) => f.code === 'trim-not-at-best-code')?.suggestion).toBe('set the trim to 1.0244140625 (code 2098)');
    expect(Math.abs(budget.offset.settingVolts)).toBeGreaterThan(Math.abs(budget.offset.trimmedVolts ?? 0));
  });
});
