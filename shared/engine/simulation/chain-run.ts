/**
 * One pass of the whole chain over a run of samples, block by block: input profile, front end
 * (charges), the charge amplifier pair, then every later stage's processor, each node's envelope
 * and (where asked) its full waveform recorded as the blocks go by.
 */
import type { Design } from '../../contracts/design';
import type { InputProfile } from '../../contracts/simulation';
import { Xoshiro128StarStar } from '../noise/xoshiro128';
import { prepareSensor } from '../stages/sensor';
import type { StageContext } from '../stages/stage';
import { EnvelopeRecorder } from './envelope';
import { FrontEnd } from './front-end';
import { createProfileSampler, profileValue, type ProfileSampler } from './profile';
import { createStageProcessor, isChargeAmplifier, isConverter, type AdcProcessor, type ChargeAmplifierProcessor, type NodeProcessor, type ProcessorNoise } from './processors';

/** Samples per block: small enough that a block of every node stays in cache. */
export const BLOCK = 4096;

/** Noise streams: seed * 4096 + unit * 64 + source, unit 0 the excitation and stage i at i + 1. */
const UNITS = 64;
const SOURCES = 64;

/** A node of the chain as the run sees it. */
export interface RunNode {
  id: string;
  kind: string;
  domain: 'input' | 'carrier' | 'baseband';
  unit: 'V' | 'Pa' | 'm^3/s';
  sampleRate: number;
  /** Index into the design's chain (the charge amplifier's for its sides), or -1 for the input. */
  stageIndex: number;
  /** Input side 0 (A) or 1 (B) of a charge amplifier output; null for every other node. */
  side: 0 | 1 | null;
  envelope: EnvelopeRecorder | null;
  waveform: Float64Array | null;
  /** Samples written so far (the converter's node runs at its own rate). */
  written: number;
}

export interface ChainRunOptions {
  sampleRate: number;
  samplesPerPeriod: number;
  samples: number;
  input: InputProfile;
  /** Seed of the noise generators; null runs without noise. */
  seed: number | null;
  /** Lowest frequency the 1/f sources follow after the demodulator [Hz] (before it: f0 / 1000). */
  basebandLowestFrequency: number;
  /** Ids of the nodes whose full waveform is kept. */
  record: ReadonlySet<string>;
  /** Envelope columns per node; 0 keeps none. */
  envelopeColumns: number;
}

/** The stage context the analytic budget prepares each stage with, rebuilt for the processors. */
export function stageContexts(design: Design): StageContext[] {
  const sensor = prepareSensor(design.sensor);
  const operatingPoint = design.analysis.operatingPoint;
  const parasitic = design.sensor.parasiticCapacitance;
  const demodulatorIndex = design.chain.findIndex((s) => s.kind === 'demodulator');
  return design.chain.map((_, index) => ({
    index,
    path: `chain[${index}]`,
    domain: index < demodulatorIndex ? 'carrier' : 'baseband',
    carrierFrequency: design.excitation.frequency,
    excitationAmplitude: design.excitation.amplitude,
    supply: design.excitation.supply,
    temperature: design.environment.temperature,
    inputCapacitanceA: sensor.capacitanceA(operatingPoint) + design.excitation.referenceCapacitanceA + parasitic,
    inputCapacitanceB: sensor.capacitanceB(operatingPoint) + design.excitation.referenceCapacitanceB + parasitic,
  }));
}

export class ChainRun {
  readonly nodes: RunNode[];
  readonly processors: NodeProcessor[];
  readonly frontEnd: FrontEnd;
  readonly samples: number;
  readonly chargeAmplifier: ChargeAmplifierProcessor;
  private readonly profile: ProfileSampler;
  private position = 0;
  private readonly measurand = new Float64Array(BLOCK);
  private readonly chargeA = new Float64Array(BLOCK);
  private readonly chargeB = new Float64Array(BLOCK);
  private readonly sideA = new Float64Array(BLOCK);
  private readonly sideB = new Float64Array(BLOCK);
  private readonly ping = new Float64Array(BLOCK);
  private readonly pong = new Float64Array(BLOCK);
  private readonly conversions: Float64Array;

