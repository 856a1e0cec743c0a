/**
 * Standard normal deviates by the ziggurat method (G. Marsaglia and W. W. Tsang, "The Ziggurat
 * Method for Generating Random Variables", Journal of Statistical Software 5(8), 2000) with 256
 * layers of equal area over the half density f(x) = exp(-x^2 / 2), on 32-bit outputs of
 * xoshiro128**.
 *
 * One 32-bit output per deviate on the fast path (about 98.8 % of them): its low 8 bits pick the
 * layer and its high 24 bits, as a signed integer, the position across the layer. The two fields
 * are disjoint bits of the output, so the layer and the position are independent (J. A. Doornik,
 * "An improved ziggurat method to generate normal random samples", 2005, shows what goes wrong when
 * they share bits). The rest take the wedge test with a fresh uniform, or come from the tail
 * beyond r by Marsaglia's exponential method (G. Marsaglia, "Generating a variable from the tail of
 * the normal distribution", Technometrics 6(1), 101-102, 1964).
 *
 * Each deviate uses only the outputs it consumes, in order, and nothing is carried over, so a
 * stream cut into blocks of any sizes is the same stream. Bit-for-bit reproducible for a seed on
 * one JavaScript engine (Math.exp and Math.log are not correctly rounded everywhere, so two engines
 * may differ in the last bit, or rarely in a wedge decision).
 */
import type { Xoshiro128StarStar } from './xoshiro128';

/** Number of layers; a power of two, indexed by the low bits of an output. */
export const ZIGGURAT_LAYERS = 256;
const LAYER_BITS = 8;
const LAYER_MASK = ZIGGURAT_LAYERS - 1;
/** The high 24 bits as a signed integer j in [-2^23, 2^23); (j + 1/2) / 2^23 lies in (-1, 1), symmetric. */
const POSITION_SCALE = 1 / 2 ** (32 - LAYER_BITS - 1);
const TWO_TO_MINUS_32 = 1 / 4294967296;

const density = (x: number): number => Math.exp(-0.5 * x * x);
const inverseDensity = (y: number): number => Math.sqrt(-2 * Math.log(y));

/**
 * Integral of f over [r, inf): f(r) / (r + 1/(r + 2/(r + 3/(r + ...)))), Laplace's continued
 * fraction of the Mills ratio (M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions,
 * 26.2.14). Evaluated from the back; at the r of the ziggurat (about 3.65) 400 terms reach double
 * precision with a wide margin (the error falls like exp(-2 r sqrt(terms))).
 */
export function normalUpperTailIntegral(r: number): number {
  let fraction = r;
  for (let k = 400; k >= 1; k--) fraction = r + k / fraction;
  return density(r) / fraction;
}

/**
 * The ziggurat: x[1] = r > x[2] > ... > x[n-1] > x[n] = 0 with x[i] (f(x[i+1]) - f(x[i])) = v for
 * each layer i = 1 .. n-1 (the top layer reaching f = 1), and the base layer 0 the rectangle
 * [0, r] x [0, f(r)] plus the tail beyond r, of the same area v = r f(r) + tail(r); its pseudo
 * width x[0] = v / f(r). r is the root of the closing condition of the top layer, found by
 * bisection (the paper's tabulated values, r = 3.6541528853610088 for 256 layers, are what this
 * reproduces; the test checks it).
 */
function buildZiggurat(layers: number): { r: number; area: number; x: Float64Array } {
  // Returns f(x[n-1]) + v / x[n-1] - 1: positive (or Infinity when a layer overshoots f = 1)
  // for r too small, negative for r too large.
  const closing = (r: number, x: Float64Array | null): number => {
    const area = r * density(r) + normalUpperTailIntegral(r);
    let edge = r;
    if (x !== null) {
      x[0] = area / density(r);
      x[1] = r;
    }
    for (let i = 2; i < layers; i++) {
      const height = density(edge) + area / edge;
      if (!(height < 1)) return Infinity;
      edge = inverseDensity(height);
      if (x !== null) x[i] = edge;
    }
    if (x !== null) x[layers] = 0;
    return density(edge) + area / edge - 1;
  };
  let low = 2;
  let high = 6;
  for (let iteration = 0; iteration < 200 && high - low > 0; iteration++) {
    const middle = 0.5 * (low + high);
    if (middle === low || middle === high) break;
    if (closing(middle, null) > 0) low = middle;
    else high = middle;
  }
  const x = new Float64Array(layers + 1);
  closing(high, x);
  return { r: high, area: high * density(high) + normalUpperTailIntegral(high), x };
}

