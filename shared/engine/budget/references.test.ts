import { describe, expect, it } from 'vitest';
import { BOLTZMANN } from '../constants';
import { chargeAmplifierModule } from '../stages/charge-amplifier';
import type { PreparedStage, StageContext } from '../stages/stage';
import { integrateSegment, logFrequencyGrid } from './frequency-grid';
import { evaluateBudget } from './evaluate';
import { carrierHarmonics } from './carrier-harmonics';
import { integrateNoise } from './noise-integration';
import { referToInput } from './input-referred';
import { stepResponseMetrics } from './step-response';
import { lowPassPrototypePoles } from '../filters/prototype';
import { demoDesign, wideBandDesign } from '../../../test/fixtures/engine/designs';

const context: StageContext = {
  index: 0,
  path: 'chain[0]',
  domain: 'carrier',
  carrierFrequency: 5e4,
  excitationAmplitude: 2,
  supply: 5,
  temperature: 300,
  inputCapacitanceA: 0,
  inputCapacitanceB: 0,
};

/** A pre-demodulator stage passing |H| = 1 below `edge` and nothing above, with white noise S0 at its output. */
function brickWall(edge: number, density: number): PreparedStage {
  return {
    id: 'wall',
    kind: 'test',
    path: 'chain[0]',
    domain: 'carrier',
    flatGain: 1,
    multiplyResponse: (f, value) => {
      if (f > edge) {
        value.re = 0;
        value.im = 0;
      }
    },
    responsePower: (f) => (f > edge ? 0 : 1),
    poles: [],
    noiseSources: [{ source: 'white', density: () => density }],
    swing: null,
    levelKind: 'differential',
    demodulatorPhase: 0,
    converter: null,
    findings: () => [],
  };
}

describe('physical constants', () => {
  it('uses the exact Boltzmann constant (BIPM, SI Brochure, 9th ed., 2019)', () => {
    expect(BOLTZMANN).toBe(1.380649e-23);
  });

  it('gives the Johnson-Nyquist density sqrt(4kTR) = 4.070 nV/rtHz for 1 kohm at 300 K (Nyquist, Phys. Rev. 32, 110, 1928)', () => {
    const stage = chargeAmplifierModule.prepare({ ...chargeAmplifierModule.defaults('ca'), feedbackResistance: 1e3, feedbackCapacitance: 1e-15, gainBandwidth: 1e15 }, context);
    const thermal = stage.noiseSources.find((s) => s.source === 'feedback resistor thermal noise');
    // Far below the Rf Cf corner |Zf| = Rf, so the output density of one side is 4kT Rf; both sides add in power.
    const perSide = Math.sqrt((thermal?.density?.(1) ?? 0) / 2);
    expect(perSide).toBeCloseTo(4.07e-9, 11);
  });

  it('integrates the feedback network noise to kT/C: 64.36 uV rms for 1 pF at 300 K (Nyquist 1928; any analog design text)', () => {
    const stage = chargeAmplifierModule.prepare({ ...chargeAmplifierModule.defaults('ca'), feedbackCapacitance: 1e-12, feedbackResistance: 1e9, gainBandwidth: 1e15 }, context);
    const thermal = stage.noiseSources.find((s) => s.source === 'feedback resistor thermal noise');
    const grid = logFrequencyGrid(1e-4, 1e9, null);
    let power = 0;
    const g = grid.frequency.map((f) => (thermal?.density?.(f) ?? 0) * f);
    for (const segment of grid.segments) power += integrateSegment(segment, g, 1, 0);
    expect(Math.sqrt(power / 2)).toBeCloseTo(64.36e-6, 8);
  });
});