  constructor(design: Design, options: ChainRunOptions) {
    const { sampleRate, samples, seed } = options;
    const carrier = design.excitation.frequency;
    const streams = (unit: number): ProcessorNoise | null =>
      seed === null
        ? null
        : {
            random: (source) => new Xoshiro128StarStar((seed * UNITS + unit) * SOURCES + source),
            lowestFrequency: carrier / 1000,
          };
    this.samples = samples;
    this.profile = createProfileSampler(options.input, sampleRate);
    this.frontEnd = new FrontEnd(design, options.samplesPerPeriod, sampleRate, streams(0)?.random(0) ?? null);
    const contexts = stageContexts(design);
    this.processors = design.chain.map((stage, index) => {
      const noise = streams(index + 1);
      if (noise !== null && contexts[index].domain === 'baseband') noise.lowestFrequency = Math.min(noise.lowestFrequency, options.basebandLowestFrequency);
      return createStageProcessor(stage, contexts[index], sampleRate, noise);
    });
    const first = this.processors[0];
    if (!isChargeAmplifier(first)) throw new Error('The chain must start with a charge amplifier');
    this.chargeAmplifier = first;
    const start = this.frontEnd.start(profileValue(options.input, 0));
    first.startOnPlateau(start.chargeA, start.chargeB);

    const unit = design.sensor.mode === 'flow' ? 'm^3/s' : 'Pa';
    const node = (id: string, kind: string, domain: RunNode['domain'], nodeUnit: RunNode['unit'], rate: number, total: number, stageIndex: number, side: 0 | 1 | null = null): RunNode => ({
      id,
      kind,
      domain,
      unit: nodeUnit,
      sampleRate: rate,
      stageIndex,
      side,
      envelope: options.envelopeColumns > 0 ? new EnvelopeRecorder(total, options.envelopeColumns) : null,
      waveform: options.record.has(id) ? new Float64Array(total) : null,
      written: 0,
    });
    const caId = design.chain[0].id;
    this.nodes = [
      node('input', 'input', 'input', unit, sampleRate, samples, -1),
      node(`${caId}.A`, 'chargeAmplifierSide', 'carrier', 'V', sampleRate, samples, 0, 0),
      node(`${caId}.B`, 'chargeAmplifierSide', 'carrier', 'V', sampleRate, samples, 0, 1),
    ];
    let conversionsPerBlock = 0;
    design.chain.forEach((stage, index) => {
      const processor = this.processors[index];
      if (isConverter(processor)) {
        conversionsPerBlock = processor.maximumConversions(BLOCK);
        const total = Math.floor((samples - 1) / processor.ratio + 1e-9) + 1;
        this.nodes.push(node(stage.id, stage.kind, contexts[index].domain, 'V', processor.sampleRate, total, index));
      } else {
        this.nodes.push(node(stage.id, stage.kind, contexts[index].domain, 'V', sampleRate, samples, index));
      }
    });
    this.conversions = new Float64Array(conversionsPerBlock);
  }

  get done(): boolean {
    return this.position >= this.samples;
  }

  get processed(): number {
    return this.position;
  }

  /**
   * Runs about `budget` more samples, rounded up to whole blocks of a fixed grid (only the run's
   * last block is shorter), so the noise generators always see the same blocks and a run is the
   * same bit for bit however it is sliced. Returns how many samples ran.
   */
  advance(budget: number): number {
    const stop = Math.min(this.samples, Math.ceil((this.position + Math.max(budget, 1)) / BLOCK) * BLOCK);
    const started = this.position;
    while (this.position < stop) {
      const length = Math.min(BLOCK, stop - this.position);
      this.block(length);
      this.position += length;
    }
    return this.position - started;
  }

  private block(length: number): void {
    const measurand = this.measurand.subarray(0, length);
    const chargeA = this.chargeA.subarray(0, length);
    const chargeB = this.chargeB.subarray(0, length);
    const sideA = this.sideA.subarray(0, length);
    const sideB = this.sideB.subarray(0, length);
    let current = this.ping.subarray(0, length);
    let spare = this.pong.subarray(0, length);
    this.profile.fill(this.position, measurand);
    this.record(0, measurand, length);
    this.frontEnd.process(measurand, chargeA, chargeB);
    this.chargeAmplifier.processSides(chargeA, chargeB, sideA, sideB, current);
    this.record(1, sideA, length);
    this.record(2, sideB, length);
    this.record(3, current, length);
    for (let i = 1; i < this.processors.length; i++) {
      const processor = this.processors[i];
      if (isConverter(processor)) {
        const count = (processor as AdcProcessor).convert(current, this.conversions);
        this.record(3 + i, this.conversions, count);
      } else {
        processor.process(current, spare);
        const previous = current;
        current = spare;
        spare = previous;
        this.record(3 + i, current, length);
      }
    }
  }

  private record(index: number, block: Float64Array, length: number): void {
    const node = this.nodes[index];
    node.envelope?.add(block, length);
    if (node.waveform !== null) {
      const room = node.waveform.length - node.written;
      node.waveform.set(length <= room ? block.subarray(0, length) : block.subarray(0, room), node.written);
    }
    node.written += length;
  }
}
