/**
 * Spectra of simulated nodes through the engine's Welch estimator (Hann window, 50 % overlap,
 * segment 2^k): the one-sided PSD in V^2/Hz (its integral is the variance) with its square root
 * in V/rtHz for display, or the amplitude spectrum that reads a tone's peak amplitude.
 */
import { amplitudeSpectrum, welchPsd } from '../spectral/welch';

export type NodeSpectrum =
  | { kind: 'density'; frequencies: Float64Array; psd: Float64Array; asd: Float64Array }
  | { kind: 'amplitude'; frequencies: Float64Array; amplitude: Float64Array };

/**
 * @param waveform samples [V].
 * @param sampleRate [Hz].
 * @param segmentLength 2^k samples per segment.
 * @param kind 'density': psd [V^2/Hz] and asd [V/rtHz]; 'amplitude': peak amplitude per bin [V].
 */
export function nodeSpectrum(waveform: Float64Array, sampleRate: number, segmentLength: number, kind: 'density' | 'amplitude' = 'density'): NodeSpectrum {
  if (kind === 'amplitude') {
    const { frequencies, amplitude } = amplitudeSpectrum(waveform, sampleRate, segmentLength);
    return { kind, frequencies, amplitude };
  }
  const { frequencies, psd } = welchPsd(waveform, sampleRate, segmentLength);
  return { kind, frequencies, psd, asd: psd.map(Math.sqrt) };
}
