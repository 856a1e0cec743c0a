/**
 * Discrete Fourier transform X[k] = sum_n x[n] exp(-j 2 pi k n / N), through fft.js (radix-4).
 * Lengths are powers of two; length 1 is the identity. No scaling is applied: Parseval reads
 * sum |x|^2 = (1/N) sum |X|^2.
 */
import FFT from 'fft.js';

export interface ComplexSpectrum {
  /** Real parts, in the input's unit (times samples, as the transform is unscaled). */
  re: Float64Array;
  /** Imaginary parts, same unit. */
  im: Float64Array;
}

/** Throws unless length is a power of two (1, 2, 4, ...). */
export function assertPowerOfTwo(length: number, what: string): void {
  if (!Number.isInteger(length) || length < 1 || (length & (length - 1)) !== 0) {
    throw new RangeError(`${what} must be a power of two (1, 2, 4, ...), got ${length}`);
  }
}

/**
 * Complex FFT.
 * @param re real parts of x, length N a power of two.
 * @param im imaginary parts of x, same length.
 * @returns all N bins.
 */
export function complexFft(re: Float64Array, im: Float64Array): ComplexSpectrum {
  assertPowerOfTwo(re.length, 'FFT length');
  if (im.length !== re.length) throw new RangeError(`Imaginary part length ${im.length} differs from real part length ${re.length}`);
  const n = re.length;
  if (n === 1) return { re: Float64Array.from(re), im: Float64Array.from(im) };
  const interleaved = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    interleaved[2 * i] = re[i];
    interleaved[2 * i + 1] = im[i];
  }
  const out = new Float64Array(2 * n);
  new FFT(n).transform(out, interleaved);
  return deinterleave(out, n);
}

/**
 * FFT of a real sequence: the bins 0..N/2 (the rest are their conjugates).
 * @param x samples, length N a power of two.
 * @returns N/2 + 1 bins (1 bin for N = 1).
 */
export function realFft(x: Float64Array): ComplexSpectrum {
  assertPowerOfTwo(x.length, 'FFT length');
  const n = x.length;
  if (n === 1) return { re: Float64Array.of(x[0]), im: Float64Array.of(0) };
  const out = new Float64Array(2 * n);
  new FFT(n).realTransform(out, x);
  return deinterleave(out, n / 2 + 1);
}

function deinterleave(interleaved: Float64Array, bins: number): ComplexSpectrum {
  const re = new Float64Array(bins);
  const im = new Float64Array(bins);
  for (let k = 0; k < bins; k++) {
    re[k] = interleaved[2 * k];
    im[k] = interleaved[2 * k + 1];
  }
  return { re, im };
}
