/**
 * Second-order-section filtering with persistent state, in direct form II transposed per section,
 * the structure of scipy.signal.sosfilt: for each section
 *   y = b0 x + s1;  s1 = b1 x - a1 y + s2;  s2 = b2 x - a2 y.
 * Blocks processed one after another give the same output as one long block.
 */
import { SOS_ROW } from './digital';

export class SosFilter {
  private readonly coefficients: Float64Array;
  /** Two state values per section (s1, s2), in the input's unit. */
  private readonly state: Float64Array;

  /** @param sos rows of b0 b1 b2 a0 a1 a2 with a0 = 1 (as made by designSos). */
  constructor(sos: Float64Array) {
    if (sos.length === 0 || sos.length % SOS_ROW !== 0) {
      throw new RangeError(`Second-order sections need a multiple of ${SOS_ROW} coefficients, got ${sos.length}`);
    }
    for (let row = 0; row < sos.length; row += SOS_ROW) {
      if (sos[row + 3] !== 1) throw new RangeError(`Section ${row / SOS_ROW} must have a0 = 1, got ${sos[row + 3]}`);
    }
    this.coefficients = Float64Array.from(sos);
    this.state = new Float64Array((sos.length / SOS_ROW) * 2);
  }

  /** Number of second-order sections. */
  get sectionCount(): number {
    return this.coefficients.length / SOS_ROW;
  }

  /** Clears the state: the next block starts from rest. */
  reset(): void {
    this.state.fill(0);
  }

  /**
   * Filters one block.
   * @param input samples (any unit; the output has the same unit).
   * @param output destination of the same length; defaults to input (in place).
   * @returns output.
   */
  process(input: Float64Array, output: Float64Array = input): Float64Array {
    if (output.length !== input.length) {
      throw new RangeError(`Output length ${output.length} differs from input length ${input.length}`);
    }
    const c = this.coefficients;
    const state = this.state;
    const length = input.length;
    // One pass per section: the previous pass's output is this one's input.
    let source = input;
    for (let section = 0; section < c.length / SOS_ROW; section++) {
      const row = section * SOS_ROW;
      const b0 = c[row];
      const b1 = c[row + 1];
      const b2 = c[row + 2];
      const a1 = c[row + 4];
      const a2 = c[row + 5];
      let s1 = state[2 * section];
      let s2 = state[2 * section + 1];
      for (let n = 0; n < length; n++) {
        const x = source[n];
        const y = b0 * x + s1;
        s1 = b1 * x - a1 * y + s2;
        s2 = b2 * x - a2 * y;
        output[n] = y;
      }
      state[2 * section] = s1;
      state[2 * section + 1] = s2;
      source = output;
    }
    return output;
  }
}