describe('noise integration against Butterworth ENBW (A. B. Williams, Electronic Filter Design Handbook)', () => {
  const table = [
    [1, 1.5708],
    [2, 1.1107],
    [3, 1.0472],
    [4, 1.0262],
  ] as const;
  it.each(table)('order %i: ENBW / f(-3 dB) = %f to 0.1 %% through the budget', (order, ratio) => {
    const corner = 500;
    const design = demoDesign('pressure', (d) => {
      d.chain[4].order = order;
      d.chain[4].corner = corner;
      d.analysis.bandLow = 1e-3;
    });
    const budget = evaluateBudget(design);
    const lowPassWhite = budget.noise.contributions.find((c) => c.stage === 'lp' && c.source === 'voltage noise');
    // The filter's white noise is input-referred, one filter per side: power 2 e_n^2 ENBW.
    const enbw = (lowPassWhite?.outputRms ?? 0) ** 2 / (2 * 8e-9 * 8e-9);
    expect(Math.abs(enbw / (ratio * corner) - 1)).toBeLessThan(1e-3);
    expect(Math.abs(budget.noise.basebandEnbw / (ratio * corner) - 1)).toBeLessThan(1e-3);
    // Closed form (pi / 2n) / sin(pi / 2n) of the same table.
    expect(ratio).toBeCloseTo(Math.PI / (2 * order) / Math.sin(Math.PI / (2 * order)), 4);
  });

  it('critically damped 2nd order: ENBW = 1.2203 f(-3 dB) (filter handbook tables)', () => {
    const design = demoDesign('pressure', (d) => {
      d.chain[4].response = 'critical';
      d.analysis.bandLow = 1e-3;
    });
    expect(evaluateBudget(design).noise.basebandEnbw / 500).toBeCloseTo(1.2203, 3);
  });
});

describe('square-wave demodulation (any signals text; Enz and Temes, Proc. IEEE 84(11), 1996)', () => {
  it('sums 1/k^2 over odd k to pi^2/8', () => {
    let sum = 0;
    for (let k = 1; k < 2e6; k += 2) sum += 1 / (k * k);
    expect(sum).toBeCloseTo((Math.PI * Math.PI) / 8, 6);
  });

  it('gives D = 1 for an ideal wide-band chain (square times square)', () => {
    const harmonics = carrierHarmonics([brickWall(1e30, 0)], 5e4, 0);
    // The series stops once its tail is below 1e-4 of the sum.
    expect(harmonics.demodulatorGain).toBeCloseTo(1, 3);
  });

  it('gives 2/pi per unit of a sinusoidal carrier (mean of a full-wave rectified sine)', () => {
    // A chain passing only the fundamental: the carrier reaching the demodulator is a sine of amplitude 4/pi.
    const harmonics = carrierHarmonics([brickWall(1.5 * 5e4, 0)], 5e4, 0);
    expect(harmonics.demodulatorGain / (4 / Math.PI)).toBeCloseTo(2 / Math.PI, 12);
    expect(harmonics.demodulatorGain).toBeCloseTo(8 / (Math.PI * Math.PI), 12);
  });

  it('folds white pre-demodulator noise with shares 81.1 %, 9.0 %, 3.2 %, 1.7 % for k = 1, 3, 5, 7', () => {
    const carrier = 5e4;
    const folded = (edgeHarmonic: number) => {
      const result = integrateNoise([brickWall(1e30, 1), brickWall((edgeHarmonic + 1) * carrier, 0)], [], [{ stage: 'wall', source: { source: 'white', density: () => 1 }, domain: 'carrier', stageIndex: 0 }], carrier, 1, 11, null);
      return result.power[0] / 10;
    };
    const levels = [0, ...[1, 3, 5, 7].map(folded)];
    const shares = [1, 2, 3, 4].map((i) => levels[i] - levels[i - 1]);
    expect(shares.map((s) => Number((s * 100).toFixed(1)))).toEqual([81.1, 9.0, 3.2, 1.7]);
  });

  it('keeps the density of white noise through a wide chain (reference squared is 1)', () => {
    const result = integrateNoise([brickWall(1e30, 1)], [], [{ stage: 'wall', source: { source: 'white', density: () => 1 }, domain: 'carrier', stageIndex: 0 }], 5e4, 1, 11, null);
    expect(result.power[0] / 10).toBeGreaterThan(0.999);
    expect(result.power[0] / 10).toBeLessThanOrEqual(1 + 1e-12);
    expect(result.harmonicsSummed).toBe(400);
  });
});

describe('scaling laws of the budget (common practice)', () => {
  it('doubles the sensitivity with twice the excitation amplitude', () => {
    const base = evaluateBudget(demoDesign('pressure', (d) => (d.excitation.amplitude = 1)));
    const doubled = evaluateBudget(demoDesign('pressure', (d) => (d.excitation.amplitude = 2)));
    expect(doubled.sensitivity.voltsPerFarad / base.sensitivity.voltsPerFarad).toBeCloseTo(2, 12);
  });

  it('gives near-zero sensitivity at 90 degrees for an ideal chain, and flips the sign at 180 degrees', () => {
    const at = (phase: number) => evaluateBudget(wideBandDesign((d) => (d.chain[3].phase = phase))).sensitivity.voltsPerFarad;
    const zero = at(0);
    expect(Math.abs(at(90) / zero)).toBeLessThan(1e-3);
    expect(at(180) / zero).toBeCloseTo(-1, 12);
    const demo = (phase: number) => evaluateBudget(demoDesign('pressure', (d) => (d.chain[3].phase = phase))).sensitivity.voltsPerFarad;
    expect(demo(180) / demo(0)).toBeCloseTo(-1, 12);
  });

  it('derives S_C = (Vm / Cf) G_pre D', () => {
    const budget = evaluateBudget(demoDesign());
    expect(budget.sensitivity.voltsPerFarad).toBeCloseTo((2 / 1e-12) * 20 * budget.demodulatorGain, -3);
  });
});

