/**
 * Standard normal deviates by the Marsaglia polar method (G. Marsaglia and T. A. Bray, "A convenient
 * method for generating normal variables", SIAM Review 6(3), 260-264, 1964): two uniforms in the
 * unit disc give two independent normals without trigonometric calls. The uniforms are 32-bit
 * outputs of xoshiro128**. The unused second normal of a pair is kept, so a stream cut into blocks
 * of any sizes is the same stream. Bit-for-bit reproducible for a seed on one JavaScript engine
 * (Math.log is not correctly rounded everywhere, so two engines may differ in the last bit).
 */
import type { Xoshiro128StarStar } from './xoshiro128';

const TWO_TO_MINUS_31 = 1 / 2147483648;

export class GaussianSource {
  private spare = 0;
  private hasSpare = false;

  constructor(private readonly random: Xoshiro128StarStar) {}

  /** One deviate [dimensionless, mean 0, variance 1]. */
  next(): number {
    const one = new Float64Array(1);
    this.fill(one);
    return one[0];
  }

  /**
   * Fills a block with independent normal deviates.
   * @param out destination.
   * @param standardDeviation of each sample, in the caller's unit (default 1).
   */
  fill(out: Float64Array, standardDeviation = 1): void {
    const state = this.random.state;
    let s0 = state[0];
    let s1 = state[1];
    let s2 = state[2];
    let s3 = state[3];
    let n = 0;
    const length = out.length;
    if (this.hasSpare && length > 0) {
      out[n++] = this.spare * standardDeviation;
      this.hasSpare = false;
    }
    while (n < length) {
      let u = 0;
      let v = 0;
      let s = 0;
      do {
        // Two xoshiro128** steps, read as signed 32-bit integers scaled into [-1, 1).
        let rotated = Math.imul(s1, 5);
        u = Math.imul((rotated << 7) | (rotated >>> 25), 9) * TWO_TO_MINUS_31;
        let t = s1 << 9;
        s2 ^= s0;
        s3 ^= s1;
        s1 ^= s2;
        s0 ^= s3;
        s2 ^= t;
        s3 = (s3 << 11) | (s3 >>> 21);
        rotated = Math.imul(s1, 5);
        v = Math.imul((rotated << 7) | (rotated >>> 25), 9) * TWO_TO_MINUS_31;
        t = s1 << 9;
        s2 ^= s0;
        s3 ^= s1;
        s1 ^= s2;
        s0 ^= s3;
        s2 ^= t;
        s3 = (s3 << 11) | (s3 >>> 21);
        s = u * u + v * v;
      } while (s >= 1 || s === 0);
      const factor = Math.sqrt((-2 * Math.log(s)) / s);
      out[n++] = u * factor * standardDeviation;
      if (n < length) out[n++] = v * factor * standardDeviation;
      else {
        this.spare = v * factor;
        this.hasSpare = true;
      }
    }
    state[0] = s0;
    state[1] = s1;
    state[2] = s2;
    state[3] = s3;
  }
}
