/**
 * Figures measured on simulated waveforms: band-limited RMS noise from the Welch PSD, mean levels,
 * the carrier ripple and the step-response metrics.
 */
import { welchPsd } from '../spectral/welch';

/** Mean of x[from .. to - 1]. */
export function mean(x: Float64Array, from = 0, to = x.length): number {
  let sum = 0;
  for (let n = from; n < to; n++) sum += x[n];
  return sum / Math.max(1, to - from);
}

/** Default Welch segment: the largest power of two with at least seven half-overlapping segments in the record (16 at least). */
export function defaultSegmentLength(samples: number): number {
  let length = 16;
  while (length * 2 <= samples / 4) length *= 2;
  return length;
}

/**
 * RMS over [low, high] [unit]: the Welch PSD (Hann, 50 % overlap, each segment's mean removed)
 * summed over the bins inside the band times the bin width. A band above fs/2 ends there.
 */
export function bandRms(x: Float64Array, sampleRate: number, low: number, high: number, segmentLength = defaultSegmentLength(x.length)): { rms: number; segmentLength: number } {
  const segment = Math.min(segmentLength, 1 << Math.floor(Math.log2(Math.max(2, x.length))));
  const { frequencies, psd } = welchPsd(x, sampleRate, segment);
  const width = sampleRate / segment;
  let power = 0;
  for (let k = 0; k < frequencies.length; k++) {
    if (frequencies[k] >= low && frequencies[k] <= high) power += psd[k] * width;
  }
  return { rms: Math.sqrt(power), segmentLength: segment };
}

/**
 * Peak of the carrier ripple [unit]: the waveform less its one-period moving average (which takes
 * out the signal, offsets and any slow trend), averaged synchronously over every whole carrier
 * period from `from` on (which averages out the noise), and the largest deviation of that one
 * period from its mean.
 * @param period samples per carrier period N.
 */
export function ripplePeak(x: Float64Array, period: number, from: number): number {
  const half = Math.floor(period / 2);
  const first = Math.max(from, half);
  const periods = Math.floor((x.length - (period - half) - first) / period);
  if (periods < 1) return 0;
  const shape = new Float64Array(period);
  // Running sum of the window x[n - half .. n - half + period - 1] centred on n.
  let sum = 0;
  for (let m = first - half; m < first - half + period; m++) sum += x[m];
  for (let n = first; n < first + periods * period; n++) {
    shape[(n - first) % period] += x[n] - sum / period;
    sum += x[n - half + period] - x[n - half];
  }
  let average = 0;
  for (let k = 0; k < period; k++) average += shape[k];
  average /= period;
  let peak = 0;
  for (let k = 0; k < period; k++) peak = Math.max(peak, Math.abs(shape[k] - average));
  return peak / periods;
}

export interface StepMetrics {
  /** 10-90 % rise time [s]. */
  rise: number | null;
  /** Peak beyond the final value over the step's size [1]. */
  overshoot: number;
  /** From the step to where the response stays within 1 % and 0.1 % of the step's size around its final value [s]; null when it does not settle within the record. */
  settle1: number | null;
  settle01: number | null;
}

/**
 * Step-response metrics of a recorded response, each time counted from the step.
 * @param stepIndex sample at which the input stepped.
 * @param initial level before the step and final level after it [unit].
 */
export function stepMetrics(x: Float64Array, sampleRate: number, stepIndex: number, initial: number, final: number): StepMetrics | null {
  const size = final - initial;
  if (size === 0 || !Number.isFinite(size) || stepIndex >= x.length) return null;
  const dt = 1 / sampleRate;
  let t10: number | null = null;
  let t90: number | null = null;
  let peak = -Infinity;
  let lastOutside1 = -1;
  let lastOutside01 = -1;
  let previous = (x[Math.max(0, stepIndex - 1)] - initial) / size;
  for (let n = stepIndex; n < x.length; n++) {
    const y = (x[n] - initial) / size;
    if (t10 === null && y >= 0.1) t10 = crossing(n, previous, y, 0.1);
    if (t90 === null && y >= 0.9) t90 = crossing(n, previous, y, 0.9);
    if (y > peak) peak = y;
    const error = Math.abs(y - 1);
    if (error > 0.01) lastOutside1 = n;
    if (error > 0.001) lastOutside01 = n;
    previous = y;
  }
  const settled = (last: number) => (last === x.length - 1 ? null : (last + 1 - stepIndex) * dt);
  return {
    rise: t10 !== null && t90 !== null ? (t90 - t10) * dt : null,
    overshoot: Math.max(0, peak - 1),
    settle1: settled(lastOutside1),
    settle01: settled(lastOutside01),
  };
}

/** Fractional sample index where the normalised response crosses `level` between samples n - 1 and n. */
function crossing(n: number, before: number, after: number, level: number): number {
  return after === before ? n : n - 1 + (level - before) / (after - before);
}
