/**
 * Benchmark: the simulator through the whole chain of the pressure demo (envelopes of every node
 * kept, as the workbench asks) against the same chain in numpy + scipy.signal.sosfilt
 * (tools/bench/simulate_peer.py, spawned on the same sample count and coefficients), without and
 * with noise. Prints samples per second of each and the ratio.
 * Run: node --import tsx tools/bench/simulate.ts
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { validateDesign } from '../../shared/contracts/design';
import demo from '../../shared/examples/demo-pressure.json';
import { highPassSos, lowPassSos } from '../../shared/engine/filters/digital';
import { FlickerNoise } from '../../shared/engine/noise/flicker-noise';
import { Xoshiro128StarStar } from '../../shared/engine/noise/xoshiro128';
import { stageContexts } from '../../shared/engine/simulation/chain-run';
import { quantizedTrim } from '../../shared/engine/simulation/front-end';
import { referencePeriod } from '../../shared/engine/simulation/processors/demodulator';
import { firstOrderLowPass } from '../../shared/engine/simulation/processors/processor';
import { simulate } from '../../shared/engine/simulation/simulator';
import { BOLTZMANN } from '../../shared/engine/constants';

const SAMPLES = 1 << 22;
const REPEATS = 5;

const validation = validateDesign(demo);
if (!validation.ok) throw new Error('The pressure demo does not validate');
const design = validation.design;
const [ca, gain, highPass, , lowPass, adc] = design.chain;
if (ca.kind !== 'chargeAmplifier' || gain.kind !== 'gain' || highPass.kind !== 'highPass' || lowPass.kind !== 'lowPass' || adc.kind !== 'adc') {
  throw new Error('Unexpected chain in the pressure demo');
}
const carrier = design.excitation.frequency;
const samplesPerPeriod = 64;
const sampleRate = samplesPerPeriod * carrier;
const duration = SAMPLES / sampleRate;

function median(values: number[]): number {
  return [...values].sort((a, b) => a - b)[Math.floor(values.length / 2)];
}

function time(noise: boolean): number {
  const run = () => simulate(design, { duration, samplesPerPeriod, noise, sensitivity: false });
  run();
  const times: number[] = [];
  for (let i = 0; i < REPEATS; i++) {
    const start = performance.now();
    run();
    times.push(performance.now() - start);
  }
  return median(times);
}

// The peer gets the same coefficients the processors compute.
const contexts = stageContexts(design);
const alpha = 2 * ca.feedbackResistance * ca.feedbackCapacitance * sampleRate;
const trim = quantizedTrim(design.excitation.trim, design.excitation.trimBits);
const { excitation, sensor } = design;
const side = (inputCapacitance: number, residual: number) => {
  const totalCapacitance = inputCapacitance + ca.inputCapacitance;
  const pole = firstOrderLowPass(ca.gainBandwidth / (1 + totalCapacitance / ca.feedbackCapacitance), sampleRate);
  return {
    residual,
    totalCapacitance,
    charge: [-alpha / ((1 + alpha) * ca.feedbackCapacitance), 0, 0, 1, -(alpha - 1) / (alpha + 1), 0],
    pole: [pole.gain, pole.gain, 0, 1, -pole.feedback, 0],
    voltageNoise: ca.voltageNoise,
    currentNoise: Math.sqrt(ca.currentNoise ** 2 + (4 * BOLTZMANN * design.environment.temperature) / ca.feedbackResistance) / Math.sqrt(2 * sampleRate),
  };
};
const gainPole = firstOrderLowPass(gain.gainBandwidth / gain.gain, sampleRate);
const step = (adc.inputRange[1] - adc.inputRange[0]) / 2 ** adc.bits;
const plan = {
  samples: SAMPLES,
  repeats: REPEATS,
  sampleRate,
  drive: Array.from(referencePeriod(samplesPerPeriod, 0)),
  reference: Array.from(referencePeriod(samplesPerPeriod, 0)),
  amplitude: excitation.amplitude,
  amplitudeNoise: excitation.amplitudeNoise,
  sides: [
    side(contexts[0].inputCapacitanceA, sensor.cellA.baseCapacitance - excitation.referenceCapacitanceA),
    side(contexts[0].inputCapacitanceB, sensor.cellB.baseCapacitance - trim * excitation.referenceCapacitanceB),
  ],
  centre: excitation.supply / 2,
  swing: ca.outputSwing,
  limit: 2 * Math.min(gain.outputSwing[1] - excitation.supply / 2, excitation.supply / 2 - gain.outputSwing[0]),
  gain: [gain.gain * gainPole.gain, gain.gain * gainPole.gain, 0, 1, -gainPole.feedback, 0],
  gainNoise: Math.SQRT2 * gain.voltageNoise,
  lowPassNoise: Math.SQRT2 * lowPass.voltageNoise,
  flickerPoles: new FlickerNoise({ density: 1, corner: 1, sampleRate, lowestFrequency: carrier / 1000 }, new Xoshiro128StarStar(0)).poleCount,
  highPass: Array.from(highPassSos(highPass.response, highPass.order, highPass.corner, sampleRate)),
  lowPass: Array.from(lowPassSos(lowPass.response, lowPass.order, lowPass.corner, sampleRate)),
  adc: { ratio: sampleRate / adc.sampleRate, step, offset: 2 ** (adc.bits - 1) * step, topCode: 2 ** adc.bits - 1 },
};

const quietMs = time(false);
const noisyMs = time(true);
const peerScript = fileURLToPath(new URL('./simulate_peer.py', import.meta.url));
const peer = spawnSync('python3', [peerScript], { input: JSON.stringify(plan), maxBuffer: 1 << 20 });
if (peer.status !== 0) {
  console.error(`python3 peer failed: ${peer.stderr.toString()}`);
  process.exit(1);
}
const peerTimes = JSON.parse(peer.stdout.toString()) as { quiet: number; noisy: number; numpy: string; scipy: string };

const rate = (ms: number) => SAMPLES / (ms / 1e3) / 1e6;
console.log(`${SAMPLES} samples at ${sampleRate / 1e6} MHz (demo-pressure, N = ${samplesPerPeriod}), median of ${REPEATS}; Node ${process.version}, numpy ${peerTimes.numpy}, scipy ${peerTimes.scipy}`);
for (const [label, ours, theirs] of [
  ['without noise', quietMs, peerTimes.quiet],
  ['with noise   ', noisyMs, peerTimes.noisy],
] as const) {
  console.log(`  ${label}: simulator ${rate(ours).toFixed(1)} MS/s (${ours.toFixed(0)} ms), numpy/scipy ${rate(theirs).toFixed(1)} MS/s (${theirs.toFixed(0)} ms), ratio ${(theirs / ours).toFixed(2)}x`);
}
