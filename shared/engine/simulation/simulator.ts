/**
 * The time-domain simulation of a design (ENGINE.md section 5): the main run with the requested
 * input, then two short noise-free runs at constant input levels for the DC sensitivity, all done
 * in slices so that a worker can report progress and be stopped between them.
 */
import type { Design } from '../../contracts/design';
import type { Finding } from '../../contracts/findings';
import { simulationOptionsSchema, type InputProfile, type SimulationOptions, type SimulationOptionsInput } from '../../contracts/simulation';
import { evaluateBudget } from '../budget/evaluate';
import { finding, number, digits } from '../findings';
import { ChainRun, type RunNode } from './chain-run';
import { bandRms, defaultSegmentLength, mean, ripplePeak, stepMetrics } from './measure';
import { samplesPerPeriod as wholeSamplesPerPeriod } from './processors/demodulator';
import type { SimulatedNode, SimulationResult } from './result';

/** The chain counts as settled after this many of its slowest time constants (e^-14 < 1e-6). */
const SETTLING_TIME_CONSTANTS = 14;
/** The sensitivity runs average over at least this many carrier periods and conversions. */
const AVERAGED_PERIODS = 16;
/** Calibration table points over [0, full scale] for the output in the measurand's unit. */
const CALIBRATION_POINTS = 1025;

export class Simulation {
  readonly options: SimulationOptions;
  readonly sampleRate: number;
  readonly samplesPerPeriod: number;
  readonly samples: number;
  /** Time after which the chain counts as settled and figures are measured [s]. */
  readonly settlingTime: number;
  private readonly design: Design;
  private readonly input: InputProfile;
  private readonly main: ChainRun;
  private readonly levels: { x: number; run: ChainRun }[] = [];
  private readonly outputId: string;
  private readonly lastAnalogId: string;
  private readonly totalWork: number;

  /** @param design a validated design; options as in simulationOptionsSchema (defaults filled in here). */
  constructor(design: Design, options: SimulationOptionsInput) {
    this.options = simulationOptionsSchema.parse(options);
    this.design = design;
    const carrier = design.excitation.frequency;
    this.samplesPerPeriod = this.options.samplesPerPeriod;
    this.sampleRate = this.samplesPerPeriod * carrier;
    wholeSamplesPerPeriod(this.sampleRate, carrier);
    this.samples = Math.max(1, Math.round(this.options.duration * this.sampleRate));
    this.input = this.options.input ?? { kind: 'constant', value: design.analysis.operatingPoint };
    const chain = design.chain;
    this.outputId = chain[chain.length - 1].id;
    const lastAnalog = chain[chain.length - 1].kind === 'adc' ? chain.length - 2 : chain.length - 1;
    this.lastAnalogId = chain[lastAnalog].id;
    const basebandLowestFrequency = Math.min(carrier / 1000, design.analysis.bandLow);
    this.main = new ChainRun(design, {
      sampleRate: this.sampleRate,
      samplesPerPeriod: this.samplesPerPeriod,
      samples: this.samples,
      input: this.input,
      seed: this.options.noise ? this.options.seed : null,
      basebandLowestFrequency,
      record: new Set([...this.options.record, this.outputId, this.lastAnalogId]),
      envelopeColumns: this.options.envelopeColumns,
    });
    const slowest = Math.max(...this.main.processors.map((p) => p.timeConstant));
    const period = 1 / carrier;
    this.settlingTime = SETTLING_TIME_CONSTANTS * slowest + 2 * period;

    if (this.options.sensitivity) {
      const converter = design.chain.find((s) => s.kind === 'adc');
      const window = AVERAGED_PERIODS * Math.max(period, converter?.kind === 'adc' ? 1 / converter.sampleRate : 0);
      const levelSamples = Math.round((this.settlingTime + window) * this.sampleRate);
      const fullScale = design.sensor.fullScale;
      const operatingPoint = design.analysis.operatingPoint;
      const second = operatingPoint + fullScale / 2 <= fullScale ? operatingPoint + fullScale / 2 : operatingPoint - fullScale / 2;
      for (const x of [operatingPoint, second]) {
        this.levels.push({
          x,
          run: new ChainRun(design, {
            sampleRate: this.sampleRate,
            samplesPerPeriod: this.samplesPerPeriod,
            samples: levelSamples,
            input: { kind: 'constant', value: x },
            seed: null,
            basebandLowestFrequency,
            record: new Set([this.outputId]),
            envelopeColumns: 0,
          }),
        });
      }
    }
    this.totalWork = this.samples + this.levels.reduce((sum, l) => sum + l.run.samples, 0);
  }

