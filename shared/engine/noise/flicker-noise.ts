/**
 * Op-amp style noise with density e^2 (1 + fc / f): a white floor plus 1/f (flicker) noise, sampled
 * at fs, following the target within 1 dB (design error about +/-0.27 dB) from a chosen lowest
 * frequency up to fs/2, and flattening below it.
 *
 * Method: unit white noise through a shaping filter of interlaced real poles and zeros, one pair
 * per half decade (the classic rational approximation of a -10 dB/decade slope; see e.g.
 * J. A. Barnes and D. W. Allan, "A statistical model of flicker noise", Proc. IEEE 54(2), 1966, and
 * M. S. Keshner, "1/f noise", Proc. IEEE 70(3), 1982), mapped to discrete time by the matched
 * z-transform and anchored at the Nyquist frequency. The three highest pairs are moved by factors
 * fitted once (minimax over 1e-5 fs .. fs/2) in tools/reference/fit_flicker_cascade.py, which
 * straightens the slope where the matched z-transform bends it near fs/2.
 * Chosen over a bank of independent first-order sources (one Gaussian per sample per section, so
 * a dozen per sample) and over Kasdin's fractional-differencing FIR (N. J. Kasdin, Proc. IEEE 83(5),
 * 1995; tens of thousands of taps to reach f0/1000): this needs one Gaussian and one multiply-add
 * per pole per sample.
 *
 * The white floor is not a second generator: the filter G is the spectral factor of the whole
 * target, |G|^2 = sigma^2 + g^2 |H|^2 (same poles, zeros moved), so one unit Gaussian per sample
 * drives floor and slope together (see spectralFactorZeros; the zeros are real, with one conjugate
 * pair near fs/2 for corners above about 2.5e-3 fs; a separate floor remains the fallback).
 *
 * The filter runs in parallel form (partial fractions; all residues are positive for interlaced
 * poles and zeros as in H, while the folded G may carry a pair of opposite signs near fs/2, where a
 * pole and a zero almost cancel), whose state starts in its stationary distribution (drawn through the Cholesky
 * factor of the exact state covariance), so the first sample already has the long-run statistics:
 * no warm-up transient of the slow poles.
 */
import { GaussianSource } from './gaussian';
import { assertNoiseSpec } from './white-noise';
import type { Xoshiro128StarStar } from './xoshiro128';

export interface FlickerNoiseSpec {
  /** White-floor density e [unit/rtHz], e.g. V/rtHz; >= 0. */
  density: number;
  /** Flicker corner fc [Hz] where the 1/f part equals the floor; 0 gives white noise only. */
  corner: number;
  /** Sample rate fs [Hz]. */
  sampleRate: number;
  /** Lowest frequency [Hz] where the 1/f slope must hold (the simulator uses f0 / 1000); 0 < it < fs/2. */
  lowestFrequency: number;
}

/** Pole spacing: one pole and one zero per half decade. */
const STEP = Math.sqrt(10);
/** Factors on the (pole, zero) frequencies of the three highest pairs; from fit_flicker_cascade.py. */
const TOP_PAIR_FACTORS: ReadonlyArray<readonly [number, number]> = [
  [1.016513935674, 30.176373852262],
  [2.830717230603, 8.803322437185],
  [0.952466241579, 1.242434866291],
];
/** Frequency (in units of fs) where the level is set, and the design's error there [dB]. */
const REFERENCE_FREQUENCY = 0.5e-3;
const REFERENCE_ERROR_DB = 0.257298875639;
/** The lowest pole sits this far below the lowest frequency, so the slope still holds there. */
const LOW_END_MARGIN = 30;