describe('quantization (Bennett, Bell Syst. Tech. J. 27, 1948; Widrow and Kollar 2008)', () => {
  it('adds q / sqrt(12) spread over [0, fs/2], counting the share in the band', () => {
    const q = 5 / 2 ** 16;
    const whole = evaluateBudget(demoDesign('pressure', (d) => (d.analysis.bandLow = 1e-6)));
    const adc = whole.noise.contributions.find((c) => c.source === 'quantization noise');
    expect(adc?.outputRms).toBeCloseTo(q / Math.sqrt(12), 12);
    const half = evaluateBudget(demoDesign('pressure', (d) => {
      d.analysis.bandLow = 1e-6;
      d.analysis.bandHigh = 1000;
    }));
    const inBand = half.noise.contributions.find((c) => c.source === 'quantization noise');
    expect(inBand?.outputRms).toBeCloseTo(q / Math.sqrt(24), 12);
  });

  it('reads ideal SNR = 6.02 N + 1.76 dB as an ENOB of N for a full-span sine', () => {
    const bits = 12;
    const q = 1 / 2 ** bits;
    const snr = 20 * Math.log10((2 ** bits * q) / (2 * Math.SQRT2) / (q / Math.sqrt(12)));
    expect(snr).toBeCloseTo(6.02 * bits + 1.76, 1);
  });
});

describe('trade facts for the input-referred figures (common practice)', () => {
  it('320 uV rms at 8 mV/fF is 40 aF, and 40 aF at 0.2 aF/Pa is 200 Pa', () => {
    const referred = referToInput(320e-6, 8e-3 / 1e-15, 0.2e-18, null);
    expect(referred.farad).toBeCloseTo(40e-18, 24);
    expect(referred.pascal).toBeCloseTo(200, 9);
    expect(referred.cubicMetrePerSecond).toBeNull();
  });

  it('chopping at 50 kHz above a 2 kHz flicker corner leaves the charge amplifier 1/f a small share', () => {
    const budget = evaluateBudget(demoDesign());
    const flicker = budget.noise.contributions.find((c) => c.stage === 'ca' && c.source.includes('1/f'));
    expect(flicker?.share).toBeLessThan(0.05);
    // The same amplifier without chopping: its 1/f at baseband would dominate.
    const unchopped = Math.log(budget.noise.bandHigh / budget.noise.bandLow) * 2000;
    expect(unchopped / budget.noise.basebandEnbw).toBeGreaterThan(10);
  });

  it('fits a +/-2 V square wave in a 5 V supply with headroom', () => {
    const budget = evaluateBudget(demoDesign());
    expect(budget.findings.filter((f) => f.stage === 'excitation' && f.field === 'amplitude')).toEqual([]);
    const tooLarge = evaluateBudget(demoDesign('pressure', (d) => (d.excitation.amplitude = 2.6)));
    expect(tooLarge.findings.find((f) => f.code === 'excitation-exceeds-supply')?.path).toBe('excitation.amplitude');
  });
});

describe('baseband step response (filter handbook tables; first order from its exponential)', () => {
  it('first order: 10-90 % rise ln(9) / (2 pi fc), no overshoot', () => {
    const fc = 100;
    const metrics = stepResponseMetrics([{ re: -2 * Math.PI * fc, im: 0 }]);
    expect(metrics?.riseTime).toBeCloseTo(Math.log(9) / (2 * Math.PI * fc), 5);
    expect(metrics?.overshoot).toBe(0);
    expect(metrics?.settlingTime1Percent).toBeCloseTo(Math.log(100) / (2 * Math.PI * fc), 4);
  });

  it('2nd-order Butterworth overshoots 4.3 %', () => {
    const poles = lowPassPrototypePoles('butterworth', 2).map((p) => ({ re: p.re * 1000, im: p.im * 1000 }));
    expect(stepResponseMetrics(poles)?.overshoot).toBeCloseTo(0.0432, 3);
  });
});