const ziggurat = buildZiggurat(ZIGGURAT_LAYERS);
/** The right edge r of the base rectangle, where the tail begins. */
export const ZIGGURAT_R = ziggurat.r;
/** Area of every layer under the unnormalised half density exp(-x^2 / 2). */
export const ZIGGURAT_AREA = ziggurat.area;
/** Layer i spans positions (j + 1/2) WIDTH[i] for signed 24-bit j: x in (-x[i], x[i]). */
const WIDTH = new Float64Array(ZIGGURAT_LAYERS);
/** x[i+1]: within it a point of layer i lies under the density whatever its height. */
const INNER = new Float64Array(ZIGGURAT_LAYERS);
/** f(x[i]), i = 0 .. n (f(x[0]) unused, f(x[n]) = 1). */
const HEIGHT = new Float64Array(ZIGGURAT_LAYERS + 1);
for (let i = 0; i < ZIGGURAT_LAYERS; i++) {
  WIDTH[i] = ziggurat.x[i] * POSITION_SCALE;
  INNER[i] = ziggurat.x[i + 1];
}
for (let i = 0; i <= ZIGGURAT_LAYERS; i++) HEIGHT[i] = density(ziggurat.x[i]);
HEIGHT[ZIGGURAT_LAYERS] = 1;

export class GaussianSource {
  private readonly one = new Float64Array(1);

  constructor(private readonly random: Xoshiro128StarStar) {}

  /** One deviate [dimensionless, mean 0, variance 1]; continues the stream of fill(). */
  next(): number {
    this.generate(this.one, 1, false);
    return this.one[0];
  }

  /**
   * Fills a block with independent normal deviates.
   * @param out destination.
   * @param standardDeviation of each sample, in the caller's unit (default 1).
   */
  fill(out: Float64Array, standardDeviation = 1): void {
    this.generate(out, standardDeviation, false);
  }

  /** Adds the next block of deviates, times standardDeviation, to signal in place (the same stream as fill). */
  addTo(signal: Float64Array, standardDeviation = 1): void {
    this.generate(signal, standardDeviation, true);
  }

  private generate(out: Float64Array, standardDeviation: number, add: boolean): void {
    const state = this.random.state;
    let s0 = state[0];
    let s1 = state[1];
    let s2 = state[2];
    let s3 = state[3];
    const length = out.length;
    let n = 0;
    while (n < length) {
      // One xoshiro128** step: the output as a signed 32-bit integer.
      const rotated = Math.imul(s1, 5);
      const output = Math.imul((rotated << 7) | (rotated >>> 25), 9);
      const t = s1 << 9;
      s2 ^= s0;
      s3 ^= s1;
      s1 ^= s2;
      s0 ^= s3;
      s2 ^= t;
      s3 = (s3 << 11) | (s3 >>> 21);
      const layer = output & LAYER_MASK;
      let x = ((output >> LAYER_BITS) + 0.5) * WIDTH[layer];
      if (!(Math.abs(x) < INNER[layer])) {
        state[0] = s0;
        state[1] = s1;
        state[2] = s2;
        state[3] = s3;
        x = this.outside(layer, x);
        s0 = state[0];
        s1 = state[1];
        s2 = state[2];
        s3 = state[3];
        if (x !== x) continue; // rejected in the wedge: start again with a new output
      }
      if (add) out[n] += x * standardDeviation;
      else out[n] = x * standardDeviation;
      n++;
    }
    state[0] = s0;
    state[1] = s1;
    state[2] = s2;
    state[3] = s3;
  }

  /** The slow path for a point of `layer` at x outside its inner rectangle; NaN when rejected. */
  private outside(layer: number, x: number): number {
    const random = this.random;
    if (layer === 0) {
      // Tail beyond r: a = -ln(U1) / r, b = -ln(U2), accepted when 2 b > a^2; r + a has the tail's law.
      let a = 0;
      let b = 0;
      do {
        a = -Math.log((random.nextUint32() + 0.5) * TWO_TO_MINUS_32) / ZIGGURAT_R;
        b = -Math.log((random.nextUint32() + 0.5) * TWO_TO_MINUS_32);
      } while (b + b < a * a);
      return x < 0 ? -(ZIGGURAT_R + a) : ZIGGURAT_R + a;
    }
    // Wedge: a height uniform over the layer, accepted below the density.
    const low = HEIGHT[layer];
    const height = low + (random.nextUint32() + 0.5) * TWO_TO_MINUS_32 * (HEIGHT[layer + 1] - low);
    return height < Math.exp(-0.5 * x * x) ? x : NaN;
  }
}
