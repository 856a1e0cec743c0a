/**
 * Direct O(N^2) discrete Fourier transform, X[k] = sum_n x[n] exp(-j 2 pi k n / N), any length.
 * The slow, obviously correct reference the FFT is tested against; not for production paths.
 */
import type { ComplexSpectrum } from './fft';

/**
 * @param re real parts of x (any length N >= 1).
 * @param im imaginary parts of x, same length.
 * @returns all N bins, unscaled.
 */
export function directDft(re: Float64Array, im: Float64Array): ComplexSpectrum {
  const n = re.length;
  const outRe = new Float64Array(n);
  const outIm = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    let sumRe = 0;
    let sumIm = 0;
    for (let t = 0; t < n; t++) {
      // Reduce k t modulo N first so the angle stays accurate for large products.
      const angle = (-2 * Math.PI * ((k * t) % n)) / n;
      const c = Math.cos(angle);
      const s = Math.sin(angle);
      sumRe += re[t] * c - im[t] * s;
      sumIm += re[t] * s + im[t] * c;
    }
    outRe[k] = sumRe;
    outIm[k] = sumIm;
  }
  return { re: outRe, im: outIm };
}
