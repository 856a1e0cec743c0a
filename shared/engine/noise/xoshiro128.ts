/**
 * xoshiro128** 1.1, the 32-bit all-purpose generator of D. Blackman and S. Vigna, "Scrambled
 * linear pseudorandom number generators", ACM Trans. Math. Softw. 47(4), 36 (2021), reference code
 * at prng.di.unimi.it. Period 2^128 - 1; passes BigCrush. The 128-bit state is filled from the
 * seed by SplitMix64 (G. L. Steele, D. Lea, C. H. Flood, "Fast splittable pseudorandom number
 * generators", OOPSLA 2014), as the authors recommend, so that nearby seeds give unrelated streams.
 *
 * The only source of randomness in the engine: every noise generator takes one of these.
 */
export class Xoshiro128StarStar {
  /**
   * The four 32-bit state words. Exposed so that block generators (GaussianSource) can keep them in
   * locals inside their loops and write them back; nothing else should touch them.
   */
  readonly state = new Int32Array(4);

  /** @param seed a non-negative safe integer; equal seeds give equal streams, bit for bit. */
  constructor(seed: number) {
    if (!Number.isSafeInteger(seed) || seed < 0) throw new RangeError(`Seed must be a non-negative safe integer, got ${seed}`);
    const mask = (1n << 64n) - 1n;
    let x = BigInt(seed);
    for (let word = 0; word < 4; word += 2) {
      x = (x + 0x9e3779b97f4a7c15n) & mask;
      let z = x;
      z = ((z ^ (z >> 30n)) * 0xbf58476d1ce4e5b9n) & mask;
      z = ((z ^ (z >> 27n)) * 0x94d049bb133111ebn) & mask;
      z ^= z >> 31n;
      this.state[word] = Number(BigInt.asIntN(32, z));
      this.state[word + 1] = Number(BigInt.asIntN(32, z >> 32n));
    }
  }

  /** Next output as an unsigned 32-bit integer (0 .. 2^32 - 1). */
  nextUint32(): number {
    const s = this.state;
    let s0 = s[0];
    let s1 = s[1];
    let s2 = s[2];
    let s3 = s[3];
    const rotated = Math.imul(s1, 5);
    const result = Math.imul((rotated << 7) | (rotated >>> 25), 9) >>> 0;
    const t = s1 << 9;
    s2 ^= s0;
    s3 ^= s1;
    s1 ^= s2;
    s0 ^= s3;
    s2 ^= t;
    s3 = (s3 << 11) | (s3 >>> 21);
    s[0] = s0;
    s[1] = s1;
    s[2] = s2;
    s[3] = s3;
    return result;
  }

  /** Uniform double in [0, 1) with 53 random bits (two outputs). */
  nextDouble(): number {
    const high = this.nextUint32() >>> 5;
    const low = this.nextUint32() >>> 6;
    return (high * 67108864 + low) / 9007199254740992;
  }
}