  get done(): boolean {
    return this.main.done && this.levels.every((l) => l.run.done);
  }

  /** Fraction of the work done [0, 1]. */
  get progress(): number {
    const processed = this.main.processed + this.levels.reduce((sum, l) => sum + l.run.processed, 0);
    return processed / this.totalWork;
  }

  /** Runs about `budget` more samples (main run first, then the sensitivity runs); returns the progress. */
  advance(budget: number): number {
    let left = budget;
    for (const run of [this.main, ...this.levels.map((l) => l.run)]) {
      if (left <= 0) break;
      if (!run.done) left -= run.advance(left);
    }
    return this.progress;
  }

  /** The waveforms and figures; runs whatever is left first. */
  result(): SimulationResult {
    while (!this.done) this.advance(this.totalWork);
    const design = this.design;
    const budget = evaluateBudget(design);
    const nodeById = (id: string) => this.main.nodes.find((n) => n.id === id) as RunNode;
    const output = nodeById(this.outputId);
    const lastAnalog = nodeById(this.lastAnalogId);
    const outputVolts = output.waveform as Float64Array;
    const analogWaveform = lastAnalog.waveform as Float64Array;

    // Noise over the budget's band, on the output after the chain has settled.
    const settleTime = Math.min(this.settlingTime, this.options.duration / 2);
    const settledOutput = outputVolts.subarray(Math.min(outputVolts.length - 1, Math.ceil(settleTime * output.sampleRate)));
    const bandHigh = Math.min(budget.noise.bandHigh, output.sampleRate / 2);
    const noise = bandRms(settledOutput, output.sampleRate, budget.noise.bandLow, bandHigh, this.options.segmentLength ?? defaultSegmentLength(settledOutput.length));

    const settledSample = Math.ceil(settleTime * this.sampleRate);
    const ripple = ripplePeak(analogWaveform, this.samplesPerPeriod, settledSample);

    let step: SimulationResult['figures']['step'] = null;
    if (this.input.kind === 'step') {
      const stepIndex = Math.ceil(this.input.time * this.sampleRate - 1e-9);
      const period = this.samplesPerPeriod;
      const initial = stepIndex >= period ? mean(analogWaveform, stepIndex - period, stepIndex) : analogWaveform[0];
      const final = mean(analogWaveform, Math.max(stepIndex, analogWaveform.length - period), analogWaveform.length);
      step = stepMetrics(analogWaveform, this.sampleRate, stepIndex, initial, final);
    }

    const sensitivity = this.measuredSensitivity();
    const findings = this.clippingFindings();
    const analyticSensitivity = budget.sensitivity.voltsPerFarad;
    const measurand = this.toMeasurand(outputVolts, analyticSensitivity);
    if (measurand === null) {
      findings.push(finding('note', 'calibration-not-monotonic', { stage: 'sensor', path: 'sensor' }, 'cellA.coefficients', 'The transfer curve is not monotonic over the full scale: the output cannot be read back in the measurand unit', [number('full scale', design.sensor.fullScale, budget.transfer.measurandUnit)]));
    }

    const nodes: SimulatedNode[] = this.main.nodes.map((n) => ({
      id: n.id,
      kind: n.kind,
      domain: n.domain,
      unit: n.unit,
      sampleRate: n.sampleRate,
      samples: n.written,
      envelope: n.envelope === null ? null : n.envelope.result(),
      waveform: n.waveform !== null && (this.options.record.includes(n.id) || n.id === this.outputId) ? n.waveform : null,
      clippedSamples: n.side !== null ? this.main.chargeAmplifier.clippedOnSide(n.side) : n.stageIndex >= 0 ? this.main.processors[n.stageIndex].clippedSamples : 0,
    }));

    return {
      sampleRate: this.sampleRate,
      samplesPerPeriod: this.samplesPerPeriod,
      samples: this.samples,
      duration: this.samples / this.sampleRate,
      seed: this.options.seed,
      noise: this.options.noise,
      input: this.input,
      trim: this.main.frontEnd.trim,
      nodes,
      output: { node: this.outputId, sampleRate: output.sampleRate, volts: outputVolts, measurand, unit: budget.transfer.measurandUnit },
      figures: {
        outputRms: noise.rms,
        bandLow: budget.noise.bandLow,
        bandHigh,
        segmentLength: noise.segmentLength,
        sensitivityVoltsPerFarad: sensitivity,
        ripplePeak: ripple,
        rippleNode: this.lastAnalogId,
        step,
        settlingTime: settleTime,
      },
      analytic: {
        outputRms: budget.noise.outputRms,
        sensitivityVoltsPerFarad: analyticSensitivity,
        ripplePeak: budget.ripple.outputPeak,
        step: {
          rise: budget.stepResponse.riseTime,
          overshoot: budget.stepResponse.overshoot,
          settle1: budget.stepResponse.settlingTime1Percent,
          settle01: budget.stepResponse.settlingTime01Percent,
        },
      },
      findings,
    };
  }

