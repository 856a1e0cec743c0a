import type { Design } from '../../contracts/design';
import type { Budget, NodeLevel } from '../../contracts/figures';
import type { Finding } from '../../contracts/findings';
import { formatQuantity } from '../../units/format';
import { finding, number } from '../findings';
import { prepareExcitation } from '../stages/excitation';
import { stageRegistry, type StageRegistry } from '../stages/registry';
import { prepareSensor } from '../stages/sensor';
import type { PreparedStage, StageCheckView, StageContext } from '../stages/stage';
import { carrierHarmonics, KEPT_HARMONICS, MAX_DEMODULATOR_HARMONICS } from './carrier-harmonics';
import { levelFindings, nodeLevel } from './levels';
import { referToInput } from './input-referred';
import { integrateNoise, MAX_FOLDED_HARMONICS, type PlacedSource } from './noise-integration';
import { rippleComponents, ripplePeak } from './ripple';
import { stepResponseMetrics } from './step-response';

export interface BudgetOptions {
  /** Stage kinds to evaluate the chain with; the built-in ones unless told. */
  registry?: StageRegistry;
}

/** Points of the transfer curve over [0, full scale]. */
const CURVE_POINTS = 21;
/** The default band ends where the baseband response has fallen by 60 dB (power 1e-6). */
const BAND_EDGE_POWER = 1e-6;

/**
 * The analytic budget of a validated design (ENGINE.md section 4): every figure in SI units and the
 * findings. Pure and allocation-light, meant to run on every keystroke.
 */
