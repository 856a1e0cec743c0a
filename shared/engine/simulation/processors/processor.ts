/**
 * Discrete-time block processors of the simulation. Each extends the stage modules'
 * BlockProcessor (one block of the node's input in, the same number of output samples out, state
 * kept between blocks) with what the simulator needs to know about it.
 */
import type { BlockProcessor } from '../../stages/stage';
import { FlickerNoise } from '../../noise/flicker-noise';
import { WhiteNoise } from '../../noise/white-noise';
import type { Xoshiro128StarStar } from '../../noise/xoshiro128';

/** Where a processor draws its noise from; null runs it noise-free. */
export interface ProcessorNoise {
  /**
   * A generator of its own for each source of the stage (numbered from 0), so that every stream,
   * and with it the whole run, is the same whatever the block sizes.
   */
  random(source: number): Xoshiro128StarStar;
  /** Lowest frequency down to which 1/f sources follow their slope [Hz]. */
  lowestFrequency: number;
}

export interface NodeProcessor extends BlockProcessor {
  /** Slowest decay of the stage's own response [s]; the chain's settling time is a multiple of the largest. */
  readonly timeConstant: number;
  /** Output samples limited to the swing (or converter range) since the start. */
  readonly clippedSamples: number;
}

/** Block source of one noise process [V or C per sample]. */
export interface NoiseBlock {
  /** Overwrites out with the next block. */
  fill(out: Float64Array): void;
  /** Adds the next block onto signal in place; the same stream as fill. */
  addTo(signal: Float64Array): void;
}

/**
 * An op-amp style voltage noise e^2 (1 + fc / f) [V/rtHz]: flicker when the corner is above 0,
 * plain white otherwise; null when the density is 0 (nothing to draw).
 */
export function voltageNoise(density: number, corner: number, sampleRate: number, lowestFrequency: number, random: Xoshiro128StarStar): NoiseBlock | null {
  if (density === 0) return null;
  if (corner > 0) return new FlickerNoise({ density, corner, sampleRate, lowestFrequency }, random);
  return new WhiteNoise({ density, sampleRate }, random);
}

/**
 * Bilinear transform of a first-order low-pass 1 / (1 + s / (2 pi f)) at sample rate fs, without
 * pre-warping: y[n] = gain (x[n] + x[n-1]) + feedback y[n-1]. Left unwarped on purpose: the
 * bilinear transform then keeps the pole's group delay at DC, tau = 1 / (2 pi f), which is the
 * settling lag each carrier edge loses to the demodulator; pre-warping a pole near fs/2 would
 * shorten it and bias the demodulator gain.
 */
export function firstOrderLowPass(pole: number, sampleRate: number): { gain: number; feedback: number } {
  const beta = (2 * sampleRate) / (2 * Math.PI * pole);
  return { gain: 1 / (1 + beta), feedback: (beta - 1) / (beta + 1) };
}

/** Slowest decay time [s] of second-order sections (rows b0 b1 b2 1 a1 a2) at sample rate fs. */
export function sosTimeConstant(sos: Float64Array, sampleRate: number): number {
  let largest = 0;
  for (let row = 0; row < sos.length; row += 6) {
    const a1 = sos[row + 4];
    const a2 = sos[row + 5];
    const discriminant = a1 * a1 - 4 * a2;
    const radius =
      discriminant < 0 ? Math.sqrt(a2) : Math.max(Math.abs((-a1 + Math.sqrt(discriminant)) / 2), Math.abs((-a1 - Math.sqrt(discriminant)) / 2));
    largest = Math.max(largest, radius);
  }
  return largest > 0 ? -1 / (Math.log(largest) * sampleRate) : 0;
}

/** Largest |V(out+) - V(out-)| [V] of two outputs centred at `centre` that each stay within [low, high]. */
export function differentialLimit(low: number, high: number, centre: number): number {
  return 2 * Math.min(high - centre, centre - low);
}
