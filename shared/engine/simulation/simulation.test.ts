import { describe, expect, it } from 'vitest';
import { validateDesign, type Design } from '../../contracts/design';
import demoFlow from '../../examples/demo-flow.json';
import demoPressure from '../../examples/demo-pressure.json';
import { evaluateBudget } from '../budget/evaluate';
import { simulate } from './simulator';

function design(document: unknown): Design {
  const validation = validateDesign(document);
  if (!validation.ok) throw new Error(JSON.stringify(validation.errors));
  return validation.design;
}

function edited(document: object, edit: (d: typeof demoPressure) => void): Design {
  const copy = structuredClone(document) as typeof demoPressure;
  edit(copy);
  return design(copy);
}

describe('simulation against the analytic budget', () => {
  // reference: ENGINE.md section 5, "Agreement": a noise-only run (1 s, N = 64) reproduces the
  // analytic total output noise within 10 % and the DC sensitivity within 1 %.
  for (const [name, document] of [
    ['demo-pressure', demoPressure],
    ['demo-flow', demoFlow],
  ] as const) {
    it(`reproduces the budget's output noise and sensitivity for ${name}`, () => {
      const d = design(document);
      const budget = evaluateBudget(d);
      const result = simulate(d, { duration: 1, samplesPerPeriod: 64, seed: 7 });
      expect(result.samples).toBe(3_200_000);
      expect(Math.abs(result.figures.outputRms / budget.noise.outputRms - 1)).toBeLessThan(0.1);
      expect(Math.abs((result.figures.sensitivityVoltsPerFarad as number) / (budget.sensitivity.voltsPerFarad as number) - 1)).toBeLessThan(0.01);
      expect(result.findings).toEqual([]);
    });
  }

  it('shows the analytic carrier ripple of a first-order low-pass within 10 %', () => {
    // reference: ENGINE.md section 5 (a design with a deliberately low low-pass order); the budget
    // takes the ripple at full scale, so the input sits there.
    const d = edited(demoPressure, (c) => {
      c.chain[4].order = 1;
    });
    const budget = evaluateBudget(d);
    const result = simulate(d, { duration: 0.05, noise: false, sensitivity: false, input: { kind: 'constant', value: d.sensor.fullScale } });
    expect(budget.ripple.outputPeak).toBeGreaterThan(1e-4);
    expect(Math.abs(result.figures.ripplePeak / budget.ripple.outputPeak - 1)).toBeLessThan(0.1);
  });

  it('matches the analytic ripple peak of the second-order demo low-pass, where the components are out of phase', () => {
    // The budget sums the 2 f0 ... 16 f0 components as complex phasors and takes the peak of the
    // waveform; adding their amplitudes instead overstates this case by about a fifth.
    const d = edited(demoPressure, () => undefined);
    const budget = evaluateBudget(d);
    const result = simulate(d, { duration: 0.05, noise: false, sensitivity: false, input: { kind: 'constant', value: d.sensor.fullScale } });
    expect(Math.abs(result.figures.ripplePeak / budget.ripple.outputPeak - 1)).toBeLessThan(0.03);
  });

  it('follows the budget step response (rise, overshoot, settling) through the whole chain', () => {
    // reference: the budget's step metrics of the baseband poles (ENGINE.md section 3, low-pass);
    // the carrier-side stages add only microseconds of delay. Tolerance 2 %.
    const d = design(demoPressure);
    const budget = evaluateBudget(d);
    const result = simulate(d, { duration: 0.03, noise: false, sensitivity: false, input: { kind: 'step', time: 0.01, height: 3e4 } });
    const step = result.figures.step;
    expect(step).not.toBeNull();
    const close = (simulated: number | null, analytic: number | null) => expect(Math.abs((simulated as number) / (analytic as number) - 1)).toBeLessThan(0.02);
    close(step?.rise ?? null, budget.stepResponse.riseTime);
    close(step?.overshoot ?? null, budget.stepResponse.overshoot);
    close(step?.settle1 ?? null, budget.stepResponse.settlingTime1Percent);
    close(step?.settle01 ?? null, budget.stepResponse.settlingTime01Percent);
  });
});

