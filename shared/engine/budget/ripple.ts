/** Ripple components summed: 2 f0, 4 f0, ..., 2 RIPPLE_COMPONENTS f0. */
export const RIPPLE_COMPONENTS = 8;

/** Points per ripple period at which the summed ripple waveform is searched for its peak. */
const PEAK_SEARCH_POINTS = 512;

/** cos and sin of (i + 1) theta on the search grid, computed once: the peak search then only multiplies and adds. */
const COSINES = new Float64Array(PEAK_SEARCH_POINTS * RIPPLE_COMPONENTS);
const SINES = new Float64Array(PEAK_SEARCH_POINTS * RIPPLE_COMPONENTS);
for (let p = 0; p < PEAK_SEARCH_POINTS; p++) {
  for (let i = 0; i < RIPPLE_COMPONENTS; i++) {
    const angle = ((i + 1) * 2 * Math.PI * p) / PEAK_SEARCH_POINTS;
    COSINES[p * RIPPLE_COMPONENTS + i] = Math.cos(angle);
    SINES[p * RIPPLE_COMPONENTS + i] = Math.sin(angle);
  }
}

/**
 * Complex amplitudes C_n of the demodulator output at n f0 (n = 2, 4, ...) for a unit square-wave
 * input, so that the ripple is r(t) = sum over n of Re(C_n e^(j n 2 pi f0 t)),
 * from the carrier's harmonics V_k = (4 / pi k)(-j) H_k and the reference's R_m = (4 / pi m)(-j) e^(j m phi):
 * the product of Re(V e^(jkwt)) and Re(R e^(jmwt)) puts (V R + V R* + V* R)/2 at k + m and |k - m|.
 * Index i of the result holds n = 2 (i + 1).
 */
export function rippleComponents(re: Float64Array, im: Float64Array, phase: number): { re: Float64Array; im: Float64Array } {
  const count = re.length;
  const outRe = new Float64Array(RIPPLE_COMPONENTS);
  const outIm = new Float64Array(RIPPLE_COMPONENTS);
  // V_k = (4/(pi k)) (-j) H_k = (4/(pi k)) (im - j re)
  const vRe = (h: number) => (4 / (Math.PI * (2 * h + 1))) * im[h];
  const vIm = (h: number) => (-4 / (Math.PI * (2 * h + 1))) * re[h];
  // R_m = (4/(pi m)) (-j)(cos m phi + j sin m phi) = (4/(pi m)) (sin m phi - j cos m phi)
  const rRe = (m: number) => (4 / (Math.PI * m)) * Math.sin(m * phase);
  const rIm = (m: number) => (-4 / (Math.PI * m)) * Math.cos(m * phase);
  for (let i = 0; i < RIPPLE_COMPONENTS; i++) {
    const n = 2 * (i + 1);
    let sRe = 0;
    let sIm = 0;
    // k + m = n
    for (let k = 1; k < n && (k - 1) / 2 < count; k += 2) {
      const h = (k - 1) / 2;
      const m = n - k;
      sRe += vRe(h) * rRe(m) - vIm(h) * rIm(m);
      sIm += vRe(h) * rIm(m) + vIm(h) * rRe(m);
    }
    // k - m = n: V_k R_m*
    for (let m = 1; (m + n - 1) / 2 < count; m += 2) {
      const h = (m + n - 1) / 2;
      sRe += vRe(h) * rRe(m) + vIm(h) * rIm(m);
      sIm += vIm(h) * rRe(m) - vRe(h) * rIm(m);
    }
    // m - k = n: V_k* R_m
    for (let h = 0; h < count; h++) {
      const m = 2 * h + 1 + n;
      sRe += vRe(h) * rRe(m) + vIm(h) * rIm(m);
      sIm += vRe(h) * rIm(m) - vIm(h) * rRe(m);
    }
    outRe[i] = 0.5 * sRe;
    outIm[i] = 0.5 * sIm;
  }
  return { re: outRe, im: outIm };
}

/**
 * Peak of |r(t)| for r(t) = sum over i of Re(A_i e^(j (i + 1) theta)), theta over one period of the
 * lowest ripple component (2 f0). The components are not in phase, so the sum of their amplitudes
 * is only an upper bound; the peak of the summed waveform is what a scope shows.
 */
export function ripplePeak(re: Float64Array, im: Float64Array): number {
  const count = Math.min(re.length, RIPPLE_COMPONENTS);
  let peak = 0;
  for (let p = 0; p < PEAK_SEARCH_POINTS; p++) {
    const row = p * RIPPLE_COMPONENTS;
    let value = 0;
    for (let i = 0; i < count; i++) value += re[i] * COSINES[row + i] - im[i] * SINES[row + i];
    peak = Math.max(peak, Math.abs(value));
  }
  return peak;
}
