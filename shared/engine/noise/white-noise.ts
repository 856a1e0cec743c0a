/**
 * White Gaussian noise of a given one-sided density, sampled at fs: flat over [0, fs/2], so the
 * variance per sample is e^2 fs / 2.
 */
import { GaussianSource } from './gaussian';
import type { Xoshiro128StarStar } from './xoshiro128';

export interface WhiteNoiseSpec {
  /** One-sided density e [unit/rtHz], e.g. V/rtHz; >= 0. */
  density: number;
  /** Sample rate fs [Hz]. */
  sampleRate: number;
}

export class WhiteNoise {
  /** RMS value per sample [unit]: e sqrt(fs / 2). */
  readonly standardDeviation: number;
  private readonly gaussian: GaussianSource;

  constructor(spec: WhiteNoiseSpec, random: Xoshiro128StarStar) {
    assertNoiseSpec(spec.density, spec.sampleRate);
    this.standardDeviation = spec.density * Math.sqrt(spec.sampleRate / 2);
    this.gaussian = new GaussianSource(random);
  }

  /** Overwrites out with the next block of noise [unit]. */
  fill(out: Float64Array): void {
    this.gaussian.fill(out, this.standardDeviation);
  }

  /** Adds the next block of noise [unit] to signal, in place. */
  addTo(signal: Float64Array): void {
    this.gaussian.addTo(signal, this.standardDeviation);
  }
}

/** Shared checks of a density [unit/rtHz] and a sample rate [Hz]. */
export function assertNoiseSpec(density: number, sampleRate: number): void {
  if (!(density >= 0) || !Number.isFinite(density)) throw new RangeError(`Noise density must be a finite value of at least 0, got ${density}`);
  if (!(sampleRate > 0) || !Number.isFinite(sampleRate)) throw new RangeError(`Sample rate must be a finite frequency above 0 Hz, got ${sampleRate}`);
}
