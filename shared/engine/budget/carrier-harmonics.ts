import type { PreparedStage } from '../stages/stage';

/** Odd harmonics kept per carrier node for waveforms and ripple (k = 1, 3, ..., 63). */
export const KEPT_HARMONICS = 32;
/** Most odd harmonics summed for D; an ideal wide-band chain reaches D = 1 to 1e-4 there. */
export const MAX_DEMODULATOR_HARMONICS = 4000;
/** D's series stops once its estimated tail is below this fraction of the sum of |terms|. */
export const SERIES_TOLERANCE = 1e-4;

const WAVEFORM_POINTS = 64;

/** Lanczos sigma factors of the kept harmonics. */
const SIGMA = Float64Array.from({ length: KEPT_HARMONICS }, (_, h) => {
  const x = (Math.PI * (2 * h + 1)) / (2 * KEPT_HARMONICS);
  return Math.sin(x) / x;
});

export interface CarrierHarmonics {
  /** Normalised response (flat gains left out) of the chain up to each carrier node, at k = 2h + 1: index node * KEPT_HARMONICS + h. */
  re: Float64Array;
  im: Float64Array;
  nodes: number;
  /** D = sum over odd k of 8/(pi^2 k^2) |H(k f0)| cos(arg H(k f0) - k phi). */
  demodulatorGain: number;
  demodulatorHarmonics: number;
  /** Largest D over the reference phase and the phase [rad] giving it (from the kept harmonics). */
  bestGain: number;
  bestPhase: number;
  /** Peak of each node's steady-state waveform for a unit square-wave input. */
  peakFactor: Float64Array;
}

/**
 * Walks the pre-demodulator chain at the odd carrier harmonics once: D, the best reference phase,
 * and each node's waveform peak all come from the same responses.
 */
export function carrierHarmonics(pre: readonly PreparedStage[], carrier: number, phase: number): CarrierHarmonics {
  const nodes = pre.length;
  const re = new Float64Array(nodes * KEPT_HARMONICS);
  const im = new Float64Array(nodes * KEPT_HARMONICS);
  const value = { re: 1, im: 0 };
  let gain = 0;
  let absoluteSum = 0;
  let count = 0;
  for (let h = 0; h < MAX_DEMODULATOR_HARMONICS; h++) {
    const k = 2 * h + 1;
    value.re = 1;
    value.im = 0;
    for (let n = 0; n < nodes; n++) {
      pre[n].multiplyResponse(k * carrier, value);
      if (h < KEPT_HARMONICS) {
        re[n * KEPT_HARMONICS + h] = value.re;
        im[n * KEPT_HARMONICS + h] = value.im;
      }
    }
    const weight = 8 / (Math.PI * Math.PI * k * k);
    // |H| cos(arg H - k phi) = Re(H e^(-j k phi))
    gain += weight * (value.re * Math.cos(k * phase) + value.im * Math.sin(k * phase));
    const magnitude = weight * Math.hypot(value.re, value.im);
    absoluteSum += magnitude;
    count = h + 1;
    // With weights 1/k^2 and |H| not rising, the rest of the series is at most about term * k / 2.
    if (h >= KEPT_HARMONICS - 1 && (magnitude * k) / 2 < SERIES_TOLERANCE * absoluteSum) break;
  }
  const last = (nodes - 1) * KEPT_HARMONICS;
  const best = bestReferencePhase(re.subarray(last, last + KEPT_HARMONICS), im.subarray(last, last + KEPT_HARMONICS));
  const peakFactor = new Float64Array(nodes);
  for (let n = 0; n < nodes; n++) {
    peakFactor[n] = waveformPeak(re.subarray(n * KEPT_HARMONICS, (n + 1) * KEPT_HARMONICS), im.subarray(n * KEPT_HARMONICS, (n + 1) * KEPT_HARMONICS));
  }
  return { re, im, nodes, demodulatorGain: gain, demodulatorHarmonics: count, bestGain: best.gain, bestPhase: best.phase, peakFactor };
}

function truncatedGain(re: Float64Array, im: Float64Array, phase: number, derivative: 0 | 1 | 2): number {
  let sum = 0;
  for (let h = 0; h < re.length; h++) {
    const k = 2 * h + 1;
    const weight = 8 / (Math.PI * Math.PI * k * k);
    const c = Math.cos(k * phase);
    const s = Math.sin(k * phase);
    if (derivative === 0) sum += weight * (re[h] * c + im[h] * s);
    else if (derivative === 1) sum += weight * k * (-re[h] * s + im[h] * c);
    else sum -= weight * k * k * (re[h] * c + im[h] * s);
  }
  return sum;
}

/** Newton steps on dD/dphi from the fundamental's phase, where the maximum nearly always is. */
function bestReferencePhase(re: Float64Array, im: Float64Array): { gain: number; phase: number } {
  let phase = Math.atan2(im[0], re[0]);
  for (let i = 0; i < 6; i++) {
    const curvature = truncatedGain(re, im, phase, 2);
    if (!(curvature < 0)) break;
    const step = -truncatedGain(re, im, phase, 1) / curvature;
    phase += Math.max(-0.2, Math.min(0.2, step));
    if (Math.abs(step) < 1e-9) break;
  }
  return { gain: truncatedGain(re, im, phase, 0), phase };
}

/**
 * Peak of sum (4 / pi k) sigma_k Im(H_k e^(j k w t)) over a half period (odd harmonics only, so the
 * other half is its mirror). Lanczos sigma factors keep truncation ringing from posing as overshoot.
 */
function waveformPeak(re: Float64Array, im: Float64Array): number {
  const count = re.length;
  let peak = 0;
  for (let m = 0; m < WAVEFORM_POINTS; m++) {
    const angle = (Math.PI * (m + 0.5)) / WAVEFORM_POINTS;
    const stepRe = Math.cos(2 * angle);
    const stepIm = Math.sin(2 * angle);
    let zRe = Math.cos(angle);
    let zIm = Math.sin(angle);
    let sum = 0;
    for (let h = 0; h < count; h++) {
      const k = 2 * h + 1;
      sum += ((4 / (Math.PI * k)) * SIGMA[h]) * (re[h] * zIm + im[h] * zRe);
      const nRe = zRe * stepRe - zIm * stepIm;
      zIm = zRe * stepIm + zIm * stepRe;
      zRe = nRe;
    }
    peak = Math.max(peak, Math.abs(sum));
  }
  return peak;
}