describe('clipping', () => {
  // reference: ENGINE.md section 3, charge amplifier level: per-side swing = common-mode plus
  // differential charge over Cf around mid-supply. Small counter-pulse capacitors leave 1.1 pF of
  // common-mode capacitance per side, so 2.45 V of excitation needs 2.7 V of a 2.4 V room.
  const overdriven = (amplitude: number) =>
    edited(demoPressure, (c) => {
      c.excitation.amplitude = amplitude;
      c.excitation.referenceCapacitanceA = 2.2e-12;
      c.excitation.referenceCapacitanceB = 2.2e-12;
      c.excitation.trim = 1.036;
    });

  it('clips the charge amplifier where the level check says it does, and not below', () => {
    for (const amplitude of [1, 2.45]) {
      const d = overdriven(amplitude);
      const analytic = evaluateBudget(d).findings.filter((f) => f.code === 'clipping').map((f) => f.stage);
      const result = simulate(d, { duration: 0.005, noise: false, sensitivity: false });
      const simulated = result.findings.filter((f) => f.code === 'clipping').map((f) => f.stage);
      expect(simulated).toEqual(analytic);
      if (amplitude === 1) expect(analytic).toEqual([]);
      else expect(analytic).toEqual(['ca']);
    }
  });

  it('flattens the overdriven side at the swing limit', () => {
    const result = simulate(overdriven(2.45), { duration: 0.002, noise: false, sensitivity: false, record: ['ca.A'] });
    const side = result.nodes.find((n) => n.id === 'ca.A');
    const waveform = side?.waveform as Float64Array;
    const atLimit = waveform.filter((v) => v === 0.1 || v === 4.9).length;
    expect(side?.clippedSamples).toBeGreaterThan(0);
    expect(atLimit).toBeGreaterThan(waveform.length / 4);
    expect(Math.min(...waveform)).toBeGreaterThanOrEqual(0.1);
    expect(Math.max(...waveform)).toBeLessThanOrEqual(4.9);
  });
});

describe('determinism', () => {
  // reference: ENGINE.md section 5, "same seed, same output, bit for bit".
  const d = design(demoPressure);
  const run = (seed: number, slice: number) => simulate(d, { duration: 0.01, seed, sensitivity: false, record: ['ca.A', 'lp'] }, undefined, slice);

  it('gives the same waveforms for the same seed, whatever the slices, and others for another seed', () => {
    const a = run(3, 1 << 18);
    const b = run(3, 5000);
    const c = run(4, 1 << 18);
    for (const id of ['ca.A', 'lp', 'adc']) {
      const wave = (r: typeof a) => r.nodes.find((n) => n.id === id)?.waveform as Float64Array;
      expect(wave(b)).toEqual(wave(a));
      expect(wave(c)).not.toEqual(wave(a));
    }
  });

  it('is noise-free with the noise switched off: the settled output does not move', () => {
    const result = simulate(d, { duration: 0.05, noise: false, sensitivity: false });
    expect(result.figures.outputRms).toBe(0);
  });
});

describe('output in the measurand unit', () => {
  it('reads a constant input back through the transfer curve', () => {
    // reference: the budget's transfer curve V = S_C (C_A - C_B - (Cr_A - trim Cr_B)); the ADC's
    // LSB (76 uV) over the slope (1.1e-5 V/Pa near 30 kPa) bounds the read-back error to a few Pa.
    const d = design(demoPressure);
    const result = simulate(d, { duration: 0.03, noise: false, sensitivity: false, input: { kind: 'constant', value: 3e4 } });
    const measurand = result.output.measurand as Float64Array;
    expect(result.output.unit).toBe('Pa');
    expect(Math.abs(measurand[measurand.length - 1] - 3e4)).toBeLessThan(20);
  });
});