export class FlickerNoise {
  /** White-floor RMS per sample [unit]: e sqrt(fs / 2). */
  readonly whiteStandardDeviation: number;
  /** Number of poles of the shaping filter. */
  readonly poleCount: number;
  private readonly gaussian: GaussianSource;
  private readonly poles: Float64Array;
  private readonly residues: Float64Array;
  private readonly states: Float64Array;
  private driving = new Float64Array(0);
  /** True when the white floor is drawn as a second Gaussian per sample instead of folded into the filter. */
  readonly separateWhite: boolean;
  private readonly poleTheta: number[];
  private readonly shapeZeroTheta: number[];
  private readonly shapePair: readonly [number, number] | null;
  private readonly sampleRate: number;
  private readonly shapeGain: number;

  constructor(spec: FlickerNoiseSpec, random: Xoshiro128StarStar) {
    const { density, corner, sampleRate, lowestFrequency } = spec;
    assertNoiseSpec(density, sampleRate);
    if (!(corner >= 0) || !Number.isFinite(corner)) throw new RangeError(`Flicker corner must be a finite frequency of at least 0 Hz, got ${corner}`);
    if (!(lowestFrequency > 0) || !(lowestFrequency < sampleRate / 2)) {
      throw new RangeError(`Lowest frequency must lie between 0 Hz and half the sample rate (${sampleRate / 2} Hz), got ${lowestFrequency}`);
    }
    this.gaussian = new GaussianSource(random);
    this.whiteStandardDeviation = density * Math.sqrt(sampleRate / 2);

    // Angular frequencies per sample (theta = 2 pi f / fs) of the poles and zeros, from Nyquist down.
    const lowest = Math.min(lowestFrequency / sampleRate, REFERENCE_FREQUENCY) / LOW_END_MARGIN;
    const poleTheta: number[] = [];
    const zeroTheta: number[] = [];
    for (let k = 0; ; k++) {
      const [poleFactor, zeroFactor] = TOP_PAIR_FACTORS[k] ?? [1, 1];
      const zero = 0.5 * Math.pow(STEP, -k);
      const pole = (zero / Math.sqrt(STEP)) * poleFactor;
      poleTheta.push(2 * Math.PI * pole);
      zeroTheta.push(2 * Math.PI * zero * zeroFactor);
      if (pole <= lowest) break;
    }
    const count = poleTheta.length;
    this.poleCount = count;
    // One more tap than poles: the direct term, run as a pole at z = 0 (its state is r d[n] itself).
    this.poles = new Float64Array(count + 1);
    for (let k = 0; k < count; k++) this.poles[k] = Math.exp(-poleTheta[k]);

    // Gain: the one-sided flicker density g^2 (2 / fs) |H(f)|^2 meets e^2 fc / f at the reference
    // frequency, less the design's known error there.
    const target = (density * density * corner) / (REFERENCE_FREQUENCY * sampleRate);
    const designed = (2 / sampleRate) * squaredMagnitude(poleTheta, zeroTheta, 2 * Math.PI * REFERENCE_FREQUENCY);
    const flickerGain = Math.sqrt((target / designed) * Math.pow(10, REFERENCE_ERROR_DB / 10));

    // White floor folded into the filter: sigma^2 + g^2 |H|^2 = |G|^2 for G with the same poles and
    // the zeros of sigma^2 |A|^2 + g^2 |B|^2 (its spectral factor), so one unit Gaussian per sample
    // drives the whole noise. Above a corner of about 2.5e-3 fs two of those zeros leave the real
    // axis as a conjugate pair; if they cannot be found, the floor is drawn as a second Gaussian.
    const sigma = this.whiteStandardDeviation;
    const combined: FactorZeros | null =
      flickerGain === 0
        ? { real: poleTheta.slice(), pair: null }
        : sigma === 0
          ? { real: zeroTheta.slice(), pair: null }
          : cachedSpectralFactorZeros(poleTheta, zeroTheta, sigma / flickerGain);
    this.separateWhite = combined === null;
    const shapeZeros: FactorZeros = combined ?? { real: zeroTheta, pair: null };
    const shapeZeroTheta = shapeZeros.real;
    const gain =
      combined === null
        ? flickerGain
        : Math.sqrt((sigma * sigma + flickerGain * flickerGain * squaredMagnitude(poleTheta, zeroTheta, Math.PI)) / squaredMagnitude(poleTheta, shapeZeroTheta, Math.PI, shapeZeros.pair));
    this.shapeZeroTheta = shapeZeroTheta;
    this.shapePair = shapeZeros.pair;
    this.poleTheta = poleTheta;
    this.sampleRate = sampleRate;
    this.shapeGain = gain;

    // Partial fractions G = direct + sum r_k / (1 - a_k z^-1); differences of exponentials through
    // expm1 keep their precision for the poles close to z = 1.
    const difference = (thetaA: number, thetaB: number): number => -Math.exp(-thetaA) * Math.expm1(thetaA - thetaB);
    this.residues = new Float64Array(count + 1);
    for (let k = 0; k < count; k++) {
      let residue = gain;
      for (let j = 0; j < count; j++) {
        // (1 - b_j / a_k) and (1 - a_j / a_k), each written as (a_k - x) / a_k.
        if (j < shapeZeroTheta.length) residue *= difference(poleTheta[k], shapeZeroTheta[j]) / this.poles[k];
        if (j !== k) residue /= difference(poleTheta[k], poleTheta[j]) / this.poles[k];
      }
      if (shapeZeros.pair !== null) {
        // (1 - beta / a)(1 - conj(beta) / a) of a conjugate pair of zeros.
        const [re, im] = shapeZeros.pair;
        const a = this.poles[k];
        residue *= 1 - (2 * re) / a + (re * re + im * im) / (a * a);
      }
      this.residues[k] = residue;
    }
    let direct = gain;
    for (let k = 0; k < count; k++) direct *= Math.exp(poleTheta[k] - (k < shapeZeroTheta.length ? shapeZeroTheta[k] : 0));
    if (shapeZeros.pair !== null) direct *= shapeZeros.pair[0] ** 2 + shapeZeros.pair[1] ** 2;
    this.residues[count] = direct;

    // Stationary start: covariance P_ij = r_i r_j / (1 - a_i a_j). The factor L L^T of the matrix
    // 1 / (1 - a_i a_j) does not depend on the gain (which may be 0); state_i = r_i (L z)_i.
    const covariance = new Float64Array(count * count);
    for (let i = 0; i < count; i++) {
      for (let j = 0; j < count; j++) covariance[i * count + j] = 1 / -Math.expm1(-(poleTheta[i] + poleTheta[j]));
    }
    const factor = cholesky(covariance, count);
    const draws = new Float64Array(count);
    this.gaussian.fill(draws);
    this.states = new Float64Array(count + 1);
    for (let i = 0; i < count; i++) {
      let value = 0;
      for (let j = 0; j <= i; j++) value += factor[i * count + j] * draws[j];
      this.states[i] = this.residues[i] * value;
    }
  }