export function evaluateBudget(design: Design, options: BudgetOptions = {}): Budget {
  const registry = options.registry ?? stageRegistry;
  const sensor = prepareSensor(design.sensor);
  const excitation = prepareExcitation(design.excitation, sensor);
  const { frequency: carrier, amplitude: vm, trim } = design.excitation;
  const operatingPoint = design.analysis.operatingPoint;
  const fullScale = design.sensor.fullScale;
  const parasitic = design.sensor.parasiticCapacitance;

  const demodulatorIndex = design.chain.findIndex((s) => s.kind === 'demodulator');
  const stages: PreparedStage[] = design.chain.map((parameters, index) => {
    const stageModule = registry.get(parameters.kind);
    if (stageModule === undefined) throw new Error(`No stage module for kind "${parameters.kind}"`);
    const context: StageContext = {
      index,
      path: `chain[${index}]`,
      domain: index < demodulatorIndex ? 'carrier' : 'baseband',
      carrierFrequency: carrier,
      excitationAmplitude: vm,
      supply: design.excitation.supply,
      temperature: design.environment.temperature,
      inputCapacitanceA: sensor.capacitanceA(operatingPoint) + design.excitation.referenceCapacitanceA + parasitic,
      inputCapacitanceB: sensor.capacitanceB(operatingPoint) + design.excitation.referenceCapacitanceB + parasitic,
    };
    return stageModule.prepare(parameters, context);
  });
  const pre = stages.slice(0, demodulatorIndex);
  const demodulator = stages[demodulatorIndex];
  const post = stages.slice(demodulatorIndex + 1);
  const phase = demodulator.demodulatorPhase ?? 0;

  // Signal path.
  const harmonics = carrierHarmonics(pre, carrier, phase);
  const preGain = pre.reduce((g, s) => g * s.flatGain, 1);
  const postGainAt = (count: number, f: number) => {
    let g = 1;
    for (let j = 0; j < count; j++) g *= post[j].flatGain * Math.sqrt(post[j].responsePower(f));
    return g;
  };
  const postGain = postGainAt(post.length, 0);
  const D = harmonics.demodulatorGain;
  const voltsPerFarad = vm * preGain * D * postGain;
  const sensitive = Math.abs(D) > 1e-9 * Math.max(harmonics.bestGain, 1e-300);
  const pressureSlope = sensor.pressureSlope(operatingPoint);
  const measurandSlope = sensor.slope(operatingPoint);
  const flow = sensor.mode === 'flow';

  // Sensor span and curve.
  const curve = Array.from({ length: CURVE_POINTS }, (_, i) => {
    const x = (fullScale * i) / (CURVE_POINTS - 1);
    return { measurand: x, outputVolts: voltsPerFarad * excitation.effectiveDifference(x, trim) };
  });
  const capacitanceSpan = Math.abs(sensor.difference(fullScale) - sensor.difference(0));
  let largestDifference = 0;
  let largestSide = 0;
  for (let i = 0; i < CURVE_POINTS; i++) {
    const x = (fullScale * i) / (CURVE_POINTS - 1);
    largestDifference = Math.max(largestDifference, Math.abs(excitation.effectiveDifference(x, trim)));
    largestSide = Math.max(largestSide, excitation.residualA(x), excitation.residualB(x, trim));
  }

  // Noise band.
  const converter = post.find((s) => s.converter !== null)?.converter ?? null;
  const nyquist = converter === null ? null : converter.sampleRate / 2;
  const findings: Finding[] = [...sensor.findings(), ...excitation.findings()];
  const bandLow = design.analysis.bandLow;
  let bandHigh = design.analysis.bandHigh;
  const bandHighFromChain = bandHigh === null;
  if (bandHigh === null) {
    const edge = basebandEdge(post, bandLow);
    if (edge !== null) bandHigh = edge;
    else {
      bandHigh = Math.max(nyquist ?? carrier / 2, bandLow * 10);
      findings.push(finding('note', 'no-baseband-roll-off', { stage: 'analysis', path: 'analysis' }, 'bandHigh', `The baseband path does not roll off by 60 dB: the noise band is cut at ${formatQuantity(bandHigh, 'frequency')}`, [number('band high end', bandHigh, 'Hz')], 'add a low-pass after the demodulator or set the band high end'));
    }
  }

  // Noise sources, carried to the output.
  const placed: PlacedSource[] = [];
  pre.forEach((stage, j) => stage.noiseSources.forEach((source) => placed.push({ stage: stage.id, source, domain: 'carrier', stageIndex: j })));
  post.forEach((stage, j) => stage.noiseSources.forEach((source) => placed.push({ stage: stage.id, source, domain: 'baseband', stageIndex: j })));
  const amplitudeNoise = design.excitation.amplitudeNoise;
  if (amplitudeNoise > 0) {
    // Noise on Vm scales the charge the counter-pulses leave uncancelled; it arrives at baseband.
    const scale = amplitudeNoise * excitation.effectiveDifference(operatingPoint, trim) * preGain * D;
    const density = scale * scale;
    placed.push({ stage: 'excitation', source: { source: 'amplitude noise', density: () => density }, domain: 'baseband', stageIndex: -1 });
  }
  const noise = integrateNoise(pre, post, placed, carrier, bandLow, bandHigh, nyquist);
  let totalPower = 0;
  for (let s = 0; s < noise.power.length; s++) totalPower += noise.power[s];
  const outputRms = Math.sqrt(totalPower);

  const perUnit = (rms: number) => referToInput(rms, sensitive ? voltsPerFarad : 0, pressureSlope, flow ? measurandSlope : null);
  const contributions = placed.map((p, s) => ({
    stage: p.stage,
    source: p.source.source,
    outputRms: Math.sqrt(noise.power[s]),
    share: totalPower > 0 ? noise.power[s] / totalPower : 0,
    inputReferred: perUnit(Math.sqrt(noise.power[s])),
  }));
  const resolution = perUnit(outputRms);
  const relativeResolution = resolution.farad !== null && capacitanceSpan > 0 ? resolution.farad / capacitanceSpan : null;

  // Ripple: components at 2 f0, 4 f0, ... of the demodulator output, through the baseband stages.
  const last = (pre.length - 1) * KEPT_HARMONICS;
  const components = rippleComponents(harmonics.re.subarray(last, last + KEPT_HARMONICS), harmonics.im.subarray(last, last + KEPT_HARMONICS), phase);
  const carrierScale = vm * largestDifference * preGain;
  // Each component through the first `count` baseband stages (complex, so that phases add right).
  const filteredRe = new Float64Array(components.re.length);
  const filteredIm = new Float64Array(components.re.length);
  const value = { re: 0, im: 0 };
  const rippleAt = (count: number) => {
    for (let i = 0; i < components.re.length; i++) {
      value.re = components.re[i];
      value.im = components.im[i];
      const f = 2 * (i + 1) * carrier;
      let gain = 1;
      for (let j = 0; j < count; j++) {
        post[j].multiplyResponse(f, value);
        gain *= post[j].flatGain;
      }
      filteredRe[i] = value.re * gain;
      filteredIm[i] = value.im * gain;
    }
    return carrierScale * ripplePeak(filteredRe, filteredIm);
  };

  // Levels at every node.
  const levels: NodeLevel[] = [];
  let cumulative = 1;
  pre.forEach((stage, n) => {
    cumulative *= stage.flatGain;
    const differential = vm * largestDifference * cumulative * harmonics.peakFactor[n];
    const perSide = vm * largestSide * cumulative * harmonics.peakFactor[n];
    levels.push(nodeLevel(stage, differential, perSide));
  });
  const chopped = levels.length > 0 ? vm * largestDifference * preGain * harmonics.peakFactor[pre.length - 1] : 0;
  levels.push(nodeLevel(demodulator, chopped, chopped / 2));
  post.forEach((stage, j) => {
    const dc = Math.abs(vm * preGain * D * postGainAt(j + 1, 0)) * largestDifference;
    const peak = dc + rippleAt(j + 1);
    levels.push(nodeLevel(stage, peak, peak / 2));
  });
  const rippleOutputPeak = rippleAt(post.length);
  let maxUsed: number | null = null;
  let closest: string | null = null;
  for (const level of levels) {
    if (level.usedFraction !== null && (maxUsed === null || level.usedFraction > maxUsed)) {
      maxUsed = level.usedFraction;
      closest = level.node;
    }
  }

  // Figures of merit.
  const outputSpan = curve[CURVE_POINTS - 1].outputVolts - curve[0].outputVolts;
  const ratio = (numerator: number, denominator: number) => (numerator > 0 && denominator > 0 ? 20 * Math.log10(numerator / denominator) : null);
  const snr = ratio(Math.abs(outputSpan), outputRms);
  const dynamicRange = maxUsed !== null && maxUsed > 0 ? ratio(Math.abs(outputSpan) / maxUsed, outputRms) : null;
  const fullSpanSine = ratio(Math.abs(outputSpan) / (2 * Math.SQRT2), outputRms);
  const enob = fullSpanSine === null ? null : (fullSpanSine - 1.76) / 6.02;
  const step = stepResponseMetrics(post.flatMap((s) => s.poles));

  // Offset and trim.
  const untrimmedFarad = excitation.effectiveDifference(0, 1);
  const residualFarad = excitation.trimAtCode === null ? null : excitation.effectiveDifference(0, excitation.trimAtCode);

  // Fluidics.
  const resistance = sensor.hydraulicResistance;
  const c1A = design.sensor.cellA.coefficients[0];
  const mismatch = Math.abs(sensor.commonModeSlope);

  // Stage checks.
  const view = (index: number): StageCheckView => ({
    levelPeak: levels[index].peak,
    usedFraction: levels[index].usedFraction,
    outputNoiseRms: outputRms,
    voltsPerFarad,
    relativeResolution,
    rippleOutputPeak,
    demodulatorGain: D,
    bestDemodulatorGain: harmonics.bestGain,
    bestPhase: (harmonics.bestPhase * 180) / Math.PI,
    noiseAboveNyquist: noise.aboveSplit,
    noiseBelowNyquist: noise.belowSplit,
  });
  stages.forEach((stage, index) => {
    findings.push(...levelFindings(stage, levels[index]), ...stage.findings(view(index)));
  });
  if (pressureSlope === 0) {
    findings.push(finding('error', 'no-pressure-slope', { stage: 'sensor', path: 'sensor' }, 'cellA.coefficients', 'Cell A has no slope at the operating point: resolution in Pa is undefined', [number('operating point', operatingPoint, flow ? 'm^3/s' : 'Pa')], 'give cell A a non-zero linear coefficient c1'));
  }
  if (harmonics.demodulatorHarmonics >= MAX_DEMODULATOR_HARMONICS || noise.harmonicsSummed >= MAX_FOLDED_HARMONICS) {
    findings.push(finding('note', 'harmonics-capped', { stage: demodulator.id, path: demodulator.path }, 'phase', 'The carrier path is so wide that the harmonic sums stopped at their limit; D and the folded noise are slightly low', [number('harmonics for D', harmonics.demodulatorHarmonics, ''), number('harmonics for noise', noise.harmonicsSummed, '')], 'add a bandwidth limit before the demodulator'));
  }
  const order = { error: 0, warning: 1, note: 2 } as const;
  findings.sort((a, b) => order[a.severity] - order[b.severity]);

  return {
    mode: sensor.mode,
    sensitivity: {
      voltsPerFarad,
      voltsPerPascal: voltsPerFarad * pressureSlope,
      voltsPerCubicMetrePerSecond: flow ? voltsPerFarad * measurandSlope : null,
    },
    demodulatorGain: D,
    demodulatorHarmonics: harmonics.demodulatorHarmonics,
    harmonicsSummed: noise.harmonicsSummed,
    bestDemodulatorPhase: (harmonics.bestPhase * 180) / Math.PI,
    offset: {
      untrimmedVolts: voltsPerFarad * untrimmedFarad,
      settingVolts: voltsPerFarad * excitation.effectiveDifference(0, trim),
      trimmedVolts: residualFarad === null ? null : voltsPerFarad * residualFarad,
      untrimmedFarad,
      residualFarad,
      residualFullScale: residualFarad !== null && capacitanceSpan > 0 ? residualFarad / capacitanceSpan : null,
      idealTrim: excitation.idealTrim,
      trimCode: excitation.trimCode,
      trimAtCode: excitation.trimAtCode,
    },
    noise: { outputRms, bandLow, bandHigh, bandHighFromChain, basebandEnbw: noise.basebandEnbw, contributions },
    resolution: { ...resolution, bandLow, bandHigh, fullScaleFraction: relativeResolution },
    snr,
    dynamicRange,
    enob,
    transfer: {
      measurandUnit: flow ? 'm^3/s' : 'Pa',
      curve,
      voltsPerUnitAtZero: voltsPerFarad * sensor.slope(0),
      voltsPerUnitAtFullScale: voltsPerFarad * sensor.slope(fullScale),
      outputSpanVolts: outputSpan,
    },
    levels,
    closestToClipping: closest,
    ripple: { outputPeak: rippleOutputPeak, frequency: 2 * carrier },
    stepResponse: {
      riseTime: step?.riseTime ?? null,
      overshoot: step?.overshoot ?? null,
      settlingTime1Percent: step?.settlingTime1Percent ?? null,
      settlingTime01Percent: step?.settlingTime01Percent ?? null,
    },
    fluidics: {
      hydraulicResistance: resistance,
      pressureDropAtFullScale: resistance === null ? null : resistance * fullScale,
      reynoldsAtFullScale: sensor.reynoldsAtFullScale,
      commonModeRejection: flow && mismatch > 0 && c1A !== 0 ? 20 * Math.log10(Math.abs(c1A) / mismatch) : null,
      commonModeFlowPerPascal: flow && resistance !== null && c1A !== 0 ? mismatch / (Math.abs(c1A) * resistance) : null,
    },
    findings,
  };
}

/** Where the baseband power response first falls below 1e-6 of its DC value (log scan, then bisection); null if it never does. */
function basebandEdge(post: readonly PreparedStage[], from: number): number | null {
  const relative = (f: number) => {
    let p = 1;
    for (const s of post) p *= s.responsePower(f) / s.responsePower(0);
    return p;
  };
  const ratio = Math.pow(10, 1 / 8);
  let lowEdge = from;
  for (let f = from; f < 1e10; f *= ratio) {
    if (relative(f) < BAND_EDGE_POWER) {
      let low = Math.log(lowEdge);
      let high = Math.log(f);
      for (let i = 0; i < 40; i++) {
        const middle = 0.5 * (low + high);
        if (relative(Math.exp(middle)) < BAND_EDGE_POWER) high = middle;
        else low = middle;
      }
      return Math.exp(high);
    }
    lowEdge = f;
  }
  return null;
}
