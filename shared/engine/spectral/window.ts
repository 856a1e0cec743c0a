/**
 * Periodic Hann window w[n] = 0.5 - 0.5 cos(2 pi n / N), n = 0..N-1: the DFT-even form that
 * scipy.signal.get_window('hann', N) (fftbins=True) returns and Welch's method uses.
 * @param length N >= 1 samples.
 * @returns dimensionless weights.
 */
export function hannWindow(length: number): Float64Array {
  if (!Number.isInteger(length) || length < 1) throw new RangeError(`Window length must be a positive integer, got ${length}`);
  const w = new Float64Array(length);
  if (length === 1) {
    w[0] = 1;
    return w;
  }
  for (let n = 0; n < length; n++) w[n] = 0.5 - 0.5 * Math.cos((2 * Math.PI * n) / length);
  return w;
}