  /** Overwrites out with the next block of noise [unit]. */
  fill(out: Float64Array): void {
    const driving = this.drive(out.length);
    if (this.separateWhite) this.gaussian.fill(out, this.whiteStandardDeviation);
    else out.fill(0);
    this.shape(driving, out);
  }

  /** Adds the next block of noise [unit] to signal, in place (the same stream as fill). */
  addTo(signal: Float64Array): void {
    const driving = this.drive(signal.length);
    if (this.separateWhite) this.gaussian.addTo(signal, this.whiteStandardDeviation);
    this.shape(driving, signal);
  }

  /** One-sided density [unit^2/Hz] the generator produces at frequency f (0 < f <= fs/2), by its design. */
  designedDensity(frequency: number): number {
    const sampleRate = this.sampleRate;
    const omega = (2 * Math.PI * frequency) / sampleRate;
    const shaped = this.shapeGain * this.shapeGain * squaredMagnitude(this.poleTheta, this.shapeZeroTheta, omega, this.shapePair);
    const white = this.separateWhite ? this.whiteStandardDeviation * this.whiteStandardDeviation : 0;
    return (2 / sampleRate) * (shaped + white);
  }

  /** The next block of unit white noise driving the shaping filter (drawn before the white floor). */
  private drive(length: number): Float64Array {
    if (this.driving.length < length) this.driving = new Float64Array(length);
    const driving = this.driving.subarray(0, length);
    this.gaussian.fill(driving);
    return driving;
  }

