/**
 * Welch's averaged periodogram (P. D. Welch, "The use of fast Fourier transform for the estimation
 * of power spectra", IEEE Trans. Audio Electroacoust. 15(2), 1967), set up as
 * scipy.signal.welch(x, fs, window='hann', nperseg=N, noverlap=N/2): periodic Hann window, 50 %
 * overlap, each segment's mean removed (detrend 'constant'), one-sided, mean over segments,
 * samples after the last whole segment ignored.
 */
import FFT from 'fft.js';
import { assertPowerOfTwo } from './fft';
import { hannWindow } from './window';

/**
 * 'density': power spectral density [unit^2/Hz], integral over [0, fs/2] = variance (Parseval).
 * 'spectrum': power per bin [unit^2], the mean square of a tone centred on a bin.
 */
export type SpectrumScaling = 'density' | 'spectrum';

export interface WelchOptions {
  /** Default 'density'. */
  scaling?: SpectrumScaling;
  /** 'constant' (default) removes each segment's mean; 'none' keeps it. */
  detrend?: 'constant' | 'none';
}

export interface WelchSpectrum {
  /** Bin frequencies [Hz]: k fs / N, k = 0..N/2. */
  frequencies: Float64Array;
  /** Per bin: [unit^2/Hz] for 'density', [unit^2] for 'spectrum'. */
  values: Float64Array;
}

/**
 * @param x samples [unit, e.g. V]; at least segmentLength of them.
 * @param sampleRate [Hz].
 * @param segmentLength N samples per segment, a power of two >= 2 (2^k).
 * @param options scaling and detrend.
 */
export function welch(x: Float64Array, sampleRate: number, segmentLength: number, options: WelchOptions = {}): WelchSpectrum {
  assertPowerOfTwo(segmentLength, 'Welch segment length');
  if (segmentLength < 2) throw new RangeError('Welch segment length must be at least 2');
  if (!(sampleRate > 0) || !Number.isFinite(sampleRate)) throw new RangeError(`Sample rate must be a finite frequency above 0 Hz, got ${sampleRate}`);
  if (x.length < segmentLength) {
    throw new RangeError(`Welch needs at least one segment of ${segmentLength} samples, got ${x.length}`);
  }
  const scaling = options.scaling ?? 'density';
  const removeMean = (options.detrend ?? 'constant') === 'constant';
  const n = segmentLength;
  const step = n / 2;
  const segments = Math.floor((x.length - n) / step) + 1;
  const bins = n / 2 + 1;
  const window = hannWindow(n);

  let windowSum = 0;
  let windowSquares = 0;
  for (let i = 0; i < n; i++) {
    windowSum += window[i];
    windowSquares += window[i] * window[i];
  }
  const scale = scaling === 'density' ? 1 / (sampleRate * windowSquares) : 1 / (windowSum * windowSum);

  const fft = new FFT(n);
  const segment = new Float64Array(n);
  const spectrum = new Float64Array(2 * n);
  const sum = new Float64Array(bins);
  for (let s = 0; s < segments; s++) {
    const start = s * step;
    let mean = 0;
    if (removeMean) {
      for (let i = 0; i < n; i++) mean += x[start + i];
      mean /= n;
    }
    for (let i = 0; i < n; i++) segment[i] = (x[start + i] - mean) * window[i];
    fft.realTransform(spectrum, segment);
    for (let k = 0; k < bins; k++) {
      const re = spectrum[2 * k];
      const im = spectrum[2 * k + 1];
      sum[k] += re * re + im * im;
    }
  }

  const values = new Float64Array(bins);
  const frequencies = new Float64Array(bins);
  const common = scale / segments;
  for (let k = 0; k < bins; k++) {
    // One-sided: every bin but DC and Nyquist also holds its negative-frequency twin.
    values[k] = sum[k] * common * (k === 0 || k === bins - 1 ? 1 : 2);
    frequencies[k] = (k * sampleRate) / n;
  }
  return { frequencies, values };
}

/**
 * One-sided power spectral density by Welch's method; see {@link welch}.
 * @returns psd [unit^2/Hz] at frequencies [Hz]; sum(psd) * fs / N equals the mean windowed variance.
 */
export function welchPsd(x: Float64Array, sampleRate: number, segmentLength: number): { frequencies: Float64Array; psd: Float64Array } {
  const { frequencies, values } = welch(x, sampleRate, segmentLength, { scaling: 'density' });
  return { frequencies, psd: values };
}

/**
 * Amplitude spectrum for tones: the peak amplitude [unit] of a sine centred on a bin reads as that
 * amplitude (sqrt(2 * power) off DC and Nyquist, sqrt(power) at them, so a constant reads as its
 * value with detrend 'none'). Off-bin tones read lower (Hann scalloping, up to -1.42 dB).
 * @param x samples [unit].
 * @param sampleRate [Hz].
 * @param segmentLength power of two >= 2.
 * @param detrend 'constant' (default) removes each segment's mean, 'none' keeps the DC bin.
 */
export function amplitudeSpectrum(
  x: Float64Array,
  sampleRate: number,
  segmentLength: number,
  detrend: 'constant' | 'none' = 'constant',
): { frequencies: Float64Array; amplitude: Float64Array } {
  const { frequencies, values } = welch(x, sampleRate, segmentLength, { scaling: 'spectrum', detrend });
  const amplitude = new Float64Array(values.length);
  const last = values.length - 1;
  for (let k = 0; k <= last; k++) amplitude[k] = Math.sqrt(k === 0 || k === last ? values[k] : 2 * values[k]);
  return { frequencies, amplitude };
}