  /** Output change over the change of C_A - C_B between the two constant levels [V/F]. */
  private measuredSensitivity(): number | null {
    if (this.levels.length < 2) return null;
    const means = this.levels.map(({ run }) => {
      const node = run.nodes.find((n) => n.id === this.outputId) as RunNode;
      const waveform = node.waveform as Float64Array;
      const from = Math.min(waveform.length - 1, Math.ceil(this.settlingTime * node.sampleRate));
      return mean(waveform, from, waveform.length);
    });
    const front = this.main.frontEnd;
    const change = front.effectiveDifference(this.levels[1].x) - front.effectiveDifference(this.levels[0].x);
    return change === 0 ? null : (means[1] - means[0]) / change;
  }

  private clippingFindings(): Finding[] {
    const findings: Finding[] = [];
    this.design.chain.forEach((stage, index) => {
      const clipped = this.main.processors[index].clippedSamples;
      if (clipped === 0) return;
      const node = this.main.nodes.find((n) => n.stageIndex === index && n.side === null) as RunNode;
      const share = clipped / (stage.kind === 'chargeAmplifier' ? 2 * node.written : node.written);
      const field = stage.kind === 'adc' ? 'inputRange' : 'outputSwing';
      findings.push(
        finding('error', 'clipping', { stage: stage.id, path: `chain[${index}]` }, field, `The simulated ${stage.kind} output clipped on ${digits(share * 100)} % of its samples`, [number('clipped samples', clipped, ''), number('clipped share', share, '')]),
      );
    });
    return findings;
  }

  /**
   * The output read back in the measurand's unit through the design's transfer curve
   * V = S_C (C_A - C_B - (Cr_A - trim Cr_B)) (the budget's sensitivity, the simulated trim):
   * a table over [0, full scale], inverted by interpolation and extended by its end slopes.
   * Null when the curve is not monotonic.
   */
  private toMeasurand(volts: Float64Array, voltsPerFarad: number | null): Float64Array | null {
    if (voltsPerFarad === null || voltsPerFarad === 0) return null;
    const front = this.main.frontEnd;
    const fullScale = this.design.sensor.fullScale;
    const xs = Float64Array.from({ length: CALIBRATION_POINTS }, (_, i) => (fullScale * i) / (CALIBRATION_POINTS - 1));
    const vs = xs.map((x) => voltsPerFarad * front.effectiveDifference(x));
    const rising = vs[CALIBRATION_POINTS - 1] > vs[0];
    for (let i = 1; i < CALIBRATION_POINTS; i++) if (rising ? vs[i] <= vs[i - 1] : vs[i] >= vs[i - 1]) return null;
    const out = new Float64Array(volts.length);
    const last = CALIBRATION_POINTS - 1;
    for (let n = 0; n < volts.length; n++) {
      const v = volts[n];
      // Binary search for the segment holding v (in the curve's own direction).
      let low = 0;
      let high = last;
      if (rising ? v <= vs[0] : v >= vs[0]) high = 1;
      else if (rising ? v >= vs[last] : v <= vs[last]) low = last - 1;
      else {
        while (high - low > 1) {
          const middle = (low + high) >> 1;
          if (rising ? vs[middle] <= v : vs[middle] >= v) low = middle;
          else high = middle;
        }
      }
      out[n] = xs[low] + ((xs[high] - xs[low]) * (v - vs[low])) / (vs[high] - vs[low]);
    }
    return out;
  }
}

/**
 * Runs a whole simulation at once.
 * @param onProgress called after each slice with the fraction done.
 * @param slice samples per slice between progress calls.
 */
export function simulate(design: Design, options: SimulationOptionsInput, onProgress?: (fraction: number) => void, slice = 1 << 18): SimulationResult {
  const simulation = new Simulation(design, options);
  while (!simulation.done) {
    const fraction = simulation.advance(slice);
    onProgress?.(fraction);
  }
  return simulation.result();
}