  /**
   * Adds the shaping filter's response to `driving` onto signal: the poles and the direct term (the
   * last tap), four taps per pass over the block (their states in locals, independent recursions
   * the processor can overlap), then the one to three taps left in one more pass.
   */
  private shape(driving: Float64Array, signal: Float64Array): void {
    const length = signal.length;
    const { poles, residues, states } = this;
    const count = poles.length;
    let k = 0;
    for (; k + 4 <= count; k += 4) {
      const a0 = poles[k];
      const a1 = poles[k + 1];
      const a2 = poles[k + 2];
      const a3 = poles[k + 3];
      const r0 = residues[k];
      const r1 = residues[k + 1];
      const r2 = residues[k + 2];
      const r3 = residues[k + 3];
      let x0 = states[k];
      let x1 = states[k + 1];
      let x2 = states[k + 2];
      let x3 = states[k + 3];
      for (let n = 0; n < length; n++) {
        const d = driving[n];
        x0 = a0 * x0 + r0 * d;
        x1 = a1 * x1 + r1 * d;
        x2 = a2 * x2 + r2 * d;
        x3 = a3 * x3 + r3 * d;
        signal[n] += x0 + x1 + (x2 + x3);
      }
      states[k] = x0;
      states[k + 1] = x1;
      states[k + 2] = x2;
      states[k + 3] = x3;
    }
    const remaining = count - k;
    if (remaining >= 2) {
      // Two or three taps left: one pass, a missing third as a zero tap (it stays at 0).
      const a0 = poles[k];
      const a1 = poles[k + 1];
      const a2 = remaining === 3 ? poles[k + 2] : 0;
      const r0 = residues[k];
      const r1 = residues[k + 1];
      const r2 = remaining === 3 ? residues[k + 2] : 0;
      let x0 = states[k];
      let x1 = states[k + 1];
      let x2 = remaining === 3 ? states[k + 2] : 0;
      for (let n = 0; n < length; n++) {
        const d = driving[n];
        x0 = a0 * x0 + r0 * d;
        x1 = a1 * x1 + r1 * d;
        x2 = a2 * x2 + r2 * d;
        signal[n] += x0 + x1 + x2;
      }
      states[k] = x0;
      states[k + 1] = x1;
      if (remaining === 3) states[k + 2] = x2;
    } else if (remaining === 1) {
      const a = poles[k];
      const r = residues[k];
      let state = states[k];
      for (let n = 0; n < length; n++) {
        state = a * state + r * driving[n];
        signal[n] += state;
      }
      states[k] = state;
    }
  }
}

/** |H(e^{j omega})|^2 of prod (1 - b_k z^-1) / (1 - a_k z^-1), a = exp(-theta_pole), b = exp(-theta_zero). */
function squaredMagnitude(poleTheta: number[], zeroTheta: number[], omega: number, pair: readonly [number, number] | null = null): number {
  // |1 - x e^{-j omega}|^2 = (1 - x)^2 + 4 x sin^2(omega / 2), without cancellation for x near 1.
  const halfSine = Math.sin(omega / 2);
  const term = (theta: number): number => {
    const x = Math.exp(-theta);
    const oneMinusX = -Math.expm1(-theta);
    return oneMinusX * oneMinusX + 4 * x * halfSine * halfSine;
  };
  let value = 1;
  for (let k = 0; k < poleTheta.length; k++) value *= (k < zeroTheta.length ? term(zeroTheta[k]) : 1) / term(poleTheta[k]);
  if (pair !== null) {
    // |1 - beta e^{-j omega}|^2 |1 - conj(beta) e^{-j omega}|^2 for beta = re + j im.
    const [re, im] = pair;
    const c = Math.cos(omega);
    const s = Math.sin(omega);
    const pairTerm = (b: number): number => {
      const real = 1 - (re * c + b * s);
      const imaginary = b * c - re * s;
      return real * real + imaginary * imaginary;
    };
    value *= pairTerm(im) * pairTerm(-im);
  }
  return value;
}

/**
 * The zeros depend only on the pole and zero frequencies and on sigma / g, which sources of equal
 * corner, sample rate and lowest frequency share (both sides of a charge amplifier, every run of one
 * design): computed once for each, in a small table that is emptied when full.
 */
/** Zeros of the spectral factor: real ones as theta (the zero at exp(-theta)), and at most one conjugate pair (re, im). */
interface FactorZeros {
  real: number[];
  pair: readonly [number, number] | null;
}

const factorCache = new Map<string, FactorZeros | null>();
const FACTOR_CACHE_SIZE = 64;

function cachedSpectralFactorZeros(poleTheta: number[], zeroTheta: number[], ratio: number): FactorZeros | null {
  const key = `${ratio}|${poleTheta.join(',')}|${zeroTheta.join(',')}`;
  let zeros = factorCache.get(key);
  if (zeros === undefined) {
    zeros = spectralFactorZeros(poleTheta, zeroTheta, ratio, 1);
    if (factorCache.size >= FACTOR_CACHE_SIZE) factorCache.clear();
    factorCache.set(key, zeros);
  }
  return zeros === null ? null : { real: zeros.real.slice(), pair: zeros.pair };
}

/**
 * The zeros (as theta, the zero at exp(-theta)) of the minimum-phase factor of
 * sigma^2 |A|^2 + g^2 |B|^2 with A = prod (1 - exp(-poleTheta) z^-1), B likewise of zeroTheta. On the
 * real axis z = exp(-phi) that Laurent polynomial is
 *   N(phi) = sigma^2 prod (1 - e^(phi - pole)) (1 - e^(-phi - pole)) + g^2 prod (same with zeros),
 * evaluated here as signs and logarithms (no overflow for large phi, no cancellation near z = 1).
 * It has as many zeros inside the unit circle as there are poles; the real positive ones show as sign
 * changes of N(phi), bracketed on a grid of 100 points per decade and refined by bisection. When
 * exactly two are missing, they are the conjugate pair of the remaining quadratic factor (below).
 * Returns null in any other case (the caller then keeps the white floor separate).
 */
function spectralFactorZeros(poleTheta: number[], zeroTheta: number[], sigma: number, gain: number): FactorZeros | null {
  const logFactors = (phi: number, thetas: number[], scale: number): { sign: number; log: number } => {
    let sign = 1;
    let log = 2 * Math.log(scale);
    for (const theta of thetas) {
      const u = phi - theta;
      if (u > 0) {
        sign = -sign;
        log += u > 1 ? u + Math.log1p(-Math.exp(-u)) : Math.log(Math.expm1(u));
      } else {
        log += Math.log(-Math.expm1(u));
      }
      log += Math.log(-Math.expm1(-phi - theta));
    }
    return { sign, log };
  };
  const signAt = (phi: number): number => {
    const a = logFactors(phi, poleTheta, sigma);
    const b = logFactors(phi, zeroTheta, gain);
    if (a.sign === b.sign || a.log === b.log) return a.log === b.log && a.sign !== b.sign ? 0 : a.sign;
    return a.log > b.log ? a.sign : b.sign;
  };
  const all = [...poleTheta, ...zeroTheta];
  const low = Math.log10(Math.min(...all)) - 2;
  const high = Math.log10(Math.max(...all)) + 2;
  const roots: number[] = [];
  const steps = Math.ceil((high - low) * 100);
  let previousPhi = Math.pow(10, low);
  let previousSign = signAt(previousPhi);
  for (let step = 1; step <= steps; step++) {
    const phi = Math.pow(10, low + ((high - low) * step) / steps);
    const sign = signAt(phi);
    if (sign === 0) return null;
    if (sign !== previousSign) {
      let a = previousPhi;
      let b = phi;
      for (let iteration = 0; iteration < 200; iteration++) {
        const middle = 0.5 * (a + b);
        if (middle === a || middle === b) break;
        if (signAt(middle) === previousSign) a = middle;
        else b = middle;
      }
      roots.push(0.5 * (a + b));
    }
    previousPhi = phi;
    previousSign = sign;
  }
  const count = poleTheta.length;
  if (roots.length === count) return { real: roots, pair: null };
  if (roots.length !== count - 2) return null;
  // Two zeros left: in w = z + 1/z the polynomial is
  //   P(w) = sigma^2 prod (1 + a^2 - a w) + g^2 prod (1 + b^2 - b w) = C prod (w - w_j) (w^2 + p w + q),
  // w_j = beta_j + 1/beta_j for the real zeros found. The quadratic follows from P at w = 0 and
  // w = -2, where every factor is positive (no cancellation), and gives the last pair.
  const evaluate = (w: number, thetas: number[], scale: number): number => {
    let value = scale * scale;
    for (const theta of thetas) {
      const x = Math.exp(-theta);
      value *= 1 + x * x - x * w;
    }
    return value;
  };
  let leading = sigma * sigma;
  let leadingZeros = gain * gain;
  for (let k = 0; k < count; k++) {
    leading *= -Math.exp(-poleTheta[k]);
    leadingZeros *= -Math.exp(-zeroTheta[k]);
  }
  leading += leadingZeros;
  const remainder = (w: number): number => {
    let known = leading;
    for (const phi of roots) known *= w - (Math.exp(-phi) + Math.exp(phi));
    return (evaluate(w, poleTheta, sigma) + evaluate(w, zeroTheta, gain)) / known;
  };
  const q = remainder(0);
  const p = (4 + q - remainder(-2)) / 2;
  const discriminant = p * p - 4 * q;
  if (!(discriminant < 0)) return null;
  // w = mu +/- j nu; beta solves beta^2 - w beta + 1 = 0, the root inside the unit circle.
  const mu = -p / 2;
  const nu = Math.sqrt(-discriminant) / 2;
  // sqrt(w^2 - 4) in complex arithmetic, principal branch.
  const squareRe = mu * mu - nu * nu - 4;
  const squareIm = 2 * mu * nu;
  const modulus = Math.hypot(squareRe, squareIm);
  let rootRe = Math.sqrt((modulus + squareRe) / 2);
  let rootIm = Math.sign(squareIm) * Math.sqrt((modulus - squareRe) / 2);
  let betaRe = (mu - rootRe) / 2;
  let betaIm = (nu - rootIm) / 2;
  if (betaRe * betaRe + betaIm * betaIm >= 1) {
    rootRe = -rootRe;
    rootIm = -rootIm;
    betaRe = (mu - rootRe) / 2;
    betaIm = (nu - rootIm) / 2;
  }
  if (!(betaRe * betaRe + betaIm * betaIm < 1)) return null;
  return { real: roots, pair: [betaRe, Math.abs(betaIm)] };
}

/** Lower-triangular L with L L^T = matrix (size x size, row-major). */
function cholesky(matrix: Float64Array, size: number): Float64Array {
  const lower = new Float64Array(size * size);
  for (let i = 0; i < size; i++) {
    for (let j = 0; j <= i; j++) {
      let sum = matrix[i * size + j];
      for (let k = 0; k < j; k++) sum -= lower[i * size + k] * lower[j * size + k];
      if (i === j) {
        if (!(sum > 0)) throw new RangeError('Flicker noise state covariance is not positive definite');
        lower[i * size + i] = Math.sqrt(sum);
      } else {
        lower[i * size + j] = sum / lower[j * size + j];
      }
    }
  }
  return lower;
}
